/**
 * GET /api/bench/constant?bytes=N -> a constant JSON document of about N bytes, for the benchmark's framework
 * ceiling (bench/catalogue.ts), sent as ready bytes like the cached vehicle lists. Exists only when the server runs
 * with BORELINE_BENCH=1; 404 otherwise.
 */
const cache = new Map<number, Buffer>()

export default defineEventHandler((event) => {
  if (process.env.BORELINE_BENCH !== '1') throw new DomainError('not_found', 'Not found.')
  const bytes = Math.min(Math.max(Number(getQuery(event).bytes) || 1000, 50), 2_000_000)
  let json = cache.get(bytes)
  if (!json) {
    json = Buffer.from(JSON.stringify({ data: 'x'.repeat(bytes - 12) }))
    cache.set(bytes, json)
  }
  setResponseHeader(event, 'content-type', 'application/json; charset=utf-8')
  return json
})
