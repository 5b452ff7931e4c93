/**
 * Sessions, passwords, people: a replayed cookie after sign-out, a new session id at every sign-in,
 * suspension felt on the next request, mass assignment refused, password reset by a single-use link that
 * ends other sessions, and staff invited, re-roled and removed (only within one's own organisation).
 * Every person changed here is created by the test; the demo people are only read.
 */
import { createHash } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { Client, as, env, people, waitForMail } from '../support/api'
import { dbRows, dbValue, linkToken, newApprovedGarage, sqlText, uniqueEmail } from '../support/accounts'

await setup({ host: env().baseUrl })

let admin: Client
beforeAll(async () => { admin = await as(people.admin) })

/** A client that replays a captured cookie header. */
function replaying(cookie: string): Client {
  const c = new Client()
  for (const part of cookie.split('; ')) {
    const i = part.indexOf('=')
    c.cookies.set(part.slice(0, i), part.slice(i + 1))
  }
  return c
}

describe('sessions', () => {
  it('refuses a cookie captured before sign-out (401)', async () => {
    const c = await as(people.technician)
    const captured = c.cookieHeader()
    expect((await c.get('/api/me')).status).toBe(200)
    expect((await c.post('/api/auth/sign-out')).status).toBe(200)
    const replay = replaying(captured)
    expect((await replay.get('/api/me')).status).toBe(401)
    expect((await replay.get('/api/account')).status).toBe(401)
    expect((await replay.get('/api/_auth/session')).body.user).toBeUndefined()
  })

  it('refuses a cookie captured before the module\'s own DELETE /api/_auth/session', async () => {
    const c = await as(people.technician)
    const captured = c.cookieHeader()
    expect((await c.del('/api/_auth/session')).status).toBe(200)
    expect((await replaying(captured).get('/api/me')).status).toBe(401)
  })

  it('gives a new session id at every sign-in and ends the one the browser had', async () => {
    const c = await as(people.technician)
    const first = (await c.get('/api/_auth/session')).body.sid as string
    const firstCookie = c.cookieHeader()
    await c.signIn(people.technician)
    const second = (await c.get('/api/_auth/session')).body.sid as string
    expect(first).toMatch(/^[A-Za-z0-9_-]{40,}$/)
    expect(second).toMatch(/^[A-Za-z0-9_-]{40,}$/)
    expect(second).not.toBe(first)
    expect((await replaying(firstCookie).get('/api/me')).status).toBe(401)
    expect((await c.get('/api/me')).status).toBe(200)
    const rows = dbRows<{ id: string; revoked_at: string | null }>(`SELECT id, revoked_at FROM sessions WHERE id IN (${sqlText(first)}, ${sqlText(second)})`)
    expect(rows.find((r) => r.id === first)!.revoked_at).not.toBeNull()
    expect(rows.find((r) => r.id === second)!.revoked_at).toBeNull()
    // the cookie carries a small summary only (far under 4 KB)
    expect(c.cookieHeader().length).toBeLessThan(1500)
  })

  it('refuses a suspended garage\'s manager on the next request (403), without a new sign-in', async () => {
    const { id, manager } = await newApprovedGarage(admin)
    // twice: the second answer comes from the session check's memory, which the suspension must drop
    expect((await manager.get('/api/staff')).status).toBe(200)
    expect((await manager.get('/api/staff')).status).toBe(200)
    expect((await admin.post(`/api/admin/trade-accounts/${id}/suspend`, { reason: 'Paused while we check the account.' })).status).toBe(200)
    expect((await manager.get('/api/staff')).status).toBe(403)
    expect((await manager.post('/api/staff', { email: uniqueEmail('x'), name: 'Nobody New', role: 'garage_technician' })).status).toBe(403)
  })
})

describe('visitors', () => {
  it('are not handed a session cookie by merely asking (nothing minted, sealed or stored for them)', async () => {
    const r = await new Client().get('/api/vehicles/facets')
    expect(r.status).toBe(401)
    expect(r.headers.getSetCookie()).toEqual([])
  })
})

