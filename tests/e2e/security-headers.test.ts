/**
 * The headers every answer carries (OWASP ASVS 5.0 V3.4 browser security mechanisms, V14.3 no caching of sensitive
 * data; the OWASP Secure Headers Project): a Content-Security-Policy (on pages with a fresh nonce on every script the
 * server renders, `object-src 'none'`, `base-uri 'none'`, `frame-ancestors 'none'`), nosniff, a Referrer-Policy,
 * `Cache-Control: no-store` on pages and API answers, no X-Powered-By; and over HTTPS, HSTS and the session cookie
 * with the `__Host-` prefix (RFC 6265bis 4.1.3.2: Secure, Path=/, no Domain). The HTTPS case runs a second server of
 * the same build whose public origin is https (on a copy of the test database).
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process'
import { join, resolve } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { as, Client, DEMO_PASSWORD, env, people } from '../support/api'
import { freePort } from '../support/global-setup'
import { sendAndReadLink, startQuote } from '../support/quotes'
import { serverNodeArgs } from '../../scripts/server-process.mjs'
import { onPostgres } from '../support/db'

await setup({ host: env().baseUrl })

function expectCommon(headers: Headers, what: string) {
  expect(headers.get('x-content-type-options'), what).toBe('nosniff')
  expect(headers.get('referrer-policy'), what).toBe('no-referrer')
  expect(headers.get('cache-control'), what).toBe('no-store')
  expect(headers.get('x-powered-by'), what).toBeNull()
  expect(headers.get('content-security-policy') ?? '', what).toContain("frame-ancestors 'none'")
}

/** A page's CSP allows exactly the scripts it carries: every <script> has the nonce the header names. */
function expectPageCsp(headers: Headers, html: string, what: string) {
  const csp = headers.get('content-security-policy')!
  expect(csp, what).toContain("object-src 'none'")
  expect(csp, what).toContain("base-uri 'none'")
  expect(csp, what).toContain("script-src-attr 'none'")
  const nonce = /'nonce-([A-Za-z0-9+/=_-]+)'/.exec(csp)?.[1]
  expect(nonce, what).toBeTruthy()
  const scripts = html.match(/<script\b[^>]*>/g) ?? []
  expect(scripts.length, what).toBeGreaterThan(0)
  for (const tag of scripts) expect(tag, what).toContain(`nonce="${nonce}"`)
  expect(/script-src [^;]*'unsafe-inline'/.test(csp), what).toBe(false)
}

describe('headers', () => {
  it('are on a page, with a new nonce each time', async () => {
    const a = await new Client().get('/sign-in')
    const b = await new Client().get('/sign-in')
    expect(a.status).toBe(200)
    expectCommon(a.headers, 'page')
    expectPageCsp(a.headers, a.text, 'page')
    expect(a.headers.get('x-frame-options')).toBe('DENY')
    expect(a.headers.get('content-security-policy')).not.toBe(b.headers.get('content-security-policy'))
  })

  it('are on a signed-in page and on API answers, with a CSP that allows nothing', async () => {
    const manager = await as(people.manager)
    const page = await manager.get('/quotes')
    expectCommon(page.headers, 'signed-in page')
    expectPageCsp(page.headers, page.text, 'signed-in page')
    for (const [client, path] of [[manager, '/api/me'], [new Client(), '/api/health']] as const) {
      const r = await client.get(path)
      expect(r.status).toBe(200)
      expectCommon(r.headers, path)
      expect(r.headers.get('content-security-policy')).toContain("default-src 'none'")
      expect(r.headers.get('content-security-policy')).toContain("base-uri 'none'")
    }
    // an error answer too (Nitro's error handler sends its own policy, which runs no script either)
    const refused = await new Client().get('/api/me')
    expect(refused.status).toBe(401)
    expectCommon(refused.headers, '401')
    expect(refused.headers.get('content-security-policy')).toMatch(/(default|script)-src 'none'/)
  })

  it('stay the same on API answers after the first, and an unknown API path a browser asks for is a page of its own', async () => {
    // the API answers' route rules are worked out once and shared (server/plugins/02.api-route-rules.ts): the
    // tenth answer carries what the first did, and a page rendered for an API path gets its own nonce
    const first = await new Client().get('/api/health')
    const headersOf = (h: Headers) => [...h.entries()].filter(([k]) => k !== 'date').sort()
    for (let i = 0; i < 9; i++) await new Client().get('/api/health')
    const tenth = await new Client().get('/api/health')
    expect(headersOf(tenth.headers)).toEqual(headersOf(first.headers))
    const asPage = { headers: { accept: 'text/html', 'user-agent': 'Mozilla/5.0' } }
    const a = await new Client().request('/api/no-such-route', asPage)
    const b = await new Client().request('/api/no-such-route', asPage)
    expect(a.status).toBe(404)
    expectPageCsp(a.headers, a.text, 'page for an API path')
    expect(a.headers.get('content-security-policy')).not.toBe(b.headers.get('content-security-policy'))
    const after = await new Client().get('/api/health')
    expect(headersOf(after.headers)).toEqual(headersOf(first.headers))
  })

  it('are on the owner\'s quote page, which renders under its policy', async () => {
    const manager = await as(people.manager)
    const s = await startQuote(manager)
    await manager.post(`/api/quotes/${s.quote.id}/lines`, { kind: 'labour', description: 'Brake check', hours: 0.5 })
    const { token } = await sendAndReadLink(manager, s.quote.id, s.ownerEmail)
    const r = await new Client().get(`/q/${token}`)
    expect(r.status).toBe(200)
    expect(r.text).toContain('Brake check')
    expectCommon(r.headers, 'owner page')
    expectPageCsp(r.headers, r.text, 'owner page')
  })
})

