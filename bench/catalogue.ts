/**
 * Catalogue benchmark: one run, figures side by side, ratios against the targets.
 *
 *   npx tsx bench/catalogue.ts [--database <sqlite file>] [--output <.output dir>] [--duration 10] [--connections 50]
 *                              [--parts 200000 --vehicles 20000 --fitments 1000000]
 *
 * - builds the synthetic catalogue (--parts, --vehicles, --fitments; 200k/20k/1M by default, 1M/50k/2.5M for the
 *   national size) into --database unless it already holds it;
 * - the server listens on $PORT when it is set (else a free port), so the run can sit beside the fakes and other
 *   servers on ports chosen outside; the machine's load average is printed at the start and the end;
 * - starts the built server (`--output`, default $BORELINE_BUILD_DIR/.output or ./.output) on that database with
 *   BORELINE_BENCH=1 and measures start-up (until /api/health answers, and until the search index is built) and RSS;
 * - GET /api/vehicles/:id/parts under --connections connections with autocannon over 200 vehicles, cached and with
 *   the caches off (BORELINE_CATALOGUE_CACHE=0 and BORELINE_SESSION_CACHE=0, a second server), beside the constant JSON
 *   route of the same size, with and without a session;
 * - search latency over a fixed mix of 1,000 queries (SKUs, OE numbers, typos, superseded SKUs, two words, type +
 *   size): in-process (plan + index), end to end over HTTP, and SQLite FTS5 on the same rows; with the share of
 *   queries whose expected part is in the first 20 results.
 * With BENCH_SUMMARY=<file> the figures are also written there as JSON ({@link CatalogueSummary}).
 * Keep the machine otherwise quiet; the whole run takes 4-7 minutes on 2 cores.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process'
import { existsSync, mkdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs'
import { createServer } from 'node:net'
import os from 'node:os'
import { dirname, join, resolve } from 'node:path'
import { serverEnv, serverNodeArgs } from '../scripts/server-process.mjs'
// @ts-expect-error autocannon ships without type declarations
import autocannon from 'autocannon'
import sqlite3 from 'sqlite3'

interface CannonResult { requests: { average: number }; latency: { p50: number; p99: number }; non2xx: number; errors: number }

const root = resolve(import.meta.dirname, '..')
const arg = (name: string, fallback: string) => { const i = process.argv.indexOf(`--${name}`); return i > 0 ? process.argv[i + 1]! : fallback }
const dbPath = resolve(arg('database', '/tmp/boreline-bench/catalogue.sqlite'))
const output = resolve(arg('output', process.env.BORELINE_BUILD_DIR ? join(process.env.BORELINE_BUILD_DIR, '.output') : join(root, '.output')))
const duration = Number(arg('duration', '10'))
const connections = Number(arg('connections', '50'))
const sizes = { parts: Number(arg('parts', '200000')), vehicles: Number(arg('vehicles', '20000')), fitments: Number(arg('fitments', '1000000')) }
const load1 = () => os.loadavg().map((x) => x.toFixed(2)).join(', ')
const MANAGER = 'hattie.corran@millbrook-motors.test'
const PASSWORD = 'brake-demo-2026'

const pct = (xs: number[], p: number) => { const s = [...xs].sort((a, b) => a - b); return s[Math.min(s.length - 1, Math.floor((p / 100) * s.length))]! }
const ms = (x: number) => `${x.toFixed(1)} ms`
function all<T>(db: sqlite3.Database, sql: string, params: unknown[] = []): Promise<T[]> {
  return new Promise((res, rej) => db.all(sql, params, (e, rows) => (e ? rej(e) : res(rows as T[]))))
}
function exec(db: sqlite3.Database, sql: string): Promise<void> {
  return new Promise((res, rej) => db.exec(sql, (e) => (e ? rej(e) : res())))
}
function freePort(): Promise<number> {
  return new Promise((res, rej) => { const s = createServer(); s.once('error', rej); s.listen(0, '127.0.0.1', () => { const p = (s.address() as { port: number }).port; s.close(() => res(p)) }) })
}
const rssMb = (pid: number, field = 'VmRSS') => Number(/(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8').split('\n').find((l) => l.startsWith(field)) ?? '')?.[1] ?? 0) / 1024

async function ensureCatalogue(): Promise<void> {
  if (existsSync(dbPath)) {
    const db = new sqlite3.Database(dbPath, sqlite3.OPEN_READONLY)
    const [r] = await all<{ n: number }>(db, "SELECT COUNT(*) AS n FROM parts WHERE sku LIKE 'SY-%'").catch(() => [{ n: 0 }])
    db.close()
    if (r!.n >= sizes.parts) return
    throw new Error(`${dbPath} exists but does not hold the synthetic catalogue; remove it or pass another --database`)
  }
  mkdirSync(dirname(dbPath), { recursive: true })
  console.log(`building the synthetic catalogue (${sizes.parts} parts, ${sizes.vehicles} vehicles, ${sizes.fitments} fitments)…`)
  const t = Date.now()
  const r = spawnSync('npx', ['tsx', 'scripts/catalogue-synthetic.ts', '--parts', String(sizes.parts), '--vehicles', String(sizes.vehicles), '--fitments', String(sizes.fitments), '--database', dbPath], { cwd: root, stdio: 'inherit' })
  if (r.status !== 0) throw new Error('catalogue:synthetic failed')
  console.log(`  written in ${((Date.now() - t) / 1000).toFixed(1)} s`)
}

interface Server { proc: ChildProcess; url: string; startMs: number; stop: () => Promise<void> }
async function startServer(extraEnv: Record<string, string> = {}): Promise<Server> {
  const port = Number(process.env.PORT) || await freePort()
  const url = `http://127.0.0.1:${port}`
  const t0 = performance.now()
  const proc = spawn(process.execPath, [...serverNodeArgs(), join(output, 'server/index.mjs')], {
    cwd: root, stdio: ['ignore', 'ignore', 'inherit'],
    env: { ...serverEnv(), NODE_ENV: 'production', HOST: '127.0.0.1', PORT: String(port), DATABASE_URL: `sqlite:${dbPath}`, NUXT_SESSION_PASSWORD: 'bench-session-password-0123456789-abcdefgh', NUXT_PUBLIC_ORIGIN: url, BORELINE_BENCH: '1', ...extraEnv },
  })
  for (;;) {
    if (proc.exitCode !== null) throw new Error(`server exited with ${proc.exitCode}`)
    try { if ((await fetch(`${url}/api/health`)).ok) break } catch { /* starting */ }
    await new Promise((r) => setTimeout(r, 50))
  }
  return {
    proc, url, startMs: performance.now() - t0,
    stop: () => new Promise((res) => { proc.once('exit', () => res()); proc.kill('SIGTERM') }),
  }
}

