/**
 * Distributor staff made for a test with the repository's own command (`npm run user:create`, on this run's
 * database), optionally with a TOTP secret of the test's choosing, which is then remembered for the run.
 */
import { execFile } from 'node:child_process'
import { promisify } from 'node:util'
import { randomBytes } from 'node:crypto'
import { resolve } from 'node:path'
import { env } from './api'
import { uniqueEmail } from './accounts'
import { rememberSecret } from './totp'

const root = resolve(import.meta.dirname, '../..')
const BASE32 = 'ABCDEFGHIJKLMNOPQRSTUVWXYZ234567'

/** A random 160-bit secret in base32 (as an authenticator app is given one). */
export function newSecret(): string {
  return [...randomBytes(32)].map((b) => BASE32[b % 32]).join('')
}

export interface Staff { email: string; password: string; secret: string | null }

/**
 * Runs user:create; `secret: null` leaves the person to set up an app at first sign-in. Asynchronous on purpose: a
 * blocking child process would keep the worker from seeing the server close idle connections, and the next request
 * would go out on a dead one.
 */
export async function createStaff(role: 'distributor_admin' | 'counter_staff', o: { secret?: string | null; password?: string; name?: string } = {}): Promise<Staff> {
  const email = uniqueEmail(role === 'distributor_admin' ? 'admin' : 'counter')
  const password = o.password ?? 'copper-rotor-lantern'
  const secret = o.secret === undefined ? newSecret() : o.secret
  const args = ['tsx', 'scripts/user-create.ts', '--email', email, '--name', o.name ?? 'Quinn Testwell', '--role', role, '--password', password, ...(secret ? ['--totp-secret', secret] : [])]
  try {
    await promisify(execFile)('npx', args, { cwd: root, env: { ...process.env, ...env().scriptEnv }, encoding: 'utf8', timeout: 60_000 })
  } catch (err) {
    throw new Error(`user:create failed: ${(err as { stderr?: string }).stderr ?? err}`)
  }
  if (secret) rememberSecret(email, secret)
  return { email, password, secret }
}
