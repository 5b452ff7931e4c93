/**
 * Helpers for the money-owed tests: a garage owing charges of given ages, the account reminder job run once, a
 * ledger entry's date moved, raw bytes.
 */
import { execFile } from 'node:child_process'
import { resolve } from 'node:path'
import { promisify } from 'node:util'
import { getDb, withWrite } from '../../server/utils/db'
import { type Client, env } from './api'
import { addLedgerEntry, makeGarage, models, type TestGarage } from './orders'

/** `npm run accounts:remind -- --now <at>` against the e2e database and mail catcher (without blocking the loop). */
export async function runAccountsRemind(at: Date, extraEnv: Record<string, string> = {}): Promise<string> {
  const e = env()
  try {
    const r = await promisify(execFile)('npx', ['tsx', 'scripts/accounts-remind.ts', '--now', at.toISOString()], {
      cwd: resolve(import.meta.dirname, '../..'), encoding: 'utf8',
      env: { ...process.env, DATABASE_URL: e.databaseUrl, NUXT_SMTP_HOST: '127.0.0.1', NUXT_SMTP_PORT: String(e.smtpPort), NUXT_PUBLIC_ORIGIN: e.baseUrl, ...extraEnv },
    })
    return r.stdout
  } catch (err) {
    const f = err as { code?: number; stdout?: string; stderr?: string }
    throw new Error(`accounts:remind failed (${f.code}):\n${f.stdout}\n${f.stderr}`)
  }
}

/** Moves every ledger entry of an order back to `at` (as if it had been booked then). */
export async function backdateOrderCharges(orderId: number, at: Date): Promise<void> {
  const stamp = `${at.toISOString().replace('T', ' ').replace('Z', '')} +00:00`
  models()
  await withWrite((t) => getDb().query('UPDATE ledger_entries SET created_at = $1 WHERE order_id = $2', { bind: [stamp, orderId], transaction: t }))
}

/** A download's bytes with the client's cookies. */
export async function bytesOf(c: Client, path: string): Promise<{ status: number; type: string; bytes: Buffer }> {
  const res = await fetch(new URL(path, env().baseUrl), { headers: { cookie: c.cookieHeader() } })
  return { status: res.status, type: res.headers.get('content-type') ?? '', bytes: Buffer.from(await res.arrayBuffer()) }
}

/** A write straight to the e2e database, for a scenario's set-up (a cost, a date, a recommendation). */
export async function exec(sql: string, replacements: Record<string, unknown>): Promise<void> {
  models()
  await withWrite((t) => getDb().query(sql, { replacements, transaction: t }))
}

/**
 * Noon UTC of the day `days` calendar days before today in the installation's zone (the demo's Europe/London), as
 * ISO text: noon UTC is that same calendar day in London (UTC+0/+1) whatever the hour a test runs, so "booked 70 days
 * ago" is never 69 or 71 local days.
 */
export function noonDaysAgo(days: number, from = new Date()): string {
  const [y, m, d] = new Intl.DateTimeFormat('en-CA', { timeZone: 'Europe/London' }).format(from).split('-').map(Number)
  return new Date(Date.UTC(y!, m! - 1, d! - days, 12)).toISOString()
}

/** A garage of the test's own on account terms (30 payment days, £1,000.00 limit) owing charges booked `daysAgo`. */
export async function owingGarage(label: string, charges: readonly { amountMinor: number; reference: string; daysAgo: number }[]): Promise<TestGarage> {
  const garage = await makeGarage({ terms: 'account', creditLimitMinor: 100_000, label })
  for (const c of charges) {
    await addLedgerEntry(garage.id, { kind: 'order', amountMinor: c.amountMinor, reference: c.reference, at: noonDaysAgo(c.daysAgo) })
  }
  return garage
}
