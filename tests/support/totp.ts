/**
 * Time-based one-time codes for tests, worked from the standards with node:crypto alone, not with the app's own
 * library: RFC 4648 section 6 (base32), RFC 4226 section 5.3 (HOTP: HMAC over the 8-byte counter, dynamic
 * truncation, modulo 10^digits) and RFC 6238 section 4 (TOTP: the counter is floor(unix time / 30)). The unit test
 * tests/unit/accounts/totp.test.ts checks this helper and the server's codes against RFC 6238's published vectors.
 *
 * Demo accounts' secrets come from the seed (DEMO_TOTP_SECRETS); secrets of people a test enrols are remembered in
 * a file of the test run, so every test file (each in its own worker) can compute their codes.
 */
import { createHmac } from 'node:crypto'
import { existsSync, mkdirSync, readFileSync, rmdirSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { DEMO_TOTP_SECRETS } from '../../server/seed/accounts'
import { env } from './api'

const BASE32 = 'ABCDEFGHIJKLMNOPQRSTUVWXYZ234567'

/** RFC 4648 base32 text to bytes (padding and case ignored). */
export function base32Bytes(text: string): Buffer {
  const clean = text.toUpperCase().replace(/=+$/, '')
  let bits = 0
  let value = 0
  const out: number[] = []
  for (const ch of clean) {
    const v = BASE32.indexOf(ch)
    if (v < 0) throw new Error(`not base32: ${ch}`)
    value = (value << 5) | v
    bits += 5
    if (bits >= 8) {
      out.push((value >>> (bits - 8)) & 0xff)
      bits -= 8
    }
  }
  return Buffer.from(out)
}

export const PERIOD = 30

/** The code for `secret` (base32 text or raw key bytes) at time step `step`. */
export function codeAtStep(secret: string | Buffer, step: number, digits = 6, algorithm: 'sha1' | 'sha256' | 'sha512' = 'sha1'): string {
  const key = typeof secret === 'string' ? base32Bytes(secret) : secret
  const counter = Buffer.alloc(8)
  counter.writeBigUInt64BE(BigInt(step))
  const mac = createHmac(algorithm, key).update(counter).digest()
  const offset = mac[mac.length - 1]! & 0x0f
  const binary = ((mac[offset]! & 0x7f) << 24) | (mac[offset + 1]! << 16) | (mac[offset + 2]! << 8) | mac[offset + 3]!
  return String(binary % 10 ** digits).padStart(digits, '0')
}

/** The code at a moment (unix seconds). */
export function codeAt(secret: string | Buffer, epochSeconds: number, digits = 6, algorithm: 'sha1' | 'sha256' | 'sha512' = 'sha1'): string {
  return codeAtStep(secret, Math.floor(epochSeconds / PERIOD), digits, algorithm)
}

export const stepNow = () => Math.floor(Date.now() / 1000 / PERIOD)

// ------------------------------------------------------------------ shared among the test files of one run

const runFile = (name: string) => join(env().tmpDir, name)

/** Runs `fn` holding a lock shared by every worker of the run (mkdir is atomic). */
export async function withRunLock<T>(name: string, fn: () => Promise<T> | T): Promise<T> {
  const dir = runFile(`${name}.lock`)
  const until = Date.now() + 120_000
  for (;;) {
    try { mkdirSync(dir); break } catch { /* held by another worker */ }
    if (Date.now() > until) throw new Error(`lock ${name} not released`)
    await new Promise((r) => setTimeout(r, 50))
  }
  try { return await fn() } finally { rmdirSync(dir) }
}

function readJson(name: string): Record<string, any> {
  const f = runFile(name)
  return existsSync(f) ? JSON.parse(readFileSync(f, 'utf8')) : {}
}
function writeJson(name: string, value: Record<string, unknown>): void {
  writeFileSync(runFile(name), JSON.stringify(value))
}

/** Remembers the secret of a person a test enrolled, for every test file of the run. */
export function rememberSecret(email: string, secret: string): void {
  const all = readJson('totp-secrets.json')
  all[email.toLowerCase()] = secret
  writeJson('totp-secrets.json', all)
}

/** The person's secret: a demo account's, or one a test enrolled; undefined when unknown. */
export function secretOf(email: string): string | undefined {
  const e = email.toLowerCase()
  return DEMO_TOTP_SECRETS[e] ?? readJson('totp-secrets.json')[e]
}

/**
 * A code the server has not seen used yet. The server takes each time step once per person, one step either side of
 * now: the steps this run has used are kept in a file, so the next sign-in takes the next step, waiting for it when
 * it is not yet within reach (two sign-ins at once, then one per 30 seconds per person).
 */
export async function freshCode(email: string, secret = secretOf(email)): Promise<string> {
  if (!secret) throw new Error(`no TOTP secret known for ${email}`)
  const e = email.toLowerCase()
  return withRunLock('totp-steps', async () => {
    const used = readJson('totp-steps.json')
    const step = Math.max((used[e] ?? 0) + 1, stepNow())
    const wait = (step - 1) * PERIOD * 1000 + 200 - Date.now()
    if (wait > 0) await new Promise((r) => setTimeout(r, wait))
    used[e] = step
    writeJson('totp-steps.json', used)
    return codeAtStep(secret, step)
  })
}

/** Notes that the server has seen a step used for this person (a test that sent a code of its own). */
export async function markStepUsed(email: string, step: number): Promise<void> {
  await withRunLock('totp-steps', () => {
    const used = readJson('totp-steps.json')
    used[email.toLowerCase()] = Math.max(used[email.toLowerCase()] ?? 0, step)
    writeJson('totp-steps.json', used)
  })
}
