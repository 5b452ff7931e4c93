/**
 * Two-step sign-in (OWASP ASVS 5.0 V6.5/6.6; RFC 6238 TOTP): distributor staff give a code after the password, and
 * set up an authenticator app at their first sign-in; garage managers may turn it on; a code works once (RFC 6238
 * section 5.2), one step of clock drift either side; wrong codes are counted; recovery codes are single-use and kept
 * hashed; the admin can reset a colleague's factor. Codes are computed by the tests from the secret
 * (tests/support/totp.ts, checked against RFC 6238's vectors in tests/unit/accounts/totp.test.ts). Every person
 * signing in here is made for the test (npm run user:create), never a demo person.
 */
import { describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { as, Client, env, people, waitForMail } from '../support/api'
import { dbRows, dbValue, linkToken, newApprovedGarage, sqlText, uniqueEmail } from '../support/accounts'
import { createStaff } from '../support/staff'
import { codeAtStep, stepNow } from '../support/totp'

await setup({ host: env().baseUrl })

const userId = (email: string) => dbValue<number>(`SELECT id FROM users WHERE email = ${sqlText(email)}`)

/** The password step only: returns the client holding the half-signed cookie and the answer. */
async function passwordStep(email: string, password: string) {
  const c = new Client()
  const r = await c.post('/api/auth/sign-in', { email, password })
  expect(r.status, r.text).toBe(200)
  return { c, body: r.body }
}

describe('signing in with two steps', () => {
  it('asks distributor staff for a code after the password, with no session until it is given', async () => {
    const s = await createStaff('counter_staff')
    const { c, body } = await passwordStep(s.email, s.password)
    expect(body).toEqual({ mfaRequired: true })
    expect((await c.get('/api/me')).status).toBe(401)
    expect([...c.cookies.keys()]).toEqual(['boreline-mfa'])
    const step = stepNow()
    const done = await c.post('/api/auth/mfa', { code: codeAtStep(s.secret!, step) })
    expect(done.status, done.text).toBe(200)
    expect(done.body.user).toMatchObject({ role: 'counter_staff' })
    expect(done.body).not.toHaveProperty('recoveryCodes')
    expect((await c.get('/api/me')).status).toBe(200)
    expect(c.cookies.has('boreline-mfa')).toBe(false)
  })

  it('refuses a replayed code, even in a new sign-in, and takes the next step\'s code (one step of drift)', async () => {
    const s = await createStaff('counter_staff')
    const step = stepNow()
    const code = codeAtStep(s.secret!, step)
    const first = await passwordStep(s.email, s.password)
    expect((await first.c.post('/api/auth/mfa', { code })).status).toBe(200)
    const second = await passwordStep(s.email, s.password)
    const replay = await second.c.post('/api/auth/mfa', { code })
    expect(replay.status).toBe(401)
    expect(replay.body.data.fields.code).toMatch(/already been used/)
    expect((await second.c.get('/api/me')).status).toBe(401)
    expect((await second.c.post('/api/auth/mfa', { code: codeAtStep(s.secret!, step + 1) })).status).toBe(200)
  })

  it('refuses a code two steps away, ends a half-signed sign-in after 5 tries, and throttles a person after 10 wrong codes', async () => {
    const s = await createStaff('counter_staff')
    const wrong = () => codeAtStep(s.secret!, stepNow() - 7)
    const a = await passwordStep(s.email, s.password)
    expect((await a.c.post('/api/auth/mfa', { code: codeAtStep(s.secret!, stepNow() + 2) })).status).toBe(401)
    for (let i = 0; i < 4; i++) expect((await a.c.post('/api/auth/mfa', { code: wrong() })).body.data.fields).toHaveProperty('code')
    const spent = await a.c.post('/api/auth/mfa', { code: codeAtStep(s.secret!, stepNow()) })
    expect(spent.status).toBe(401)
    expect(spent.body.message).toMatch(/sign in again/)
    const b = await passwordStep(s.email, s.password)
    for (let i = 0; i < 5; i++) expect((await b.c.post('/api/auth/mfa', { code: wrong() })).status).toBe(401)
    const c = await passwordStep(s.email, s.password)
    const throttled = await c.c.post('/api/auth/mfa', { code: codeAtStep(s.secret!, stepNow()) })
    expect(throttled.status).toBe(429)
    expect(Number(throttled.headers.get('retry-after'))).toBeGreaterThan(0)
  })

  it('answers 401 to the code step without a half-signed sign-in', async () => {
    expect((await new Client().post('/api/auth/mfa', { code: '123456' })).status).toBe(401)
    expect((await new Client().post('/api/auth/mfa', { code: '1' })).status).toBe(422)
  })
})

describe('setting up an app and recovery codes', () => {
  it('has staff without an app set one up at first sign-in; ten recovery codes come once; each works once', async () => {
    const s = await createStaff('counter_staff', { secret: null })
    const { c, body } = await passwordStep(s.email, s.password)
    expect(body.mfaRequired).toBe(true)
    const { secret, otpauthUri, qrCode, account } = body.enrolment
    expect(secret).toMatch(/^[A-Z2-7]{32}$/)
    expect(account).toBe(s.email)
    expect(new URL(otpauthUri).searchParams.get('secret')).toBe(secret)
    expect(qrCode).toMatch(/^data:image\/png;base64,/)
    expect((await c.post('/api/auth/mfa', { code: codeAtStep(secret, stepNow() - 5) })).body.data.fields).toHaveProperty('code')
    const done = await c.post('/api/auth/mfa', { code: codeAtStep(secret, stepNow()) })
    expect(done.status, done.text).toBe(200)
    const codes: string[] = done.body.recoveryCodes
    expect(codes).toHaveLength(10)
    expect(new Set(codes).size).toBe(10)
    for (const code of codes) expect(code).toMatch(/^[a-z2-9]{4}-[a-z2-9]{4}-[a-z2-9]{4}-[a-z2-9]{4}$/)

    // stored: the secret sealed, the codes as salted hashes only
    const id = userId(s.email)
    const stored = dbRows<{ secret: string }>(`SELECT secret FROM second_factors WHERE user_id = ${id}`)[0]!
    expect(stored.secret.startsWith('v1.')).toBe(true)
    expect(stored.secret).not.toContain(secret)
    const rows = JSON.stringify(dbRows(`SELECT * FROM recovery_codes WHERE user_id = ${id}`))
    expect(dbValue(`SELECT COUNT(*) FROM recovery_codes WHERE user_id = ${id}`)).toBe(10)
    for (const code of codes) expect(rows).not.toContain(code.replace(/-/g, ''))

    // a recovery code instead of the app, once
    const next = await passwordStep(s.email, s.password)
    expect(next.body).toEqual({ mfaRequired: true })
    expect((await next.c.post('/api/auth/mfa', { code: codes[3]!.toUpperCase() })).status).toBe(200)
    const again = await passwordStep(s.email, s.password)
    const reused = await again.c.post('/api/auth/mfa', { code: codes[3] })
    expect(reused.status).toBe(401)
    expect((await again.c.post('/api/auth/mfa', { code: codes[4] })).status).toBe(200)
    expect((await again.c.get('/api/account/mfa')).body).toMatchObject({ required: true, enrolled: true, recoveryCodesLeft: 8 })
  })

  it('lets a garage manager turn it on and off with current codes; technicians may not', async () => {
    const { fields, manager } = await newApprovedGarage(await as(people.admin))
    expect((await manager.get('/api/account/mfa')).body).toEqual({ allowed: true, required: false, enrolled: false, enrolledAt: null, recoveryCodesLeft: 0 })
    const enrolment = await manager.post('/api/account/mfa/enrolment', {})
    expect(enrolment.status).toBe(200)
    const secret = enrolment.body.secret as string
    expect((await manager.post('/api/account/mfa/enrolment/confirm', { code: codeAtStep(secret, stepNow() - 4) })).body.data.fields).toHaveProperty('code')
    const step = stepNow()
    const confirmed = await manager.post('/api/account/mfa/enrolment/confirm', { code: codeAtStep(secret, step) })
    expect(confirmed.body.recoveryCodes).toHaveLength(10)
    await waitForMail(fields.email, /two-step sign-in changed/)

    const next = await passwordStep(fields.email, fields.password)
    expect(next.body).toEqual({ mfaRequired: true })
    expect((await next.c.post('/api/auth/mfa', { code: codeAtStep(secret, step + 1) })).status).toBe(200)
    expect((await manager.post('/api/account/mfa/off', { code: codeAtStep(secret, step + 1) })).status).toBe(422) // used already
    const off = await manager.post('/api/account/mfa/off', { code: confirmed.body.recoveryCodes[0] })
    expect(off.status, off.text).toBe(200)
    expect(off.body.enrolled).toBe(false)
    expect((await passwordStep(fields.email, fields.password)).body.user).toBeDefined()

    const tech = await as(people.technician)
    expect((await tech.post('/api/account/mfa/enrolment', {})).status).toBe(403)
    expect((await tech.get('/api/account/mfa')).body).toMatchObject({ allowed: false, enrolled: false })
  })

  it('keeps distributor staff on two steps: turning it off is refused', async () => {
    const s = await createStaff('counter_staff')
    const c = new Client()
    await c.signIn(s.email, s.password)
    const r = await c.post('/api/account/mfa/off', { code: codeAtStep(s.secret!, stepNow()) })
    expect(r.status).toBe(409)
  })
})

describe('resetting a colleague\'s second factor', () => {
  it('lets the admin reset counter staff: sessions end, audited, e-mailed, and an app is set up again at next sign-in', async () => {
    const s = await createStaff('counter_staff')
    const colleague = new Client()
    await colleague.signIn(s.email, s.password)
    const id = userId(s.email)
    const admin = await as(people.admin)
    const listed = (await admin.get('/api/staff?pageSize=100')).body.data.find((p: { id: number }) => p.id === id)
    expect(listed).toMatchObject({ secondFactor: true, manageable: true })

    expect((await (await as(people.counter)).post(`/api/staff/${id}/mfa-reset`)).status).toBe(403)
    expect((await (await as(people.manager)).post(`/api/staff/${id}/mfa-reset`)).status).toBe(404)
    const r = await admin.post(`/api/staff/${id}/mfa-reset`)
    expect(r.status, r.text).toBe(200)
    expect((await colleague.get('/api/me')).status).toBe(401)
    expect(dbValue(`SELECT COUNT(*) FROM second_factors WHERE user_id = ${id}`)).toBe(0)
    expect(dbValue(`SELECT COUNT(*) FROM audit_log WHERE action = 'user.mfa_reset' AND entity_id = '${id}'`)).toBe(1)
    await waitForMail(s.email, /your two-step sign-in was reset/)
    expect((await admin.post(`/api/staff/${id}/mfa-reset`)).status).toBe(409)
    expect((await passwordStep(s.email, s.password)).body.enrolment).toBeDefined()

    const adminId = userId(people.admin)
    expect((await admin.post(`/api/staff/${adminId}/mfa-reset`)).status).toBe(409)
    expect((await admin.post(`/api/staff/${userId(people.technician)}/mfa-reset`)).status).toBe(404)
  })

  it('sets staff up with a given secret from the command line (npm run user:create -- --totp-secret)', async () => {
    const s = await createStaff('distributor_admin')
    expect(dbValue(`SELECT COUNT(*) FROM second_factors WHERE user_id = ${userId(s.email)} AND secret IS NOT NULL`)).toBe(1)
    const { c, body } = await passwordStep(s.email, s.password)
    expect(body).toEqual({ mfaRequired: true })
    expect((await c.post('/api/auth/mfa', { code: codeAtStep(s.secret!, stepNow()) })).body.user.role).toBe('distributor_admin')
  })

  it('lets an invited counter colleague accept, then set up an app at first sign-in', async () => {
    const admin = await as(people.admin)
    const email = uniqueEmail('counter-invite')
    expect((await admin.post('/api/staff', { email, name: 'Reese Bracket', role: 'counter_staff' })).status).toBe(201)
    const token = await linkToken(email, /invited you to/, 'invite')
    expect((await new Client().post('/api/auth/invitations/accept', { token, password: 'reeses-own-long-password' })).status).toBe(200)
    const first = await passwordStep(email, 'reeses-own-long-password')
    expect(first.body.enrolment.secret).toMatch(/^[A-Z2-7]{32}$/)
  })
})
