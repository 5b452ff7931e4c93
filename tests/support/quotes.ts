/**
 * Helpers for the quote tests: a quote started through the API, the owner's link read from the e-mail the
 * server sent, direct reads/writes of the shared test database through the app's models (to move a quote's
 * validity into the past), and requests from another loopback address (for the per-address throttle).
 */
import { randomBytes } from 'node:crypto'
import { request } from 'node:http'
import { getDb, withWrite } from '../../server/utils/db'
import { initModels } from '../../server/models/index'
import { Quote } from '../../server/models/quotes'
import { env, waitForMail, type Client, type Res } from './api'

let bound = false
/** Binds the app's models to the e2e database (the same file the server uses). */
export function quoteDb(): void {
  if (bound) return
  process.env.DATABASE_URL = env().databaseUrl
  initModels(getDb())
  bound = true
}

export const uid = () => randomBytes(4).toString('hex')
export const ownerEmail = () => `owner-${uid()}@owners.test`

/** The demo vehicle used by the quote tests (Veltra Pennon Mk1 1.4, seeded first: id 1). */
export const VEHICLE_ID = 1

export async function startQuote(c: Client, extra: Record<string, unknown> = {}) {
  const email = ownerEmail()
  const r = await c.post('/api/quotes', { vehicleId: VEHICLE_ID, registration: `E2 ${uid().slice(0, 3).toUpperCase()}`, odometer: '52 000 mi', ownerName: 'Robin Tester', ownerEmail: email, ownerPhone: '07700 900 000', ...extra })
  if (r.status !== 201) throw new Error(`POST /api/quotes: ${r.status} ${r.text}`)
  return { quote: r.body, ownerEmail: email }
}

/** Sends the quote as `manager` and returns the token from the e-mail the owner received. */
export async function sendAndReadLink(manager: Client, quoteId: number, to: string, send: { message?: string } = {}): Promise<{ token: string; mail: Awaited<ReturnType<typeof waitForMail>>; body: Res['body'] }> {
  const r = await manager.post(`/api/quotes/${quoteId}/send`, send)
  if (r.status !== 200) throw new Error(`send: ${r.status} ${r.text}`)
  const mail = await waitForMail(to, /Your quote from/)
  const m = /\/q\/([A-Za-z0-9_-]{43})/.exec(mail.text)
  if (!m) throw new Error(`no link in the e-mail: ${mail.text}`)
  return { token: m[1]!, mail, body: r.body }
}

/** Moves a quote's validity into the past, as if its days had run out. */
export async function backdateExpiry(quoteId: number): Promise<void> {
  quoteDb()
  await withWrite((t) => Quote.update({ expiresAt: new Date(Date.now() - 60_000) }, { where: { id: quoteId }, transaction: t }))
}

/** GET from another loopback address (127.0.0.2 reaches the server on 127.0.0.1 on Linux). */
export function getFrom(localAddress: string, path: string): Promise<{ status: number; body: string }> {
  const url = new URL(path, env().baseUrl)
  return new Promise((resolve, reject) => {
    const req = request({ host: url.hostname, port: url.port, path: url.pathname + url.search, method: 'GET', localAddress }, (res) => {
      let body = ''
      res.setEncoding('utf8')
      res.on('data', (d) => { body += d })
      res.on('end', () => resolve({ status: res.statusCode ?? 0, body }))
    })
    req.on('error', reject)
    req.end()
  })
}
