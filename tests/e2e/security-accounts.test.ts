/**
 * Accounts under abuse (OWASP ASVS 5.0 V6.3 authentication, V2.4 anti-automation; WSTG-ATHN-03 lock-out,
 * WSTG-IDNT-04 account enumeration): nobody can lock someone else out by failing on purpose, the trade application
 * says nothing about which e-mails have accounts and takes only its own fields, and new passwords that are too easy to
 * guess are refused wherever a password is set. Failures on purpose come from addresses of their own (127.0.1.x).
 */
import { describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { as, Client, env, people, waitForMail } from '../support/api'
import {
  applicationFields, applicationForm, applyAsNewGarage, dbValue, fromAddress, linkToken, newApprovedGarage, postApplication, sqlText,
} from '../support/accounts'
import { createStaff } from '../support/staff'

await setup({ host: env().baseUrl })

/** `n` wrong passwords for `email` at once, each from an address of its own. */
async function failFromMany(email: string, n: number, firstAddress: number) {
  const results = await Promise.all(Array.from({ length: n }, (_, i) =>
    fromAddress(`127.0.1.${firstAddress + i}`, '/api/auth/sign-in', { email, password: `wrong-password-${i}` })))
  return results.map((r) => r.status)
}

async function timed<T>(fn: () => Promise<T>): Promise<{ value: T; ms: number }> {
  const t0 = performance.now()
  const value = await fn()
  return { value, ms: performance.now() - t0 }
}

describe('nobody can lock an account', () => {
  it('12 wrong passwords from 12 addresses slow the e-mail down but never lock it: its owner still gets in', async () => {
    const { fields } = await applyAsNewGarage()
    expect(await failFromMany(fields.email, 12, 100)).toEqual(Array(12).fill(401))
    // after 12 failures each attempt for the e-mail is held 8 s (0.25 s doubling from the 6th failure) and then checked
    const right = await timed(() => fromAddress('127.0.1.130', '/api/auth/sign-in', { email: fields.email, password: fields.password }))
    expect(right.value.status).toBe(200)
    expect(right.ms).toBeGreaterThan(6000)
  })

  it('holds for the distributor admin too: the password step still opens for the right password', async () => {
    const admin = await createStaff('distributor_admin')
    expect(await failFromMany(admin.email, 12, 140)).toEqual(Array(12).fill(401))
    const right = await fromAddress('127.0.1.160', '/api/auth/sign-in', { email: admin.email, password: admin.password })
    expect(right.status).toBe(200)
    expect(right.body).toEqual({ mfaRequired: true })
  })

  it('lifts the slowing as soon as a reset link is used', async () => {
    const { fields } = await applyAsNewGarage()
    expect(await failFromMany(fields.email, 12, 170)).toEqual(Array(12).fill(401))
    expect((await new Client().post('/api/auth/forgot-password', { email: fields.email })).status).toBe(202)
    const token = await linkToken(fields.email, /reset your password/, 'reset')
    expect((await new Client().post('/api/auth/reset-password', { token, password: 'a-brand-new-password' })).status).toBe(200)
    const right = await timed(() => fromAddress('127.0.1.195', '/api/auth/sign-in', { email: fields.email, password: 'a-brand-new-password' }))
    expect(right.value.status).toBe(200)
    expect(right.ms).toBeLessThan(4000) // no 8 s hold left: only the password check itself
  })
})

describe('the trade application says nothing about who has an account', () => {
  it('answers the same for a known and an unknown e-mail, creates nothing for the known one and tells its owner', async () => {
    const { fields: existing } = await applyAsNewGarage()
    const unknown = await postApplication(new Client(), applicationForm(applicationFields()))
    const known = await postApplication(new Client(), applicationForm(applicationFields({ email: existing.email.toUpperCase() })))
    expect(unknown.status).toBe(201)
    expect(known.status).toBe(unknown.status)
    expect(known.body).toEqual(unknown.body)
    expect(known.body).not.toHaveProperty('id')
    expect(dbValue(`SELECT COUNT(*) FROM users WHERE email = ${sqlText(existing.email)}`)).toBe(1)
    expect(dbValue(`SELECT COUNT(*) FROM organisations WHERE email = ${sqlText(existing.email)}`)).toBe(1)
    const told = await waitForMail(existing.email, /a trade account application used your e-mail address/)
    expect(told.text).toMatch(/Nothing was created/)
  })

  it('refuses a field it does not take, by name', async () => {
    const r = await postApplication(new Client(), applicationForm({ ...applicationFields(), role: 'distributor_admin', status: 'approved' }))
    expect(r.status).toBe(422)
    expect(r.body.data.fields).toEqual({ role: 'This field cannot be set here.', status: 'This field cannot be set here.' })
  })

  it('is throttled per address: the 11th application in an hour gets 429', async () => {
    const address = '127.0.1.196'
    for (let i = 0; i < 10; i++) expect((await postApplication(new Client(), applicationForm({ businessName: 'Only a name' }), address)).status).toBe(422)
    const refused = await postApplication(new Client(), applicationForm(applicationFields()), address)
    expect(refused.status).toBe(429)
    expect(Number(refused.headers.get('retry-after'))).toBeGreaterThan(0)
    expect((await postApplication(new Client(), applicationForm(applicationFields()))).status).toBe(201)
  })
})

describe('passwords too easy to guess are refused wherever one is set', () => {
  it.each(['password123', '1234567890', 'aaaaaaaaaa'])('refuses %s in a trade application, beside the field', async (password) => {
    const f = applicationFields({ password })
    const r = await postApplication(new Client(), applicationForm(f))
    expect(r.status).toBe(422)
    expect(r.body.data.fields.password).toMatch(/Choose a longer one/)
    expect(dbValue(`SELECT COUNT(*) FROM users WHERE email = ${sqlText(f.email)}`)).toBe(0)
  })

  it('refuses one when a password is changed or reset, leaving the old one and the link working', async () => {
    const { fields, manager } = await newApprovedGarage(await as(people.admin))
    const change = await manager.post('/api/account/password', { currentPassword: fields.password, newPassword: 'password123' })
    expect(change.status).toBe(422)
    expect(change.body.data.fields.newPassword).toMatch(/commonly used|most used/)
    await new Client().post('/api/auth/forgot-password', { email: fields.email })
    const token = await linkToken(fields.email, /reset your password/, 'reset')
    const weak = await new Client().post('/api/auth/reset-password', { token, password: '1234567890' })
    expect(weak.status).toBe(422)
    expect(weak.body.data.fields).toHaveProperty('password')
    expect((await new Client().post('/api/auth/reset-password', { token, password: 'a-brand-new-password' })).status).toBe(200)
  })
})