describe('profile', () => {
  it('lets a person change their own name and phone', async () => {
    const { fields, manager } = await newApprovedGarage(admin)
    const r = await manager.patch('/api/account/profile', { name: 'Robin Q. Tester', phone: '0161 555 0123' })
    expect(r.status).toBe(200)
    expect(r.body).toMatchObject({ name: 'Robin Q. Tester', phone: '0161 555 0123', email: fields.email })
    expect((await manager.get('/api/me')).body.user.name).toBe('Robin Q. Tester')
    expect((await manager.patch('/api/account/profile', { phone: 'call me maybe' })).body.data.fields).toHaveProperty('phone')
  })

  it('rejects mass assignment (role, status, creditLimitMinor…) with 422 and changes nothing', async () => {
    const { id, fields, manager } = await newApprovedGarage(admin)
    const before = dbRows(`SELECT u.name, u.role, u.status, u.organisation_id, o.status AS org_status, o.credit_limit_minor, o.payment_terms FROM users u JOIN organisations o ON o.id = u.organisation_id WHERE u.email = ${sqlText(fields.email)}`)
    const r = await manager.patch('/api/account/profile', {
      name: 'Sneaky Rename', role: 'distributor_admin', status: 'approved', creditLimitMinor: 99_999_999, organisationId: 1,
    })
    expect(r.status).toBe(422)
    expect(Object.keys(r.body.data.fields).sort()).toEqual(['creditLimitMinor', 'organisationId', 'role', 'status'])
    for (const alone of [{ role: 'distributor_admin' }, { status: 'approved' }, { creditLimitMinor: 1 }]) {
      expect((await manager.patch('/api/account/profile', alone)).status).toBe(422)
    }
    const after = dbRows(`SELECT u.name, u.role, u.status, u.organisation_id, o.status AS org_status, o.credit_limit_minor, o.payment_terms FROM users u JOIN organisations o ON o.id = u.organisation_id WHERE u.email = ${sqlText(fields.email)}`)
    expect(after).toEqual(before)
    expect((await manager.get('/api/me')).body.user.role).toBe('garage_manager')
    expect((await manager.get('/api/admin/trade-accounts')).status).toBe(403)
    expect(dbValue(`SELECT COUNT(*) FROM audit_log WHERE entity = 'user' AND action = 'user.profile_changed' AND organisation_id = ${id}`)).toBe(0)
  })
})

describe('passwords', () => {
  it('gives the same answer for a known and an unknown e-mail', async () => {
    const { fields } = await newApprovedGarage(admin)
    const known = await new Client().post('/api/auth/forgot-password', { email: fields.email })
    const unknown = await new Client().post('/api/auth/forgot-password', { email: uniqueEmail('nobody') })
    expect(known.status).toBe(202)
    expect(unknown.status).toBe(202)
    expect(known.body).toEqual(unknown.body)
    expect((await new Client().post('/api/auth/forgot-password', { email: 'not an e-mail' })).status).toBe(422)
  })

  it('resets by a single-use link valid for one hour, ends every session and keeps only a hash of the token', async () => {
    const { fields, manager } = await newApprovedGarage(admin)
    const elsewhere = new Client()
    await elsewhere.signIn(fields.email, fields.password)
    expect((await new Client().post('/api/auth/forgot-password', { email: fields.email })).status).toBe(202)
    const token = await linkToken(fields.email, /reset your password/, 'reset')

    const userId = dbValue<number>(`SELECT id FROM users WHERE email = ${sqlText(fields.email)}`)
    const stored = dbRows<{ token_hash: string; kind: string; expires_at: string; created_at: string }>(`SELECT token_hash, kind, expires_at, created_at FROM account_tokens WHERE user_id = ${userId} AND kind = 'reset'`)
    expect(stored).toHaveLength(1)
    expect(stored[0]!.token_hash).toBe(createHash('sha256').update(token).digest('hex'))
    expect(JSON.stringify(dbRows(`SELECT * FROM account_tokens WHERE user_id = ${userId}`))).not.toContain(token)
    const lifetime = new Date(stored[0]!.expires_at).getTime() - new Date(stored[0]!.created_at).getTime()
    expect(Math.abs(lifetime - 3_600_000)).toBeLessThan(2000)

    const anon = new Client()
    expect((await anon.get(`/api/auth/reset-password/${token}`)).body).toEqual({ email: fields.email })
    expect((await anon.post('/api/auth/reset-password', { token, password: 'short' })).body.data.fields).toHaveProperty('password')
    expect((await anon.post('/api/auth/reset-password', { token, password: 'a-brand-new-password' })).status).toBe(200)
    // both sessions that existed are over
    expect((await manager.get('/api/me')).status).toBe(401)
    expect((await elsewhere.get('/api/me')).status).toBe(401)
    // single use
    expect((await anon.post('/api/auth/reset-password', { token, password: 'yet-another-password' })).status).toBe(410)
    expect((await anon.get(`/api/auth/reset-password/${token}`)).status).toBe(410)
    // old password gone, new one works
    expect((await new Client().post('/api/auth/sign-in', { email: fields.email, password: fields.password })).status).toBe(401)
    await new Client().signIn(fields.email, 'a-brand-new-password')
  })

  it('voids an earlier link when a newer one is asked for (410); expiry itself is unit-tested', async () => {
    const { fields } = await newApprovedGarage(admin)
    await new Client().post('/api/auth/forgot-password', { email: fields.email })
    const older = await linkToken(fields.email, /reset your password/, 'reset')
    await new Client().post('/api/auth/forgot-password', { email: fields.email })
    await waitForNewMail(fields.email, /reset your password/, 2)
    const newer = await linkToken(fields.email, /reset your password/, 'reset')
    expect(newer).not.toBe(older)
    expect((await new Client().post('/api/auth/reset-password', { token: older, password: 'a-brand-new-password' })).status).toBe(410)
    expect((await new Client().get(`/api/auth/reset-password/${newer}`)).status).toBe(200)
  })

  it('changes the password with the current one, keeping this session and ending the others', async () => {
    const { fields, manager } = await newApprovedGarage(admin)
    const other = new Client()
    await other.signIn(fields.email, fields.password)
    expect((await manager.post('/api/account/password', { currentPassword: 'wrong-password!', newPassword: 'another-long-password' })).body.data.fields).toHaveProperty('currentPassword')
    expect((await manager.post('/api/account/password', { currentPassword: fields.password, newPassword: 'another-long-password' })).status).toBe(200)
    expect((await manager.get('/api/me')).status).toBe(200)
    expect((await other.get('/api/me')).status).toBe(401)
    await new Client().signIn(fields.email, 'another-long-password')
  })
})

