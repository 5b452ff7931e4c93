/**
 * A small HTTP client for e2e tests with its own cookie jar: one `Client` is one browser-like caller.
 * `signIn(email)` uses the demo password and, for people with two-step sign-in (the distributor's staff), gives the
 * code computed from their secret (tests/support/totp.ts), setting up an app first when the server asks for one.
 * `as(email)` for such people reuses one session per person for the whole run: each code works once, so signing
 * them in afresh for every test would wait 30 seconds a time. Responses are not thrown on 4xx/5xx: tests assert the
 * status.
 */
import { existsSync, readFileSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { inject } from 'vitest'
import { freshCode, rememberSecret, secretOf, withRunLock } from './totp'

export const DEMO_PASSWORD = 'brake-demo-2026'

export const people = {
  admin: 'rowan.pike@kestrel-friction.test',
  counter: 'ines.okafor@kestrel-friction.test',
  counter2: 'dev.sandhu@kestrel-friction.test',
  manager: 'hattie.corran@millbrook-motors.test', // Millbrook: Silver tier, account terms
  technician: 'sol.brennan@millbrook-motors.test',
  otherManager: 'marek.dowling@tannery-yard.test', // Tannery Yard: Bronze tier, card only
  otherTechnician: 'ada.finch@tannery-yard.test',
  pendingManager: 'lena.voss@ashcombe-carcare.test',
  rejectedManager: 'colm.ruddy@fernside-repairs.test',
} as const

export function env() {
  return inject('boreline')
}

export interface Res<T = any> { status: number; body: T; headers: Headers; text: string }

export class Client {
  cookies = new Map<string, string>()
  constructor(public base = env().baseUrl) {}

  cookieHeader(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ')
  }

  async request<T = any>(path: string, init: RequestInit & { json?: unknown } = {}): Promise<Res<T>> {
    const headers = new Headers(init.headers)
    if (this.cookies.size) headers.set('cookie', this.cookieHeader())
    let body = init.body
    if (init.json !== undefined) {
      headers.set('content-type', 'application/json')
      body = JSON.stringify(init.json)
    }
    const res = await fetch(new URL(path, this.base), { ...init, headers, body, redirect: 'manual' })
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';')
      const i = pair!.indexOf('=')
      const name = pair!.slice(0, i).trim()
      const value = pair!.slice(i + 1).trim()
      if (value === '' || /max-age=0/i.test(c) || /expires=Thu, 01 Jan 1970/i.test(c)) this.cookies.delete(name)
      else this.cookies.set(name, value)
    }
    const text = await res.text()
    let parsed: any = text
    try { parsed = text ? JSON.parse(text) : null } catch { /* not JSON */ }
    return { status: res.status, body: parsed, headers: res.headers, text }
  }

  get<T = any>(path: string) { return this.request<T>(path) }
  post<T = any>(path: string, json?: unknown) { return this.request<T>(path, { method: 'POST', json: json ?? {} }) }
  patch<T = any>(path: string, json?: unknown) { return this.request<T>(path, { method: 'PATCH', json: json ?? {} }) }
  del<T = any>(path: string) { return this.request<T>(path, { method: 'DELETE' }) }

  async signIn(email: string, password = DEMO_PASSWORD): Promise<Res> {
    const r = await this.post('/api/auth/sign-in', { email, password })
    if (r.status !== 200) throw new Error(`sign-in as ${email} failed: ${r.status} ${r.text}`)
    return r.body?.mfaRequired ? this.secondStep(email, r.body.enrolment?.secret) : r
  }

  /** The code step of a sign-in: a fresh code from the person's secret (a newly offered one is set up and remembered). */
  async secondStep(email: string, offeredSecret?: string): Promise<Res> {
    if (offeredSecret) rememberSecret(email, offeredSecret)
    for (let attempt = 0; ; attempt++) {
      const r = await this.post('/api/auth/mfa', { code: await freshCode(email, offeredSecret ?? secretOf(email)) })
      if (r.status === 200) return r
      // a step used outside this run's record (by a test of its own): the next one will do
      if (attempt >= 2 || r.status !== 401 || !r.body?.data?.fields?.code) throw new Error(`second step as ${email} failed: ${r.status} ${r.text}`)
    }
  }
}

/**
 * A signed-in client. People with two-step sign-in share one session per person for the run (kept in a file of the
 * run, checked before use, signed in again when it has ended); everyone else signs in afresh.
 */
export async function as(email: string): Promise<Client> {
  const c = new Client()
  if (!secretOf(email)) {
    await c.signIn(email)
    return c
  }
  const file = join(env().tmpDir, `session-${email.toLowerCase()}.json`)
  return withRunLock(`session-${email.toLowerCase()}`, async () => {
    if (existsSync(file)) {
      for (const [k, v] of JSON.parse(readFileSync(file, 'utf8')) as [string, string][]) c.cookies.set(k, v)
      if ((await c.get('/api/me')).status === 200) return c
      c.cookies.clear()
    }
    await c.signIn(email)
    writeFileSync(file, JSON.stringify([...c.cookies]))
    return c
  })
}

/** Messages the mail catcher holds for one recipient. */
export async function mailFor(to: string): Promise<{ subject: string; text: string; html: string; to: string[]; attachments: { filename: string; contentBase64: string }[] }[]> {
  const r = await fetch(`${env().mailUrl}/messages?to=${encodeURIComponent(to.toLowerCase())}`)
  return r.json()
}

/** Polls the mail catcher until a message for `to` whose subject matches arrives. */
export async function waitForMail(to: string, subject: RegExp, timeoutMs = 10_000) {
  const until = Date.now() + timeoutMs
  while (Date.now() < until) {
    const m = (await mailFor(to)).filter((x) => subject.test(x.subject))
    if (m.length) return m[m.length - 1]!
    await new Promise((r) => setTimeout(r, 150))
  }
  throw new Error(`no e-mail to ${to} matching ${subject}`)
}
