/**
 * Helpers for the garage-vehicle tests: unique registrations and VINs with a right check digit, a vehicle added
 * through the API, the vehicle-data fake's control routes, and the reminder job run as `npm run reminders:run`
 * does, against the test database, with a moved clock.
 */
import { execFile } from 'node:child_process'
import { promisify } from 'node:util'
import { randomInt } from 'node:crypto'
import { resolve } from 'node:path'
import { env, type Client } from './api'
import { vinCheckDigit } from '../../shared/utils/vehicles/vin'

const LETTERS = 'ABCDEFGHJKLMNPRSTUVWXYZ' // no I or Q: UK marks and VINs skip them (and O in VINs)
const letter = () => LETTERS[randomInt(LETTERS.length)]!

/** A UK current-format mark not used by the demo: "EV" + two digits + three letters. */
export const newRegistration = (age = '15') => `EV${age}${letter()}${letter()}${letter()}`

/** A European VIN of the demo Kaskel maker (WMI WK3), model-year code F, with its check digit set. */
export function newVin(wmi = 'WK3'): string {
  const serial = String(randomInt(100_000, 999_999))
  const draft = `${wmi}VB2D10F${letter()}${serial}`
  return draft.slice(0, 8) + vinCheckDigit(draft) + draft.slice(9)
}

export async function addVehicle(c: Client, body: Record<string, unknown>) {
  const r = await c.post('/api/garage/vehicles', body)
  if (r.status !== 201) throw new Error(`POST /api/garage/vehicles: ${r.status} ${r.text}`)
  return r.body
}

/** Sets the vehicle-data fake's behaviour: normal, unavailable (503), down (connection dropped) or slow. */
export async function fakeMode(mode: 'normal' | 'unavailable' | 'down' | 'slow', delayMs?: number): Promise<void> {
  const r = await fetch(`${env().vehicleDataUrl}/_fake/mode`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ mode, delayMs }) })
  if (!r.ok) throw new Error(`fake mode: ${r.status}`)
}

export async function fakeRequests(): Promise<{ registration: string | null; status: number }[]> {
  return (await (await fetch(`${env().vehicleDataUrl}/_fake/requests`)).json()).data
}

/**
 * `npm run reminders:run -- --now <at>` against the e2e database and mail catcher. Run without blocking the test's
 * event loop: a blocked loop misses the mail catcher closing an idle keep-alive socket, and the next fetch on that
 * socket fails with "other side closed".
 */
export async function runReminderJob(at: Date): Promise<string> {
  const e = env()
  try {
    const r = await promisify(execFile)('npx', ['tsx', 'scripts/reminders-run.ts', '--now', at.toISOString()], {
      cwd: resolve(import.meta.dirname, '../..'), encoding: 'utf8',
      env: { ...process.env, DATABASE_URL: e.databaseUrl, NUXT_SMTP_HOST: '127.0.0.1', NUXT_SMTP_PORT: String(e.smtpPort), NUXT_PUBLIC_ORIGIN: e.baseUrl },
    })
    return r.stdout
  } catch (err) {
    const f = err as { code?: number; stdout?: string; stderr?: string }
    throw new Error(`reminders:run failed (${f.code}):\n${f.stdout}\n${f.stderr}`)
  }
}
