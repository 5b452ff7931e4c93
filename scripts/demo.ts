/**
 * npm run demo: builds if needed, migrates and seeds the demo database, starts the local fakes and the
 * production server on http://localhost:3000, and prints the demo sign-ins with the distributor staff's
 * two-step sign-in secrets. Ctrl-C stops everything.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process'
import { randomBytes } from 'node:crypto'
import { existsSync, mkdirSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs'
import { join, resolve } from 'node:path'
import { serverEnv, serverNodeArgs } from './server-process.mjs'

const root = resolve(import.meta.dirname, '..')
const port = process.env.PORT ?? '3000'

function newest(p: string): number {
  if (!existsSync(p)) return 0
  const st = statSync(p)
  return st.isDirectory() ? Math.max(0, ...readdirSync(p).map((n) => newest(join(p, n)))) : st.mtimeMs
}

// the build the project's other commands use: $BORELINE_BUILD_DIR/.output when set, else ./.output
const output = process.env.BORELINE_BUILD_DIR ? join(resolve(process.env.BORELINE_BUILD_DIR), '.output') : join(root, '.output')
const marker = join(output, 'nitro.json')
const stale = !existsSync(marker) || statSync(marker).mtimeMs < Math.max(...['app', 'server', 'shared', 'public', 'nuxt.config.ts', 'package-lock.json'].map((s) => newest(join(root, s))))
if (stale) {
  console.log('Building Boreline (first run or sources changed)…')
  const b = spawnSync('npx', ['nuxi', 'build'], { cwd: root, stdio: 'inherit', env: { ...process.env, NODE_ENV: 'production' } })
  if (b.status !== 0) process.exit(b.status ?? 1)
}

mkdirSync(join(root, 'data'), { recursive: true })
const secretFile = join(root, 'data/.session-password')
if (!process.env.NUXT_SESSION_PASSWORD) {
  if (!existsSync(secretFile)) writeFileSync(secretFile, randomBytes(32).toString('base64url'), { mode: 0o600 })
  process.env.NUXT_SESSION_PASSWORD = readFileSync(secretFile, 'utf8').trim()
}

const seed = spawnSync('npx', ['tsx', 'scripts/db-seed.ts'], { cwd: root, stdio: 'inherit', env: process.env })
if (seed.status !== 0) process.exit(seed.status ?? 1)

const children: ChildProcess[] = []
const stopAll = () => { for (const c of children) c.kill('SIGTERM') }
process.on('SIGINT', () => { stopAll(); process.exit(0) })
process.on('SIGTERM', () => { stopAll(); process.exit(0) })

// the fakes and the server agree on where each other is: the payments fake sends its webhooks to this server's
// origin (its PORT), and the server sends mail to the SMTP port the mail fake listens on
const together = {
  ...process.env, PORT: port, NUXT_PUBLIC_ORIGIN: process.env.NUXT_PUBLIC_ORIGIN ?? `http://localhost:${port}`,
  NUXT_SMTP_PORT: process.env.NUXT_SMTP_PORT ?? process.env.MAIL_FAKE_SMTP_PORT ?? '1025',
}
children.push(spawn('npx', ['tsx', 'fakes/start.ts'], { cwd: root, stdio: 'inherit', env: together }))
const server = spawn(process.execPath, [...serverNodeArgs(), join(output, 'server/index.mjs')], {
  cwd: root, stdio: 'inherit', env: serverEnv({ ...together, NODE_ENV: 'production' }),
})
children.push(server)
server.on('exit', (code) => { stopAll(); process.exit(code ?? 0) })

const { demoSignIns, DEMO_PASSWORD, DEMO_TOTP_SECRETS } = await import('../server/seed/accounts')
for (let i = 0; i < 120; i++) {
  try { if ((await fetch(`http://127.0.0.1:${port}/api/health`)).ok) break } catch { /* starting */ }
  await new Promise((r) => setTimeout(r, 500))
}
// the mailbox the fakes really listen on (fakes/mail/index.ts reads the same setting)
const mailbox = `http://127.0.0.1:${process.env.MAIL_FAKE_HTTP_PORT ?? 8025}/`
console.log(`\nBoreline is running on http://localhost:${port}  (e-mails it sends: ${mailbox})`)
console.log(`Demo sign-ins (password for all: ${DEMO_PASSWORD}):`)
for (const s of demoSignIns()) console.log(`  ${s.email.padEnd(42)} ${s.role.padEnd(18)} ${s.organisation} (${s.status})`)
console.log('Type LM65 WRD in the header\'s box as Millbrook to open a car with remembered answers; add YT68 KDM to see a registration look-up.')
console.log('Distributor staff sign in with two steps. Add a secret to an authenticator app, or print the current code with')
console.log('`npm run demo:code -- <e-mail>`:')
for (const [email, secret] of Object.entries(DEMO_TOTP_SECRETS)) console.log(`  ${email.padEnd(42)} ${secret}`)