async function signIn(url: string): Promise<string> {
  const r = await fetch(`${url}/api/auth/sign-in`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: MANAGER, password: PASSWORD }) })
  if (!r.ok) throw new Error(`sign-in failed: ${r.status}`)
  return r.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ')
}

/** Each second of a run: answers, their p99, and the server's RSS at its end (drift shows as a trend in any of them). */
interface Second { n: number; p99: number; rssMb: number }
function cannon(url: string, paths: string[], cookie?: string, pid?: number): Promise<CannonResult & { seconds: Second[] }> {
  const times: number[][] = []
  const rss: number[] = []
  const t0 = performance.now()
  const sampler = setInterval(() => { if (pid) rss.push(rssMb(pid)) }, 1000)
  return new Promise((res, rej) => {
    const run = autocannon({
      url, connections, duration, pipelining: 1,
      requests: paths.map((path) => ({ method: 'GET', path, headers: cookie ? { cookie } : {} })),
    }, (err: Error | null, result: CannonResult) => {
      clearInterval(sampler)
      if (err) return rej(err)
      // a second without a single answer counts too (a stall), with the run's own timeout as its tail
      const seconds = Array.from({ length: duration }, (_, i) => times[i] ?? []).map((xs, i) => ({ n: xs.length, p99: xs.length ? pct(xs, 99) : 10_000, rssMb: rss[i] ?? 0 }))
      res({ ...result, seconds })
    })
    run.on('response', (_client: unknown, _status: number, _bytes: number, responseTime: number) => {
      const s = Math.floor((performance.now() - t0) / 1000)
      ;(times[s] ??= []).push(responseTime)
    })
  })
}
const load = (r: CannonResult & { seconds?: Second[] }) => ({ rps: r.requests.average, p50: r.latency.p50, p99: r.latency.p99, non2xx: r.non2xx, errors: r.errors, seconds: r.seconds ?? [] })
/** First third against last third of a run, and the spread of the per-second p99. */
function drift(seconds: Second[]): string {
  const third = Math.max(1, Math.floor(seconds.length / 3))
  const avg = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / Math.max(1, xs.length)
  const [a, b] = [seconds.slice(0, third), seconds.slice(-third)]
  const p99s = seconds.map((x) => x.p99)
  return `req/s ${avg(a.map((x) => x.n)).toFixed(0)} -> ${avg(b.map((x) => x.n)).toFixed(0)}, p99 ${avg(a.map((x) => x.p99)).toFixed(0)} -> ${avg(b.map((x) => x.p99)).toFixed(0)} ms, `
    + `RSS ${avg(a.map((x) => x.rssMb)).toFixed(0)} -> ${avg(b.map((x) => x.rssMb)).toFixed(0)} MB (first third -> last third); `
    + `per-second p99 median ${pct(p99s, 50).toFixed(0)} ms, worst second ${Math.max(...p99s).toFixed(0)} ms`
}

