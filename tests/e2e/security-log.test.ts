/**
 * Security events are written as structured JSON lines (pino) that say who tried what (OWASP ASVS 5.0 V16.3:
 * authentication events, authorisation failures, attempts to bypass controls, changes of credentials and roles),
 * and never hold a password, cookie, token, code or card number (V16.2.5). The server writes them to the file
 * global-setup names (BORELINE_SECURITY_LOG).
 */
import { randomBytes } from 'node:crypto'
import { existsSync, readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { as, Client, env, people } from '../support/api'
import { applicationFields, applicationForm, dbValue, fromAddress, newApprovedGarage, pngBytes, postApplication, sendFrom, sqlText, uniqueEmail } from '../support/accounts'
import { eventOf, postEvent } from '../support/orders'
import { createStaff } from '../support/staff'
import { codeAtStep, stepNow } from '../support/totp'

await setup({ host: env().baseUrl })

interface Line { log: string; level: string; time: string; event: string; [k: string]: unknown }

function lines(): Line[] {
  const file = env().securityLog
  if (!existsSync(file)) return []
  return readFileSync(file, 'utf8').split('\n').filter(Boolean).map((l) => JSON.parse(l) as Line)
}

/** The first line (written asynchronously) for which `match` holds. */
async function logged(match: (l: Line) => boolean, what: string): Promise<Line> {
  const until = Date.now() + 5000
  for (;;) {
    const hit = lines().find(match)
    if (hit) return hit
    if (Date.now() > until) throw new Error(`no security log line: ${what}`)
    await new Promise((r) => setTimeout(r, 100))
  }
}

describe('the security log', () => {
  const secrets: string[] = []

  it('records failed sign-ins with the e-mail and address, never the password', async () => {
    const email = uniqueEmail('log-victim')
    const password = `guess-${randomBytes(6).toString('hex')}`
    secrets.push(password)
    expect((await fromAddress('127.0.3.10', '/api/auth/sign-in', { email, password })).status).toBe(401)
    const line = await logged((l) => l.event === 'sign_in.failed' && l.email === email, 'sign-in failure')
    expect(line).toMatchObject({ log: 'security', level: 'warn', address: '127.0.3.10', reason: 'unknown e-mail' })
    expect(new Date(line.time).getTime()).toBeGreaterThan(Date.now() - 60_000)
  })

  it('records refusals: 403 for a role, 404 on another garage\'s record (with who asked), never the link token', async () => {
    const tech = await as(people.technician)
    expect((await tech.get('/api/staff')).status).toBe(403)
    const techId = dbValue<number>(`SELECT id FROM users WHERE email = ${sqlText(people.technician)}`)
    await logged((l) => l.event === 'access.forbidden' && l.userId === techId && l.path === '/api/staff', '403')

    const other = await as(people.otherManager)
    const millbrookQuote = dbValue<number>(`SELECT q.id FROM quotes q JOIN users u ON u.organisation_id = q.organisation_id WHERE u.email = ${sqlText(people.manager)} LIMIT 1`)
    expect((await other.get(`/api/quotes/${millbrookQuote}`)).status).toBe(404)
    const otherId = dbValue<number>(`SELECT id FROM users WHERE email = ${sqlText(people.otherManager)}`)
    await logged((l) => l.event === 'access.not_found' && l.userId === otherId && l.path === `/api/quotes/${millbrookQuote}`, '404')

    const token = randomBytes(32).toString('base64url')
    secrets.push(token)
    // from an address of its own: a link that is not valid counts against its address
    expect((await sendFrom('127.0.3.11', `/api/quote-links/${token}`, Buffer.alloc(0), { cookie: other.cookieHeader() }, 'GET')).status).toBe(404)
    await logged((l) => l.event === 'access.not_found' && l.path === '/api/quote-links/:token', 'masked link')
    secrets.push(...[...other.cookies.values(), ...tech.cookies.values()])
  })

  it('records rejected uploads and a webhook whose signature does not verify', async () => {
    const f = applicationFields()
    expect((await postApplication(new Client(), applicationForm(f, [{ name: 'scan.pdf', bytes: pngBytes(), type: 'application/pdf' }]))).status).toBe(415)
    await logged((l) => l.event === 'upload.refused' && l.status === 415 && l.path === '/api/trade-applications', 'upload')
    expect((await postEvent(eventOf('checkout.session.completed', { id: 'cs_log', object: 'checkout.session' }), { signature: 'invalid' })).status).toBe(400)
    await logged((l) => l.event === 'webhook.bad_signature', 'webhook')
  })

  it('records second-factor failures, password and role changes', async () => {
    const s = await createStaff('counter_staff')
    const c = new Client()
    await c.post('/api/auth/sign-in', { email: s.email, password: s.password })
    const wrong = codeAtStep(s.secret!, stepNow() - 9)
    expect((await c.post('/api/auth/mfa', { code: wrong })).status).toBe(401)
    const staffId = dbValue<number>(`SELECT id FROM users WHERE email = ${sqlText(s.email)}`)
    await logged((l) => l.event === 'mfa.failed' && l.userId === staffId && l.reason === 'wrong', 'mfa failure')
    secrets.push(s.password, s.secret!)

    const { fields, manager } = await newApprovedGarage(await as(people.admin))
    expect((await manager.post('/api/account/password', { currentPassword: fields.password, newPassword: 'another-long-password' })).status).toBe(200)
    const managerId = dbValue<number>(`SELECT id FROM users WHERE email = ${sqlText(fields.email)}`)
    await logged((l) => l.event === 'password.changed' && l.userId === managerId, 'password change')
    secrets.push(fields.password, 'another-long-password', ...manager.cookies.values())

    const invited = await manager.post('/api/staff', { email: uniqueEmail('log-tech'), name: 'Lee Caliper', role: 'garage_technician' })
    expect((await manager.patch(`/api/staff/${invited.body.id}`, { role: 'garage_manager' })).status).toBe(200)
    await logged((l) => l.event === 'role.changed' && l.targetUserId === invited.body.id && l.reason === 'garage_technician to garage_manager', 'role change')
  })

  it('holds none of the passwords, cookies, tokens or secrets those requests carried', async () => {
    const text = readFileSync(env().securityLog, 'utf8')
    expect(secrets.length).toBeGreaterThan(8)
    for (const s of secrets) expect(text.includes(s), `log holds ${s.slice(0, 6)}…`).toBe(false)
    expect(text).not.toMatch(/4242\s?4242\s?4242\s?4242/)
    for (const l of lines()) expect(Object.keys(l)).not.toEqual(expect.arrayContaining(['password']))
  })
})