describe('over HTTPS', () => {
  const outDir = process.env.BORELINE_BUILD_DIR ? join(resolve(process.env.BORELINE_BUILD_DIR), '.output') : resolve(import.meta.dirname, '../../.output')
  let server: ChildProcess
  let base = ''

  beforeAll(async () => {
    // SQLite: a copy of the database, so the second server never writes to the first one's file; PostgreSQL
    // takes a second process on the same database
    let databaseUrl = env().databaseUrl
    if (!onPostgres()) {
      const copy = join(env().tmpDir, `https-${Date.now()}.sqlite`)
      const vacuum = spawnSync('sqlite3', [env().dbPath, `VACUUM INTO '${copy}'`], { encoding: 'utf8' })
      if (vacuum.status !== 0) throw new Error(vacuum.stderr)
      databaseUrl = `sqlite:${copy}`
    }
    const port = await freePort()
    base = `http://127.0.0.1:${port}`
    server = spawn(process.execPath, [...serverNodeArgs(), join(outDir, 'server/index.mjs')], {
      env: {
        ...process.env, ...env().scriptEnv, NODE_ENV: 'production', HOST: '127.0.0.1', PORT: String(port), DATABASE_URL: databaseUrl,
        NUXT_PUBLIC_ORIGIN: 'https://boreline.example', NUXT_UPLOADS_DIR: join(env().tmpDir, 'https-uploads'),
        BORELINE_ORDER_SWEEP_SECONDS: '0', BORELINE_SEARCH_INDEX_AT_START: '0', BORELINE_SECURITY_LOG: join(env().tmpDir, 'https-security.log'),
      },
      stdio: 'ignore',
    })
    const until = Date.now() + 60_000
    for (;;) {
      try { if ((await fetch(`${base}/api/health`)).ok) break } catch { /* starting */ }
      if (Date.now() > until) throw new Error('the HTTPS-origin server did not start')
      await new Promise((r) => setTimeout(r, 250))
    }
  }, 90_000)

  afterAll(() => { server?.kill('SIGTERM') })

  it('sends HSTS and names the session cookie __Host-: Secure, Path=/, no Domain', async () => {
    const health = await fetch(`${base}/api/health`)
    expect(health.headers.get('strict-transport-security')).toMatch(/max-age=\d{7,}/)
    const r = await fetch(`${base}/api/auth/sign-in`, {
      method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: people.technician, password: DEMO_PASSWORD }),
    })
    expect(r.status).toBe(200)
    const cookie = r.headers.getSetCookie().find((c) => c.startsWith('__Host-boreline-session='))
    expect(cookie).toBeDefined()
    expect(cookie).toMatch(/; Secure/i)
    expect(cookie).toMatch(/; Path=\//i)
    expect(cookie).not.toMatch(/; Domain=/i)
    // the half-signed state of a two-step sign-in is a __Host- cookie too
    const staff = await fetch(`${base}/api/auth/sign-in`, {
      method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: people.counter2, password: DEMO_PASSWORD }),
    })
    expect(staff.headers.getSetCookie().some((c) => c.startsWith('__Host-boreline-mfa=') && /; Secure/i.test(c))).toBe(true)
  })
})
