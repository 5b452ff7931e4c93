/**
 * Helpers for the trade-account tests: fresh garages (never the demo ones), sample documents, read-only
 * looks into the e2e database and uploads folder, and requests from another loopback address.
 *
 * Failed sign-ins are throttled per client address. Every test talks to the server from 127.0.0.1, so a test
 * that fails sign-ins on purpose must do it from an address of its own (`fromAddress`), or the other
 * test files would be locked out for 15 minutes.
 */
import { existsSync, readdirSync, statSync } from 'node:fs'
import { request as httpRequest } from 'node:http'
import { join } from 'node:path'
import { Client, env, waitForMail, type Res } from './api'
import { dbRowsSync } from './db'

let counter = 0
/** A name nobody else uses in this run. */
export function unique(prefix: string): string {
  counter++
  return `${prefix}-${Date.now().toString(36)}-${counter}-${Math.random().toString(36).slice(2, 6)}`
}

export function uniqueEmail(prefix = 'garage'): string {
  return `${unique(prefix)}@accounts-test.test`.toLowerCase()
}

// ------------------------------------------------------------------ sample documents

/** A small but well-formed PDF (file-type recognises it by its `%PDF-` header). */
export function pdfBytes(): Buffer {
  return Buffer.from('%PDF-1.4\n1 0 obj\n<< /Type /Catalog >>\nendobj\ntrailer\n<< /Root 1 0 R >>\n%%EOF\n', 'latin1')
}
/** A 1 x 1 pixel PNG. */
export function pngBytes(): Buffer {
  return Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==', 'base64')
}
/** The start of a JPEG/JFIF file, enough for type detection. */
export function jpegBytes(): Buffer {
  return Buffer.concat([Buffer.from([0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10]), Buffer.from('JFIF\0', 'latin1'), Buffer.alloc(64, 0), Buffer.from([0xff, 0xd9])])
}

export interface ApplicationFields {
  businessName: string
  tradingAddress: string
  taxNumber: string
  contactName: string
  phone: string
  email: string
  password: string
}

export function applicationFields(overrides: Partial<ApplicationFields> = {}): ApplicationFields {
  const name = unique('Garage')
  return {
    businessName: `${name} Brake & Clutch`,
    tradingAddress: '7 Example Row, Testborough TB1 2AA',
    taxNumber: 'GB 123 4567 89',
    contactName: 'Robin Tester',
    phone: '0161 555 0199',
    email: uniqueEmail('applicant'),
    password: 'long-enough-password',
    ...overrides,
  }
}

export interface UploadFile { name: string; bytes: Buffer; type?: string }

export function applicationForm(fields: Partial<ApplicationFields> | Record<string, string>, files: UploadFile[] = [{ name: 'registration.pdf', bytes: pdfBytes(), type: 'application/pdf' }]): FormData {
  const form = new FormData()
  for (const [k, v] of Object.entries(fields)) if (v !== undefined) form.append(k, v)
  for (const f of files) form.append('proof', new Blob([new Uint8Array(f.bytes)], { type: f.type ?? 'application/octet-stream' }), f.name)
  return form
}

/**
 * POST /api/trade-applications as multipart, sent from a loopback address of its own (127.77.x.y, chosen at random)
 * unless `from` names one: applications are limited per address (10 an hour), and the suite sends many more than a
 * garage ever would. Answers like `Client.request`.
 */
export async function postApplication(_client: Client, form: FormData, from = randomLoopback()): Promise<Res> {
  const encoded = new Request('http://localhost/', { method: 'POST', body: form })
  const body = Buffer.from(await encoded.arrayBuffer())
  return sendFrom(from, '/api/trade-applications', body, { 'content-type': encoded.headers.get('content-type')! })
}

/** A loopback address of its own for one request (127.77.0.0/16: the throttle tests use 127.0.0.x). */
export function randomLoopback(): string {
  return `127.77.${Math.floor(Math.random() * 256)}.${1 + Math.floor(Math.random() * 254)}`
}

/** A request with a body from a chosen loopback address, answered like `Client.request`. */
export function sendFrom(localAddress: string, path: string, body: Buffer, headers: Record<string, string>, method = 'POST'): Promise<Res> {
  const url = new URL(path, env().baseUrl)
  return new Promise((resolve, reject) => {
    const req = httpRequest({
      host: url.hostname, port: url.port, path: url.pathname, method, localAddress, agent: false,
      headers: { ...headers, 'content-length': body.length },
    }, (res) => {
      const chunks: Buffer[] = []
      res.on('data', (c: Buffer) => chunks.push(c))
      res.on('end', () => {
        const text = Buffer.concat(chunks).toString('utf8')
        let parsed: any = text
        try { parsed = text ? JSON.parse(text) : null } catch { /* not JSON */ }
        const h = new Headers()
        for (const [k, v] of Object.entries(res.headers)) if (v !== undefined) h.set(k, Array.isArray(v) ? v.join(', ') : v)
        resolve({ status: res.statusCode ?? 0, body: parsed, headers: h, text })
      })
    })
    req.on('error', reject)
    req.end(body)
  })
}

