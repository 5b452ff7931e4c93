/**
 * Global setup for the e2e and browser projects: one build, one server, one throw-away database.
 * - builds the app with `nuxi build` only when a source file is newer than .output (CI: always fresh);
 * - starts the local fakes (mail catcher; payments and vehicle data when present) on free ports, in this process;
 * - migrates and seeds a database in a temporary folder (or, with BORELINE_E2E_DATABASE=postgres, a fresh PostgreSQL
 *   database on the server BORELINE_TEST_PG_URL names), then starts `node .output/server/index.mjs`.
 * Both projects share it: a second call reuses the running server (reference counted).
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process'
import { createWriteStream, existsSync, mkdirSync, mkdtempSync, readdirSync, rmSync, statSync, writeFileSync } from 'node:fs'
import { createServer } from 'node:net'
import { tmpdir } from 'node:os'
import { join, resolve } from 'node:path'
import type { TestProject } from 'vitest/node'
import { serverNodeArgs } from '../../scripts/server-process.mjs'
import { freshPgDatabase, pgAdminUrl } from './pg-database'

const root = resolve(import.meta.dirname, '../..')
// BORELINE_BUILD_DIR lets several work trees (or engineers) build and test side by side
const outDir = process.env.BORELINE_BUILD_DIR ? join(resolve(process.env.BORELINE_BUILD_DIR), '.output') : join(root, '.output')

interface Shared {
  refs: number
  env: TestEnv
  server: ChildProcess
  closers: (() => Promise<void>)[]
  dir: string
}
export interface TestEnv {
  baseUrl: string; mailUrl: string; paymentsUrl: string; uploadsDir: string; tmpDir: string
  /** the SQLite file ('' on PostgreSQL) */
  dbPath: string
  /** DATABASE_URL of the run: sqlite:<dbPath> or postgres://… */
  databaseUrl: string
  smtpPort: number; vehicleDataUrl: string
  /** the server process, for tests that watch its memory */
  serverPid: number
  /** where the server writes its security log (JSON lines) */
  securityLog: string
  /** the environment the repository's scripts need to work on this run's database (user:create) */
  scriptEnv: Record<string, string>
  /** the settings the server was started with (a second process on the same database starts with them too) */
  serverEnv: Record<string, string>
}

const KEY = Symbol.for('boreline.e2e.shared')
const g = globalThis as unknown as Record<symbol, Promise<Shared> | undefined>

function newestMtime(p: string): number {
  if (!existsSync(p)) return 0
  const st = statSync(p)
  if (!st.isDirectory()) return st.mtimeMs
  let m = 0
  for (const name of readdirSync(p)) m = Math.max(m, newestMtime(join(p, name)))
  return m
}

function buildIfStale(): void {
  const marker = join(outDir, 'nitro.json')
  const sources = ['app', 'server', 'shared', 'public', 'nuxt.config.ts', 'tailwind.config.ts', 'package-lock.json']
  const newest = Math.max(...sources.map((s) => newestMtime(join(root, s))))
  if (!process.env.BORELINE_REBUILD && existsSync(marker) && statSync(marker).mtimeMs > newest) return
  console.log('[e2e] building the app once for all e2e and browser tests…')
  const r = spawnSync('npx', ['nuxi', 'build'], { cwd: root, encoding: 'utf8', env: { ...process.env, NODE_ENV: 'production' }, maxBuffer: 64 * 1024 * 1024 })
  if (r.status !== 0) throw new Error(`nuxi build failed:\n${(r.stdout + r.stderr).slice(-6000)}`)
}

export function freePort(): Promise<number> {
  return new Promise((res, rej) => {
    const s = createServer()
    s.once('error', rej)
    s.listen(0, '127.0.0.1', () => {
      const port = (s.address() as { port: number }).port
      s.close(() => res(port))
    })
  })
}

async function waitForHealth(url: string, server: ChildProcess, log: () => string): Promise<void> {
  const until = Date.now() + 60_000
  while (Date.now() < until) {
    if (server.exitCode !== null) throw new Error(`server exited (${server.exitCode}):\n${log()}`)
    try {
      const r = await fetch(`${url}/api/health`)
      if (r.ok) return
    } catch { /* not up yet */ }
    await new Promise((r) => setTimeout(r, 250))
  }
  throw new Error(`server did not become healthy:\n${log()}`)
}