describe('staff', () => {
  it('a manager invites a technician, who sets a password from the e-mailed link and signs in', async () => {
    const { fields: garage, manager } = await newApprovedGarage(admin)
    const email = uniqueEmail('technician')
    const invited = await manager.post('/api/staff', { email, name: 'Tam Spanner', role: 'garage_technician' })
    expect(invited.status).toBe(201)
    expect(invited.body).toMatchObject({ email, role: 'garage_technician', status: 'invited' })
    const token = await linkToken(email, /invited you to/, 'invite')
    expect((await new Client().get(`/api/auth/invitations/${token}`)).body).toEqual({ email, name: 'Tam Spanner', role: 'garage_technician', organisation: garage.businessName })
    // cannot sign in before accepting
    expect((await new Client().post('/api/auth/sign-in', { email, password: 'anything-at-all' })).status).toBe(401)
    expect((await new Client().post('/api/auth/invitations/accept', { token, password: 'short' })).status).toBe(422)
    expect((await new Client().post('/api/auth/invitations/accept', { token, password: 'tams-own-password', name: 'Tam Spanner-Jones' })).status).toBe(200)
    expect((await new Client().post('/api/auth/invitations/accept', { token, password: 'tams-own-password' })).status).toBe(410)
    const tam = new Client()
    const r = await tam.signIn(email, 'tams-own-password')
    expect(r.body.user).toMatchObject({ name: 'Tam Spanner-Jones', role: 'garage_technician' })
    expect((await tam.get('/api/staff')).status).toBe(403)
    expect((await tam.post('/api/staff', { email: uniqueEmail('y'), name: 'Not Allowed', role: 'garage_technician' })).status).toBe(403)
  })

  it('changes a colleague\'s role (felt on their next request) and removes them (their session ends at once)', async () => {
    const { manager } = await newApprovedGarage(admin)
    const email = uniqueEmail('colleague')
    await manager.post('/api/staff', { email, name: 'Ash Caliper', role: 'garage_technician' })
    const token = await linkToken(email, /invited you to/, 'invite')
    await new Client().post('/api/auth/invitations/accept', { token, password: 'ashs-own-password' })
    const ash = new Client()
    await ash.signIn(email, 'ashs-own-password')
    const ashId = dbValue<number>(`SELECT id FROM users WHERE email = ${sqlText(email)}`)

    expect((await ash.get('/api/staff')).status).toBe(403)
    expect((await manager.patch(`/api/staff/${ashId}`, { role: 'garage_manager' })).body).toMatchObject({ role: 'garage_manager' })
    expect((await ash.get('/api/staff')).status).toBe(200)
    expect((await ash.get('/api/me')).body.user.role).toBe('garage_manager')
    expect((await manager.patch(`/api/staff/${ashId}`, { role: 'distributor_admin' })).body.data.fields).toHaveProperty('role')
    expect((await manager.patch(`/api/staff/${ashId}`, { role: 'garage_technician' })).status).toBe(200)

    expect((await manager.del(`/api/staff/${ashId}`)).status).toBe(200)
    expect((await ash.get('/api/me')).status).toBe(401)
    expect((await new Client().post('/api/auth/sign-in', { email, password: 'ashs-own-password' })).status).toBe(401)
    expect((await manager.del(`/api/staff/${ashId}`)).status).toBe(404)
    const actions = dbRows<{ action: string }>(`SELECT action FROM audit_log WHERE entity = 'user' AND entity_id = '${ashId}' ORDER BY id`).map((r) => r.action)
    expect(actions).toEqual(['user.invited', 'user.invitation_accepted', 'user.role_changed', 'user.role_changed', 'user.removed'])
  })

  it('keeps managers to their own garage (404) and away from themselves (409)', async () => {
    const a = await newApprovedGarage(admin)
    const b = await newApprovedGarage(admin)
    const email = uniqueEmail('b-tech')
    await b.manager.post('/api/staff', { email, name: 'Bea Rotor', role: 'garage_technician' })
    const beaId = dbValue<number>(`SELECT id FROM users WHERE email = ${sqlText(email)}`)
    expect((await a.manager.patch(`/api/staff/${beaId}`, { role: 'garage_manager' })).status).toBe(404)
    expect((await a.manager.del(`/api/staff/${beaId}`)).status).toBe(404)
    expect((await a.manager.get('/api/staff')).body.data.map((p: { email: string }) => p.email)).not.toContain(email)
    expect(dbRows(`SELECT role, status FROM users WHERE id = ${beaId}`)).toEqual([{ role: 'garage_technician', status: 'invited' }])
    const selfId = dbValue<number>(`SELECT id FROM users WHERE email = ${sqlText(a.fields.email)}`)
    expect((await a.manager.del(`/api/staff/${selfId}`)).status).toBe(409)
    expect((await a.manager.patch(`/api/staff/${selfId}`, { role: 'garage_technician' })).status).toBe(409)
    // an e-mail that belongs to someone else's account cannot be invited
    expect((await a.manager.post('/api/staff', { email: people.manager, name: 'Hattie Again', role: 'garage_technician' })).body.data.fields).toHaveProperty('email')
    // the cookie of a garage manager does not reach the distributor's people either
    const counterId = dbValue<number>(`SELECT id FROM users WHERE email = ${sqlText(people.counter)}`)
    expect((await a.manager.del(`/api/staff/${counterId}`)).status).toBe(404)
  })

  it('the distributor admin invites counter staff only, and cannot act on garages\' people', async () => {
    const email = uniqueEmail('counter')
    const r = await admin.post('/api/staff', { email, name: 'Cal Counter', role: 'counter_staff' })
    expect(r.status).toBe(201)
    await waitForMail(email, /invited you to Kestrel Friction Supply/)
    expect((await admin.post('/api/staff', { email: uniqueEmail('z'), name: 'Garage Person', role: 'garage_manager' })).body.data.fields).toHaveProperty('role')
    expect((await admin.post('/api/staff', { email: uniqueEmail('z'), name: 'Second Admin', role: 'distributor_admin' })).body.data.fields).toHaveProperty('role')
    const sol = dbValue<number>(`SELECT id FROM users WHERE email = ${sqlText(people.technician)}`)
    expect((await admin.del(`/api/staff/${sol}`)).status).toBe(404)
    const calId = dbValue<number>(`SELECT id FROM users WHERE email = ${sqlText(email)}`)
    expect((await admin.del(`/api/staff/${calId}`)).status).toBe(200)
    expect((await (await as(people.counter)).get('/api/staff')).status).toBe(403)
  })
})

async function waitForNewMail(to: string, subject: RegExp, count: number) {
  const until = Date.now() + 10_000
  while (Date.now() < until) {
    const r = await fetch(`${env().mailUrl}/messages?to=${encodeURIComponent(to)}`)
    const list = (await r.json()) as { subject: string }[]
    if (list.filter((m) => subject.test(m.subject)).length >= count) return
    await new Promise((r) => setTimeout(r, 150))
  }
  throw new Error(`fewer than ${count} e-mails to ${to}`)
}