// ---------------------------------------------------------------------------------------------------------------
// the fixed query mix

interface Query { q: string; kind: string; expect: string | null }
async function queryMix(db: sqlite3.Database): Promise<Query[]> {
  // deterministic: every n-th row
  const skus = await all<{ sku: string }>(db, "SELECT sku FROM parts WHERE status = 'active' AND id % 997 = 0 ORDER BY id LIMIT 200")
  const oes = await all<{ sku: string; oe: string }>(db, "SELECT p.sku, o.oe_number AS oe FROM part_oe_numbers o JOIN parts p ON p.id = o.part_id WHERE o.id % 983 = 0 AND p.status = 'active' ORDER BY o.id LIMIT 350")
  const olds = await all<{ sku: string; old: string }>(db, 'SELECT p.sku, s.old_sku AS old FROM supersessions s JOIN parts p ON p.id = s.new_part_id WHERE s.id % 7 = 0 ORDER BY s.id LIMIT 50')
  const descs = await all<{ sku: string; description: string; productLine: string }>(db, "SELECT sku, description, product_line AS productLine FROM parts WHERE id % 1301 = 0 AND sku LIKE 'SY-%' AND type != 'fluid' ORDER BY id LIMIT 150")
  const slip = (s: string, i: number) => {
    const pos = [...s].map((c, j) => (/\d/.test(c) ? j : -1)).filter((j) => j >= 0)
    const j = pos[i % pos.length]!
    if (i % 2 === 0 && /\d/.test(s[j + 1] ?? '') && s[j] !== s[j + 1]) return s.slice(0, j) + s[j + 1] + s[j] + s.slice(j + 2) // swap neighbours
    return s.slice(0, j) + String((Number(s[j]) + 3) % 10) + s.slice(j + 1) // one wrong digit
  }
  const out: Query[] = []
  skus.forEach((r) => out.push({ q: r.sku, kind: 'SKU', expect: r.sku }))
  oes.slice(0, 200).forEach((r) => out.push({ q: r.oe, kind: 'OE number', expect: r.sku }))
  oes.slice(200, 350).forEach((r, i) => out.push({ q: slip(r.oe, i), kind: 'OE typo', expect: r.sku }))
  skus.slice(0, 100).forEach((r, i) => out.push({ q: slip(r.sku, i + 3), kind: 'SKU typo', expect: r.sku }))
  olds.forEach((r) => out.push({ q: r.old, kind: 'superseded', expect: r.sku }))
  descs.forEach((r, i) => {
    const m = / for (\S+) (\S+)/.exec(r.description)
    const q = i % 2 === 0 && m ? `${m[1]} ${m[2]}` : r.productLine
    out.push({ q: q.toLowerCase(), kind: 'two words', expect: null })
  })
  const sizes = ['front disc 300', 'master cylinder 22.22', 'rear pads 16.5', 'caliper 54', 'rear drum 228.6', 'hose 420', 'front disc 280', 'wheel cylinder 19.05', 'vented disc 320', 'reman caliper 57', 'front pads 19', 'master cylinder 25.4', 'disc 345', 'rear disc 272', 'sensor 900']
  for (let i = 0; out.length < 1000; i++) out.push({ q: sizes[i % sizes.length]!, kind: 'type + size', expect: null })
  return out
}