/** The garage (organisation id) whose manager signs in with this e-mail. */
export function garageIdOf(email: string): number {
  return dbValue<number>(`SELECT organisation_id FROM users WHERE email = ${sqlText(email.toLowerCase())}`)
}

/** A fresh application; returns its organisation id and the applicant's sign-in. */
export async function applyAsNewGarage(overrides: Partial<ApplicationFields> = {}): Promise<{ id: number; fields: ApplicationFields }> {
  const fields = applicationFields(overrides)
  const res = await postApplication(new Client(), applicationForm(fields))
  if (res.status !== 201) throw new Error(`application failed: ${res.status} ${res.text}`)
  return { id: garageIdOf(fields.email), fields }
}

/** A fresh garage approved by the admin (card terms on the cheapest tier, the first branch as home, unless told otherwise). */
export async function newApprovedGarage(admin: Client, decision: Record<string, unknown> = {}): Promise<{ id: number; fields: ApplicationFields; manager: Client }> {
  const { id, fields } = await applyAsNewGarage()
  const tierId = decision.tierId ?? (await admin.get('/api/admin/tiers')).body.data[0].id
  const homeBranchId = decision.homeBranchId ?? (await admin.get('/api/branches')).body[0].id
  const r = await admin.post(`/api/admin/trade-applications/${id}/decision`, { decision: 'approve', terms: 'card', tierId, homeBranchId, ...decision })
  if (r.status !== 200) throw new Error(`approval failed: ${r.status} ${r.text}`)
  const manager = new Client()
  await manager.signIn(fields.email, fields.password)
  return { id, fields, manager }
}

/** The token in the last link of this kind that was e-mailed to `to`. */
export async function linkToken(to: string, subject: RegExp, path: 'reset' | 'invite'): Promise<string> {
  const mail = await waitForMail(to, subject)
  const m = new RegExp(`/${path}/([A-Za-z0-9_-]+)`).exec(mail.text)
  if (!m) throw new Error(`no /${path}/ link in the e-mail to ${to}:\n${mail.text}`)
  return m[1]!
}

// ------------------------------------------------------------------ looking at what was stored

/** Rows from the e2e database, read with its command-line client (SQLite or PostgreSQL). */
export function dbRows<T = Record<string, unknown>>(sql: string): T[] {
  return dbRowsSync<T>(sql)
}

export function dbValue<T = unknown>(sql: string): T {
  const row = dbRows(sql)[0]
  return (row ? Object.values(row)[0] : undefined) as T
}

export function sqlText(s: string): string {
  return `'${s.replace(/'/g, "''")}'`
}

/** Every file under a folder (relative paths), for "nothing was left behind" checks. */
export function filesUnder(dir: string): string[] {
  if (!existsSync(dir)) return []
  const out: string[] = []
  const walk = (d: string, rel: string) => {
    for (const name of readdirSync(d)) {
      const p = join(d, name)
      if (statSync(p).isDirectory()) walk(p, join(rel, name))
      else out.push(join(rel, name))
    }
  }
  walk(dir, '')
  return out.sort()
}

// ------------------------------------------------------------------ another client address

/**
 * A JSON request sent from a loopback address of the test's choosing (127.0.0.x all reach the server),
 * with any headers, e.g. a forged `X-Forwarded-For`. The server sees `localAddress` as the client.
 */
export function fromAddress(localAddress: string, path: string, body: unknown, headers: Record<string, string> = {}): Promise<{ status: number; headers: Record<string, string | string[] | undefined>; body: any }> {
  const url = new URL(path, env().baseUrl)
  const payload = JSON.stringify(body)
  return new Promise((resolve, reject) => {
    const req = httpRequest({
      host: url.hostname, port: url.port, path: url.pathname, method: 'POST', localAddress, agent: false,
      headers: { 'content-type': 'application/json', 'content-length': Buffer.byteLength(payload), ...headers },
    }, (res) => {
      let text = ''
      res.setEncoding('utf8')
      res.on('data', (c) => { text += c })
      res.on('end', () => {
        let parsed: unknown = text
        try { parsed = JSON.parse(text) } catch { /* not JSON */ }
        resolve({ status: res.statusCode ?? 0, headers: res.headers, body: parsed })
      })
    })
    req.on('error', reject)
    req.end(payload)
  })
}
