import { createReadStream } from 'node:fs'
import { parse } from 'csv-parse'
import { once } from 'node:events'
async function time(label: string, fn: () => Promise<void>) { const t = performance.now(); await fn(); console.log(label, Math.round(performance.now() - t), 'ms') }
const f = '/tmp/pl-run/work/m.csv'
await time('for-await', async () => { const p = createReadStream(f, { highWaterMark: 256 * 1024 }).pipe(parse({ relax_column_count: true, relax_quotes: true })); let n = 0; for await (const r of p) n++ })
await time('read loop', async () => {
  const p = createReadStream(f, { highWaterMark: 256 * 1024 }).pipe(parse({ relax_column_count: true, relax_quotes: true }))
  let n = 0; let ended = false; p.on('end', () => { ended = true })
  for (;;) { let r; while ((r = p.read()) !== null) n++; if (ended) break; await Promise.race([once(p, 'readable'), once(p, 'end')]) }
  console.log(n)
})
await time('for-await', async () => { const p = createReadStream(f, { highWaterMark: 256 * 1024 }).pipe(parse({ relax_column_count: true, relax_quotes: true })); let n = 0; for await (const r of p) n++ })