/** FTS5 on the same rows: SKU, OE numbers, superseded SKUs, description and product line. */
async function ftsBuild(db: sqlite3.Database): Promise<number> {
  const [has] = await all<{ n: number }>(db, "SELECT COUNT(*) AS n FROM sqlite_master WHERE name = 'bench_parts_fts'")
  if (has!.n) return 0
  const t = performance.now()
  await exec(db, `CREATE VIRTUAL TABLE bench_parts_fts USING fts5(sku, ids, description, product_line, tokenize = 'unicode61');
    INSERT INTO bench_parts_fts (rowid, sku, ids, description, product_line)
      SELECT p.id, p.sku,
        COALESCE((SELECT group_concat(oe_number, ' ') FROM part_oe_numbers o WHERE o.part_id = p.id), '') || ' ' ||
        COALESCE((SELECT group_concat(old_sku, ' ') FROM supersessions s WHERE s.new_part_id = p.id), ''),
        p.description, p.product_line FROM parts p;`)
  return performance.now() - t
}
const ftsQuery = (q: string) => q.toLowerCase().split(/[^a-z0-9.]+/).filter(Boolean).map((t) => `"${t.replace(/"/g, '')}"*`).join(' AND ')

async function main() {
  if (!existsSync(join(output, 'server/index.mjs'))) throw new Error(`no built server at ${output}: run BORELINE_BUILD_DIR=… npx nuxi build first`)
  await ensureCatalogue()
  const db = new sqlite3.Database(dbPath)
  const [counts] = await all<{ parts: number; vehicles: number; fitments: number }>(db, 'SELECT (SELECT COUNT(*) FROM parts) AS parts, (SELECT COUNT(*) FROM vehicles) AS vehicles, (SELECT COUNT(*) FROM fitments) AS fitments')
  console.log(`catalogue: ${counts!.parts} parts, ${counts!.vehicles} vehicles, ${counts!.fitments} fitments\n`)

  // ---- start-up and memory: first without a saved index (built from the database, then saved beside it), then
  // a second start that loads the saved one; the rest of the run uses the second server
  const loadAtStart = load1()
  const saved = `${dbPath}.search-index`
  rmSync(saved, { force: true })
  const untilIndex = async (server: Server) => {
    const cookie = await signIn(server.url)
    const tIndex = performance.now()
    for (;;) { // the index is loaded or built in the background from start; the first search waits for it
      const r = await fetch(`${server.url}/api/parts?q=SY-P0000001&pageSize=1`, { headers: { cookie } })
      if (r.ok) break
      await new Promise((res) => setTimeout(res, 100))
    }
    return { cookie, indexReadyMs: server.startMs + (performance.now() - tIndex), rssReady: rssMb(server.proc.pid!) }
  }
  const builder = await startServer()
  const built = await untilIndex(builder)
  const tSave = performance.now()
  while (!existsSync(saved)) await new Promise((res) => setTimeout(res, 100))
  const savedMs = performance.now() - tSave
  const builtPeak = rssMb(builder.proc.pid!, 'VmHWM')
  await builder.stop()
  console.log(`start-up without a saved index: ${ms(builder.startMs)} until /api/health answers, ${(built.indexReadyMs / 1000).toFixed(1)} s until the search index answers (built); RSS ${built.rssReady.toFixed(0)} MB, peak ${builtPeak.toFixed(0)} MB; saved ${(savedMs / 1000).toFixed(1)} s later, ${(statSync(saved).size / 1048576).toFixed(0)} MB`)
  const server = await startServer()
  const { cookie, indexReadyMs, rssReady } = await untilIndex(server)
  console.log(`start-up with the saved index: ${ms(server.startMs)} until /api/health answers, ${(indexReadyMs / 1000).toFixed(1)} s until the search index answers (loaded); RSS ${rssReady.toFixed(0)} MB`)

  // ---- vehicle parts
  const vehicles = await all<{ id: number }>(db, "SELECT id FROM vehicles WHERE id % 100 = 0 AND make NOT IN ('Veltra','Kaskel','Durmond','Lystrom','Brenmoor','Taviro','Quillan') ORDER BY id LIMIT 200")
  const paths = vehicles.map((v) => `/api/vehicles/${v.id}/parts`)
  const cold: number[] = []
  let bytes = 0
  for (const p of paths) {
    const t = performance.now()
    const r = await fetch(server.url + p, { headers: { cookie } })
    bytes += (await r.text()).length
    cold.push(performance.now() - t)
  }
  const size = Math.round(bytes / paths.length)
  console.log(`vehicle parts: ${paths.length} vehicles, average response ${size} bytes; first (uncached) request p50 ${ms(pct(cold, 50))}, p99 ${ms(pct(cold, 99))}`)
  const cached = load(await cannon(server.url, paths, cookie, server.proc.pid))
  const constant = load(await cannon(server.url, [`/api/bench/constant?bytes=${size}`]))
  const constantSession = load(await cannon(server.url, [`/api/bench/constant?bytes=${size}`], cookie))
  const rssAfterLoad = rssMb(server.proc.pid!)

  // ---- search
  const mix = await queryMix(db)
  // slipped SKUs that are themselves another part's number: reported apart beside the share of all of them
  const typos = mix.filter((m) => m.kind === 'SKU typo').map((m) => m.q)
  const realTypos = new Set((await all<{ sku: string }>(db, `SELECT sku FROM parts WHERE sku IN (${typos.map(() => '?').join(', ')})`, typos)).map((r) => r.sku))
  const http: number[] = [], httpFound: boolean[] = []
  for (const m of mix) {
    const t = performance.now()
    const r = await fetch(`${server.url}/api/parts?${new URLSearchParams({ q: m.q, pageSize: '20' })}`, { headers: { cookie } })
    const body = await r.json() as { data: { sku: string }[] }
    http.push(performance.now() - t)
    if (m.expect) httpFound.push(body.data.some((d) => d.sku === m.expect))
  }
  const peakRss = rssMb(server.proc.pid!, 'VmHWM')
  await server.stop()

  // in-process: the same plan + index the server runs, without HTTP, session and page hydration: the index loaded
  // from the file the server saved (what a server runs after its first start; only read here), else built here
  process.env.DATABASE_URL = `sqlite:${dbPath}`
  process.env.BORELINE_SEARCH_INDEX_FILE = saved
  const { getDb, closeDb } = await import('../server/utils/db')
  const { readSavedIndex } = await import('../server/services/catalogue/saved-index')
  const { buildFromDatabase } = await import('../server/services/catalogue/index-source')
  const { planQuery } = await import('../server/services/catalogue/search-plan')
  void getDb()
  const index = (await readSavedIndex())?.index ?? await buildFromDatabase()
  const inproc: number[] = [], inprocFound: boolean[] = []
  for (let pass = 0; pass < 2; pass++) { // the first pass warms the JIT
    inproc.length = 0
    inprocFound.length = 0
    for (const m of mix) {
      const t = performance.now()
      const { hits } = index.search(planQuery(m.q))
      inproc.push(performance.now() - t)
      if (m.expect) inprocFound.push(hits.slice(0, 20).some((h) => index.info(h.id)?.sku === m.expect))
    }
  }
  await closeDb()

  const ftsBuildMs = await ftsBuild(db)
  const fts: number[] = [], ftsFound: boolean[] = []
  for (const m of mix) {
    const match = ftsQuery(m.q)
    const t = performance.now()
    const rows = match ? await all<{ sku: string }>(db, 'SELECT sku FROM bench_parts_fts WHERE bench_parts_fts MATCH ? ORDER BY rank LIMIT 20', [match]).catch(() => []) : []
    fts.push(performance.now() - t)
    if (m.expect) ftsFound.push(rows.some((r) => r.sku === m.expect))
  }
  db.close()

  // ---- uncached vehicle parts (second server, caches off)
  const uncachedServer = await startServer({ BORELINE_CATALOGUE_CACHE: '0', BORELINE_SESSION_CACHE: '0', BORELINE_SEARCH_INDEX_AT_START: '0' })
  const cookie2 = await signIn(uncachedServer.url)
  const uncached = load(await cannon(uncachedServer.url, paths, cookie2))
  await uncachedServer.stop()

  const share = (xs: boolean[]) => (xs.length ? `${((100 * xs.filter(Boolean).length) / xs.length).toFixed(1)} %` : '-')
  const byKind = (lat: number[]) => [...new Set(mix.map((m) => m.kind))].map((k) => {
    const xs = mix.map((m, i) => (m.kind === k ? lat[i]! : -1)).filter((x) => x >= 0)
    return `${k} p95 ${ms(pct(xs, 95))}`
  }).join('; ')
  const foundByKind = (found: boolean[]) => {
    const withExpect = mix.filter((m) => m.expect)
    return [...new Set(withExpect.map((m) => m.kind))].map((k) => `${k} ${share(found.filter((_, i) => withExpect[i]!.kind === k))}`).join(', ')
  }
  const row = (name: string, r: ReturnType<typeof load>) => `| ${name} | ${r.rps.toFixed(0)} | ${r.p50} ms | ${r.p99} ms | ${r.non2xx + r.errors} |`
  console.log(`
## Results (${new Date().toISOString().slice(0, 10)}, ${connections} connections, ${duration} s each)

| vehicle parts API | req/s | p50 | p99 | non-2xx/errors |
|---|---|---|---|---|
${row('GET /api/vehicles/:id/parts, cached', cached)}
${row('GET /api/vehicles/:id/parts, caches off (catalogue and session)', uncached)}
${row(`constant JSON, ${size} B, no session`, constant)}
${row(`constant JSON, ${size} B, signed in (session checks)`, constantSession)}

cached / constant (no session): ${(cached.rps / constant.rps).toFixed(2)}; cached / constant (signed in): ${(cached.rps / constantSession.rps).toFixed(2)}; cached / caches off: ${(cached.rps / uncached.rps).toFixed(2)}
target >= 2000 req/s: ${(cached.rps / 2000).toFixed(2)} x; target p99 < 40 ms: ${(cached.p99 / 40).toFixed(2)} of it (the signed-in ceiling's p99: ${(constantSession.p99 / 40).toFixed(2)} of it)
cached run, second by second: ${drift(cached.seconds)}
each second of the cached run (answers / p99 ms / RSS MB): ${cached.seconds.map((x) => `${x.n}/${x.p99.toFixed(0)}/${x.rssMb.toFixed(0)}`).join(' ')}

| search, 1,000 queries | p50 | p95 | expected part in first 20 |
|---|---|---|---|
| minisearch plan + index, in process | ${ms(pct(inproc, 50))} | ${ms(pct(inproc, 95))} | ${share(inprocFound)} |
| GET /api/parts end to end (sequential) | ${ms(pct(http, 50))} | ${ms(pct(http, 95))} | ${share(httpFound)} |
| SQLite FTS5 (prefix tokens, bm25), in process | ${ms(pct(fts, 50))} | ${ms(pct(fts, 95))} | ${share(ftsFound)} |

minisearch p95 / target 25 ms: ${(pct(inproc, 95) / 25).toFixed(2)}; end to end p95 / 50 ms: ${(pct(http, 95) / 50).toFixed(2)}; minisearch / FTS5 p95: ${(pct(inproc, 95) / pct(fts, 95)).toFixed(2)}
by kind (in process): ${byKind(inproc)}
SKU with one slip in the first 20 (target >= 95 %): ${share(inprocFound.filter((_, i) => mix.filter((m) => m.expect)[i]!.kind === 'SKU typo'))}
  of them, slips that make another part's number (${realTypos.size} of ${typos.length}): ${share(inprocFound.filter((_, i) => { const m = mix.filter((x) => x.expect)[i]!; return m.kind === 'SKU typo' && realTypos.has(m.q) }))}; slips that make no part's number: ${share(inprocFound.filter((_, i) => { const m = mix.filter((x) => x.expect)[i]!; return m.kind === 'SKU typo' && !realTypos.has(m.q) }))}
found by kind: minisearch ${foundByKind(inprocFound)}; FTS5 ${foundByKind(ftsFound)}${ftsBuildMs ? `\nFTS5 table built in ${(ftsBuildMs / 1000).toFixed(1)} s` : ''}

| start-up with ${counts!.parts} parts | figure | target | ratio |
|---|---|---|---|
| until /api/health answers | ${(server.startMs / 1000).toFixed(2)} s | 15 s | ${(server.startMs / 15000).toFixed(2)} |
| until the search index answers, loaded from its saved file | ${(indexReadyMs / 1000).toFixed(1)} s | 15 s | ${(indexReadyMs / 15000).toFixed(2)} |
| RSS when ready / after the load runs / peak, index loaded | ${rssReady.toFixed(0)} / ${rssAfterLoad.toFixed(0)} / ${peakRss.toFixed(0)} MB | 1229 MB (1.2 GB) | ${(peakRss / 1229).toFixed(2)} |
| until the search index answers, built (no saved file) | ${(built.indexReadyMs / 1000).toFixed(1)} s | - | - |
| RSS when ready / peak, index built and saved | ${built.rssReady.toFixed(0)} / ${builtPeak.toFixed(0)} MB | 1229 MB (1.2 GB) | ${(builtPeak / 1229).toFixed(2)} |

Each server process holds its own index (one process per core on PostgreSQL): N processes need about N x ${peakRss.toFixed(0)} MB.
Load average (1, 5, 15 min): ${loadAtStart} at the start, ${load1()} at the end.
`)
  // the same figures for another script to read (bench/national.ts), when BENCH_SUMMARY names a file
  if (process.env.BENCH_SUMMARY) {
    const typoFound = (real: boolean | null) => share(inprocFound.filter((_, i) => { const m = mix.filter((x) => x.expect)[i]!; return m.kind === 'SKU typo' && (real === null || realTypos.has(m.q) === real) }))
    const summary: CatalogueSummary = {
      parts: counts!.parts,
      vehicleParts: { rps: cached.rps, p99Ms: cached.p99 },
      ceilingSignedIn: { rps: constantSession.rps, p99Ms: constantSession.p99 },
      drift: drift(cached.seconds),
      searchP95Ms: { inProcess: pct(inproc, 95), endToEnd: pct(http, 95) },
      slips: { found: typoFound(null), real: realTypos.size, of: typos.length, realFound: typoFound(true), otherFound: typoFound(false) },
      foundByKind: foundByKind(inprocFound),
      indexReadyS: indexReadyMs / 1000,
      rssMb: { ready: rssReady, afterLoads: rssAfterLoad, peak: peakRss },
      builtWithoutFile: { indexReadyS: built.indexReadyMs / 1000, rssReadyMb: built.rssReady, peakMb: builtPeak },
      load: { start: loadAtStart, end: load1() },
    }
    writeFileSync(process.env.BENCH_SUMMARY, JSON.stringify(summary, null, 2))
  }
}

/** What BENCH_SUMMARY receives: the run's figures, times in ms or s as named, memory in MB, shares as text ("97.0 %"). */
export interface CatalogueSummary {
  parts: number
  vehicleParts: { rps: number; p99Ms: number }
  ceilingSignedIn: { rps: number; p99Ms: number }
  drift: string
  searchP95Ms: { inProcess: number; endToEnd: number }
  slips: { found: string; real: number; of: number; realFound: string; otherFound: string }
  foundByKind: string
  indexReadyS: number
  rssMb: { ready: number; afterLoads: number; peak: number }
  builtWithoutFile: { indexReadyS: number; rssReadyMb: number; peakMb: number }
  load: { start: string; end: string }
}

main().then(() => process.exit(0), (err) => { console.error(err); process.exit(1) })