async function start(): Promise<Shared> {
  buildIfStale()
  const dir = mkdtempSync(join(tmpdir(), 'boreline-e2e-'))
  const dbPath = join(dir, 'test.sqlite')
  const uploadsDir = join(dir, 'uploads')
  mkdirSync(uploadsDir)
  const closers: (() => Promise<void>)[] = []
  let databaseUrl = `sqlite:${dbPath}`
  const pgServer = pgAdminUrl()
  if (pgServer) {
    const fresh = await freshPgDatabase(pgServer, `boreline_e2e_${process.pid}`)
    databaseUrl = fresh.url
    closers.push(fresh.drop)
  }

  const { createMailCatcher } = await import('../../fakes/mail/server')
  const mail = createMailCatcher({ smtpPort: 0, httpPort: 0 })
  const { smtpPort, httpPort } = await mail.listen()
  closers.push(() => mail.close())

  const appPort = await freePort()
  const baseUrl = `http://127.0.0.1:${appPort}`
  let paymentsUrl = ''
  let paymentsPort = 0
  const paymentsModule = join(root, 'fakes/payments/server.ts')
  if (existsSync(paymentsModule)) {
    const { createPaymentsFake } = await import('../../fakes/payments/server')
    const fake = createPaymentsFake({ port: 0, webhookUrl: `${baseUrl}/api/webhooks/stripe`, webhookSecret: 'whsec_boreline_test_secret' })
    const info = await fake.listen()
    paymentsPort = info.port
    paymentsUrl = info.url
    closers.push(() => fake.close())
  }

  let vehicleDataUrl = ''
  let vehicleDataPort = 0
  if (existsSync(join(root, 'fakes/vehicle-data/server.ts'))) {
    const { createVehicleDataFake } = await import('../../fakes/vehicle-data/server')
    const fake = createVehicleDataFake({ port: 0, apiKey: 'vd_test_e2e' })
    const info = await fake.listen()
    vehicleDataPort = info.port
    vehicleDataUrl = info.url
    closers.push(() => fake.close())
  }

  const own: Record<string, string> = {
    NODE_ENV: 'production',
    HOST: '127.0.0.1',
    PORT: String(appPort),
    UV_THREADPOOL_SIZE: '16',
    DATABASE_URL: databaseUrl,
    NUXT_SESSION_PASSWORD: 'e2e-session-password-0123456789-abcdefghijkl',
    NUXT_MFA_KEY: 'e2e-second-factor-key-0123456789-abcdefghij',
    BORELINE_SECURITY_LOG: join(dir, 'security.log'),
    NUXT_PUBLIC_ORIGIN: baseUrl,
    NUXT_UPLOADS_DIR: uploadsDir,
    NUXT_SMTP_HOST: '127.0.0.1',
    NUXT_SMTP_PORT: String(smtpPort),
    NUXT_STRIPE_PORT: String(paymentsPort || 12111),
    NUXT_STRIPE_WEBHOOK_SECRET: 'whsec_boreline_test_secret',
    NUXT_VEHICLE_DATA_PORT: String(vehicleDataPort || 12112),
    NUXT_VEHICLE_DATA_KEY: 'vd_test_e2e',
    // short, so the test of a slow service does not wait long
    NUXT_VEHICLE_DATA_TIMEOUT_MS: '1500',
    BORELINE_TEST_HOOKS: '1',
  }
  const env: NodeJS.ProcessEnv = { ...process.env, ...own }
  const seed = spawnSync('npx', ['tsx', 'scripts/db-seed.ts'], { cwd: root, env, encoding: 'utf8' })
  if (seed.status !== 0) throw new Error(`seeding failed:\n${seed.stdout}\n${seed.stderr}`)

  let out = ''
  const server = spawn(process.execPath, [...serverNodeArgs(), join(outDir, 'server/index.mjs')], { cwd: root, env, stdio: ['ignore', 'pipe', 'pipe'] })
  server.stdout!.on('data', (d) => { out = (out + d).slice(-20_000) })
  server.stderr!.on('data', (d) => { out = (out + d).slice(-20_000) })
  // BORELINE_E2E_SERVER_LOG=<file>: everything the server prints, for looking into a failure
  if (process.env.BORELINE_E2E_SERVER_LOG) {
    const log = createWriteStream(process.env.BORELINE_E2E_SERVER_LOG, { flags: 'a' })
    server.stdout!.pipe(log)
    server.stderr!.pipe(log)
  }
  await waitForHealth(baseUrl, server, () => out)
  writeFileSync(join(dir, 'server.log.path'), 'see stdout')
  const tmpDir = join(dir, 'work')
  mkdirSync(tmpDir)
  return {
    refs: 0, server, closers, dir,
    env: {
      baseUrl, mailUrl: `http://127.0.0.1:${httpPort}`, paymentsUrl, dbPath: pgServer ? '' : dbPath, databaseUrl, uploadsDir, tmpDir, smtpPort, vehicleDataUrl,
      serverPid: server.pid!, securityLog: String(env.BORELINE_SECURITY_LOG),
      scriptEnv: { DATABASE_URL: String(env.DATABASE_URL), NUXT_MFA_KEY: String(env.NUXT_MFA_KEY), NUXT_SESSION_PASSWORD: String(env.NUXT_SESSION_PASSWORD) },
      serverEnv: own,
    },
  }
}

declare module 'vitest' {
  export interface ProvidedContext { boreline: TestEnv }
}

export default async function setup(project: TestProject) {
  g[KEY] ??= start()
  const shared = await g[KEY]!
  shared.refs++
  project.provide('boreline', shared.env)
  return async () => {
    shared.refs--
    if (shared.refs > 0) return
    shared.server.kill('SIGTERM')
    for (const c of shared.closers) await c().catch(() => {})
    if (!process.env.BORELINE_KEEP_TMP) rmSync(shared.dir, { recursive: true, force: true })
  }
}
