/**
 * Sign-in throttling: at most 10 failed attempts per e-mail from one address and 30 per address in 15 minutes,
 * holding against 50 parallel attempts and a changing X-Forwarded-For; an e-mail failing from many addresses is
 * slowed, never locked (tests/e2e/security-accounts.test.ts). Each test sends from loopback addresses of its own
 * (127.0.0.x) and with e-mails nobody else uses, so the rest of the suite (all on 127.0.0.1) is unaffected.
 */
import { describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { Client, DEMO_PASSWORD, env, people } from '../support/api'
import { applyAsNewGarage, fromAddress, uniqueEmail } from '../support/accounts'

await setup({ host: env().baseUrl })

const forged = (i: number) => ({ 'x-forwarded-for': `203.0.113.${i % 250}, 198.51.100.${(i * 7) % 250}` })

function tally(results: { status: number }[]) {
  return results.reduce<Record<number, number>>((acc, r) => ({ ...acc, [r.status]: (acc[r.status] ?? 0) + 1 }), {})
}

function expectRetry(r: { status: number; headers: Record<string, string | string[] | undefined>; body: any }) {
  const seconds = Number(r.headers['retry-after'])
  expect(seconds).toBeGreaterThan(0)
  expect(seconds).toBeLessThanOrEqual(15 * 60)
  expect(r.body.message).toMatch(/Too many sign-in attempts\. Try again in \d+ minutes?\./)
  expect(r.body.data.retryAfterSeconds).toBe(seconds)
}

describe('sign-in throttling', () => {
  it('per e-mail and address: of 50 parallel wrong passwords from one address, 10 are checked and 40 get 429', async () => {
    const { fields } = await applyAsNewGarage()
    const address = '127.0.0.100'
    const results = await Promise.all(Array.from({ length: 50 }, (_, i) =>
      fromAddress(address, '/api/auth/sign-in', { email: fields.email, password: `wrong-password-${i}` }, forged(i))))
    expect(tally(results)).toEqual({ 401: 10, 429: 40 })
    for (const r of results.filter((x) => x.status === 429)) expectRetry(r)
    for (const r of results.filter((x) => x.status === 401)) expect(r.body.message).toBe('That e-mail and password do not match an account.')
    // now even the right password is refused for this e-mail from that address …
    const right = await fromAddress(address, '/api/auth/sign-in', { email: fields.email, password: fields.password })
    expect(right.status).toBe(429)
    expectRetry(right)
    // (the same e-mail in another letter case is the same e-mail)
    expect((await fromAddress(address, '/api/auth/sign-in', { email: fields.email.toUpperCase(), password: fields.password })).status).toBe(429)
    // … while its owner, elsewhere, is not locked out
    expect((await fromAddress('127.0.0.101', '/api/auth/sign-in', { email: fields.email, password: fields.password })).status).toBe(200)
  })

  it('per address: 50 parallel attempts for 50 e-mails with a changing X-Forwarded-For, 30 checked and 20 get 429', async () => {
    const address = '127.0.0.60'
    const results = await Promise.all(Array.from({ length: 50 }, (_, i) =>
      fromAddress(address, '/api/auth/sign-in', { email: uniqueEmail(`spray-${i}`), password: 'guess-guess-guess' }, forged(i))))
    // 30 are let through to the password check: each is checked (401) or, when the bounded hashing queue has
    // waited its limit on a busy machine, told to come back (503 with Retry-After); never more than 30
    const t = tally(results)
    expect(t[429]).toBe(20)
    expect((t[401] ?? 0) + (t[503] ?? 0)).toBe(30)
    expect(t[401]).toBeGreaterThan(0)
    for (const r of results.filter((x) => x.status === 429)) expectRetry(r)
    for (const r of results.filter((x) => x.status === 503)) expect(Number(r.headers['retry-after'])).toBeGreaterThan(0)
    // a demo person's right password from that address is refused too …
    expect((await fromAddress(address, '/api/auth/sign-in', { email: people.technician, password: DEMO_PASSWORD }, forged(99))).status).toBe(429)
    // … while everyone else is unaffected
    expect((await new Client().post('/api/auth/sign-in', { email: people.technician, password: DEMO_PASSWORD })).status).toBe(200)
    expect((await fromAddress('127.0.0.61', '/api/auth/sign-in', { email: people.technician, password: DEMO_PASSWORD })).status).toBe(200)
  })

  it('does not count right passwords as failures', async () => {
    const { fields } = await applyAsNewGarage()
    const address = '127.0.0.62'
    // four failures: below the point where the e-mail starts to be slowed, so this test stays quick
    for (let i = 0; i < 4; i++) expect((await fromAddress(address, '/api/auth/sign-in', { email: fields.email, password: 'not-the-password' })).status).toBe(401)
    // each success is counted first, then given back: five in a row never reach the limit
    for (let i = 0; i < 5; i++) expect((await fromAddress(address, '/api/auth/sign-in', { email: fields.email, password: fields.password })).status).toBe(200)
    for (let i = 0; i < 6; i++) expect((await fromAddress(address, '/api/auth/sign-in', { email: fields.email, password: 'not-the-password' })).status).toBe(401)
    expect((await fromAddress(address, '/api/auth/sign-in', { email: fields.email, password: 'not-the-password' })).status).toBe(429)
  })
})
