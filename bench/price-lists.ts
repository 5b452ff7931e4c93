/**
 * Benchmark: a 200,000-row price file through the built server, beside the `sqlite3` command-line tool's
 * `.import` of the same CSV (the near-physical floor for "read this CSV into SQLite" on this machine).
 *
 *   NODE_PATH=$PWD/node_modules BORELINE_BUILD_DIR=/tmp/build-prices npx nuxi build   # once
 *   BORELINE_BUILD_DIR=/tmp/build-prices npx tsx bench/price-lists.ts
 *
 * One run: a throw-away database with the demo seed, then
 *   A. a file of 200,000 new parts (builds the synthetic catalogue) — upload to preview, apply;
 *   B. a file of the same 200,000 SKUs where 40 % of the prices move (1 in 500 by more than 30 %), every row
 *      with stock for both branches — upload to preview, apply, roll back.
 * Measured: wall times, the server's peak resident memory (VmHWM), and GET /api/health latency sampled
 * continuously (one request in flight, every 25 ms) while each file is uploaded, checked and applied.
 * Targets (issue 8): preview + apply within 6x the `.import` time; peak memory under 500 MB; health p99 under 200 ms.
 */
import { spawn, spawnSync } from 'node:child_process'
import { mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs'
import { createServer } from 'node:net'
import { cpus, tmpdir } from 'node:os'
import { join, resolve } from 'node:path'
import { performance } from 'node:perf_hooks'

const root = resolve(import.meta.dirname, '..')
const outDir = process.env.BORELINE_BUILD_DIR ? join(resolve(process.env.BORELINE_BUILD_DIR), '.output') : join(root, '.output')
const ROWS = Number(process.env.BENCH_ROWS ?? 200_000)
const dir = mkdtempSync(join(tmpdir(), 'boreline-bench-prices-'))

function freePort(): Promise<number> {
  return new Promise((res, rej) => {
    const s = createServer()
    s.once('error', rej)
    s.listen(0, '127.0.0.1', () => { const p = (s.address() as { port: number }).port; s.close(() => res(p)) })
  })
}

const TYPES = ['pad_set', 'disc', 'drum', 'shoe_set', 'caliper', 'wheel_cylinder', 'master_cylinder', 'hose', 'fitting_kit', 'wear_sensor']
const HEADER = 'sku,description,type,list_price,trade_cost,core_deposit,pack_quantity,stock_NGT,stock_RVS'
const amount = (m: number) => (m / 100).toFixed(2)

/** Deterministic pseudo-random numbers (mulberry32), so every run prices the same parts the same way. */
function rng(seed: number) {
  return () => {
    seed |= 0; seed = (seed + 0x6d2b79f5) | 0
    let t = Math.imul(seed ^ (seed >>> 15), 1 | seed)
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

function basePrice(i: number): number { return 800 + ((i * 7919) % 40_000) }

function makeFile(kind: 'create' | 'update'): string {
  const rand = rng(kind === 'create' ? 1 : 2)
  const lines = [HEADER]
  for (let i = 1; i <= ROWS; i++) {
    let list = basePrice(i)
    if (kind === 'update') {
      const r = rand()
      if (i % 500 === 0) list = Math.round(list * 1.45)
      else if (r < 0.4) list = Math.round(list * (1 + (rand() * 0.16 - 0.06)))
    }
    const trade = Math.round(list * 0.62)
    const type = TYPES[i % TYPES.length]!
    const core = type === 'caliper' || type === 'master_cylinder' ? 2500 : 0
    lines.push(`SYN-${String(i).padStart(6, '0')},Synthetic ${type.replace('_', ' ')} ${i},${type},${amount(list)},${amount(trade)},${amount(core)},${i % 50 === 0 ? 2 : 1},${i % 37},${i % 11}`)
  }
  const p = join(dir, `${kind}.csv`)
  writeFileSync(p, lines.join('\n') + '\n')
  return p
}

function sqliteImportMs(csvPath: string): number {
  const times: number[] = []
  for (let k = 0; k < 3; k++) {
    const dbFile = join(dir, `import-${k}.sqlite`)
    const t = performance.now()
    const r = spawnSync('sqlite3', [dbFile, '.mode csv', `.import ${csvPath} prices_import`], { encoding: 'utf8' })
    times.push(performance.now() - t)
    if (r.status !== 0) throw new Error(`sqlite3 .import failed: ${r.stderr}`)
    rmSync(dbFile, { force: true })
  }
  times.sort((a, b) => a - b)
  return times[1]! // median of three
}

function vmStatus(pid: number): { rss: number; hwm: number } {
  const s = readFileSync(`/proc/${pid}/status`, 'utf8')
  const kb = (k: string) => Number(new RegExp(`${k}:\\s+(\\d+)`).exec(s)?.[1] ?? 0) * 1024
  return { rss: kb('VmRSS'), hwm: kb('VmHWM') }
}

function percentile(sorted: number[], p: number): number {
  if (!sorted.length) return NaN
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]!
}

async function main() {
  if (spawnSync('sqlite3', ['-version']).status !== 0) throw new Error('sqlite3 CLI missing: apt-get install -y sqlite3')
  // files and the floor first: the synchronous work here would otherwise stall this process's HTTP client
  const createCsv = makeFile('create')
  const updateCsv = makeFile('update')
  const importCreate = sqliteImportMs(createCsv)
  const importUpdate = sqliteImportMs(updateCsv)
  const dbPath = join(dir, 'bench.sqlite')
  const uploadsDir = join(dir, 'uploads')
  const { createMailCatcher } = await import('../fakes/mail/server')
  const mail = createMailCatcher({ smtpPort: 0, httpPort: 0 })
  const { smtpPort } = await mail.listen()
  const port = await freePort()
  const base = `http://127.0.0.1:${port}`
  const env = {
    ...process.env, NODE_ENV: 'production', HOST: '127.0.0.1', PORT: String(port), UV_THREADPOOL_SIZE: '16',
    DATABASE_URL: `sqlite:${dbPath}`, NUXT_SESSION_PASSWORD: 'bench-session-password-0123456789-abcdefghijkl',
    NUXT_PUBLIC_ORIGIN: base, NUXT_UPLOADS_DIR: uploadsDir, NUXT_SMTP_HOST: '127.0.0.1', NUXT_SMTP_PORT: String(smtpPort),
  }
  const seed = spawnSync('npx', ['tsx', 'scripts/db-seed.ts'], { cwd: root, env, encoding: 'utf8' })
  if (seed.status !== 0) throw new Error(`seed failed: ${seed.stderr}`)
  const server = spawn(process.execPath, [join(outDir, 'server/index.mjs')], { cwd: root, env, stdio: ['ignore', 'pipe', 'pipe'] })
  let log = ''
  server.stdout!.on('data', (d) => { log = (log + d).slice(-20_000) })
  server.stderr!.on('data', (d) => { log = (log + d).slice(-20_000) })
  server.on('exit', (code, signal) => { log += `\n[server exited: ${code ?? signal}]` })
  try {
    for (let i = 0; i < 240; i++) {
      try { if ((await fetch(`${base}/api/health`)).ok) break } catch { /* starting */ }
      await new Promise((r) => setTimeout(r, 250))
    }
    const signIn = await fetch(`${base}/api/auth/sign-in`, {
      method: 'POST', headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: 'ines.okafor@kestrel-friction.test', password: 'brake-demo-2026' }),
    })
    if (!signIn.ok) throw new Error(`sign-in failed: ${signIn.status} ${await signIn.text()}`)
    const cookie = signIn.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ')
    const api = async (path: string, init: RequestInit = {}) => {
      const r = await fetch(`${base}${path}`, { ...init, headers: { ...(init.headers ?? {}), cookie } })
      const body = await r.json().catch(() => null)
      if (r.status >= 400) throw new Error(`${path}: ${r.status} ${JSON.stringify(body)}`)
      return body
    }

    // health latency, sampled while the work runs
    let sampling = false
    let stop = false
    let samples: number[] = []
    let peakRss = 0
    const sampler = (async () => {
      for (;;) {
        if (sampling) {
          const t = performance.now()
          await fetch(`${base}/api/health`).then((r) => r.arrayBuffer())
          samples.push(performance.now() - t)
          peakRss = Math.max(peakRss, vmStatus(server.pid!).rss)
        }
        if (stop) return
        await new Promise((r) => setTimeout(r, 25))
      }
    })()

    async function run(path: string, label: string, opts: { rollback: boolean }) {
      const size = statSync(path).size
      const content = readFileSync(path)
      samples = []
      sampling = true
      const t0 = performance.now()
      const fd = new FormData()
      fd.append('supplierName', 'Bench Supplier')
      fd.append('file', new Blob([content]), `${label}.csv`)
      const up = await api('/api/price-lists', { method: 'POST', body: fd })
      const tUploaded = performance.now()
      let detail: any
      for (;;) {
        detail = await api(`/api/price-lists/${up.id}`)
        if (detail.status !== 'parsing') break
        await new Promise((r) => setTimeout(r, 50))
      }
      const tPreview = performance.now()
      if (detail.status !== 'ready') throw new Error(`check ended ${detail.status}: ${detail.errorMessage}`)
      const tA = performance.now()
      await api(`/api/price-lists/${up.id}/apply`, {
        method: 'POST', headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ confirmLargeChanges: true, excludeRejected: true }),
      })
      const tApplied = performance.now()
      sampling = false
      const during = [...samples].sort((a, b) => a - b)
      let rollbackMs: number | null = null
      if (opts.rollback) {
        const tr = performance.now()
        await api(`/api/price-lists/${up.id}/rollback`, { method: 'POST' })
        rollbackMs = performance.now() - tr
      }
      return {
        label, sizeMb: size / 1024 / 1024, counts: detail.counts,
        uploadMs: tUploaded - t0, previewMs: tPreview - t0, applyMs: tApplied - tA, rollbackMs,
        health: { n: during.length, p50: percentile(during, 50), p99: percentile(during, 99), max: during.at(-1) ?? NaN },
      }
    }

    const a = await run(createCsv, 'A-create', { rollback: false })
    const b = await run(updateCsv, 'B-update', { rollback: true })
    stop = true
    await sampler
    const hwm = vmStatus(server.pid!).hwm

    const rows = [a, b].map((r, i) => {
      const imp = i === 0 ? importCreate : importUpdate
      return { ...r, importMs: imp, ratio: (r.previewMs + r.applyMs) / imp }
    })
    const fmt = (ms: number) => `${(ms / 1000).toFixed(2)} s`
    console.log(`\nmachine: ${cpus().length} cores (${cpus()[0]?.model ?? '?'}), Node ${process.version}, sqlite3 CLI ${spawnSync('sqlite3', ['-version'], { encoding: 'utf8' }).stdout.split(' ')[0]}`)
    console.log(`rows per file: ${ROWS.toLocaleString('en-GB')}\n`)
    console.log('| run | file | counts | upload | upload → preview | apply | preview + apply | sqlite3 .import | ratio | health p50 / p99 / max (n) |')
    console.log('|---|---|---|---|---|---|---|---|---|---|')
    for (const r of rows) {
      const c = r.counts
      console.log(`| ${r.label} | ${r.sizeMb.toFixed(1)} MB | new ${c.new}, changed ${c.changed} (${c.large} > 30 %), unchanged ${c.unchanged}, refused ${c.rejected} | ${fmt(r.uploadMs)} | ${fmt(r.previewMs)} | ${fmt(r.applyMs)} | ${fmt(r.previewMs + r.applyMs)} | ${fmt(r.importMs)} | **${r.ratio.toFixed(1)}x** | ${r.health.p50.toFixed(0)} / **${r.health.p99.toFixed(0)}** / ${r.health.max.toFixed(0)} ms (${r.health.n}) |`)
    }
    console.log(`\nroll back of run B: ${fmt(b.rollbackMs!)}`)
    console.log(`peak server memory (VmHWM): **${(hwm / 1024 / 1024).toFixed(0)} MB** (highest sampled RSS ${(peakRss / 1024 / 1024).toFixed(0)} MB)`)
    console.log(`targets: ratio <= 6x -> ${rows.map((r) => (r.ratio <= 6 ? 'met' : 'NOT met')).join(' / ')}; memory < 500 MB -> ${hwm < 500 * 1024 * 1024 ? 'met' : 'NOT met'}; health p99 < 200 ms -> ${rows.map((r) => (r.health.p99 < 200 ? 'met' : 'NOT met')).join(' / ')}`)
  } catch (err) {
    console.error(err)
    console.error(log)
    process.exitCode = 1
  } finally {
    if (process.env.BENCH_LOG) console.log(log)
    server.kill('SIGTERM')
    await mail.close().catch(() => {})
    if (!process.env.BENCH_KEEP) rmSync(dir, { recursive: true, force: true })
  }
}

await main()
