/**
 * Two server processes on one PostgreSQL database, continued (tests/processes/two-processes.test.ts starts the
 * suite): state that was once kept in one process, or read-then-written, holds across both.
 * - quote-line positions (the next place is MAX + 1): concurrent adds through both processes get distinct places;
 * - a used reset link starts the e-mail's sign-in counters afresh in every process, not only the one that took it.
 */
import { describe, expect, it } from 'vitest'
import { as } from '../support/api'
import { fromAddress, linkToken } from '../support/accounts'
import { makeGarage } from '../support/orders'
import { startQuote } from '../support/quotes'
import { through, useTwoProcesses } from '../support/second-process'
import { SIGN_IN_LIMIT } from '../../server/services/throttle'

const bases = useTwoProcesses()

describe('writes through two processes at once', () => {
  it('20 lines added to one quote at once, alternating between the processes, take the places 1 to 20', async () => {
    const garage = await makeGarage({ terms: 'account', label: 'Two quote' })
    const signedIn = await as(garage.email)
    const clients = [through(bases.a, signedIn), through(bases.b, signedIn)]
    const { quote } = await startQuote(clients[0]!)
    const added = await Promise.all(Array.from({ length: 20 }, (_, i) =>
      clients[i % 2]!.post(`/api/quotes/${quote.id}/lines`, { kind: 'labour', description: `Step ${i + 1}`, hours: 0.25 })))
    expect(added.map((r) => r.status)).toEqual(Array(20).fill(201))
    const detail = await clients[1]!.get(`/api/quotes/${quote.id}`)
    expect(detail.status).toBe(200)
    const places = (detail.body.lines as { position: number }[]).map((l) => l.position).sort((x, y) => x - y)
    expect(places).toEqual(Array.from({ length: 20 }, (_, i) => i + 1))
  })

  it('a reset link used through one process frees the sign-in its failures locked in the other', async () => {
    const garage = await makeGarage({ terms: 'card', label: 'Two reset' })
    // an address of this test's own, so other files' failed sign-ins from 127.0.0.1 do not count here
    const address = '127.0.4.21'
    const signIn = (base: string, password: string) => fromAddress(address, `${base}/api/auth/sign-in`, { email: garage.email, password })
    // 10 failures per e-mail and address in 15 minutes lock the pair (server/services/throttle.ts), through B
    for (let i = 0; i < SIGN_IN_LIMIT.pointsPerPair; i++) expect((await signIn(bases.b, `not-it-${i}`)).status).toBe(401)
    expect((await signIn(bases.a, 'not-it-either')).status).toBe(429)
    // the owner resets the password through A
    expect((await fromAddress(address, `${bases.a}/api/auth/forgot-password`, { email: garage.email })).status).toBe(202)
    const token = await linkToken(garage.email, /reset your password/, 'reset')
    expect((await fromAddress(address, `${bases.a}/api/auth/reset-password`, { token, password: 'a-brand-new-password' })).status).toBe(200)
    // and signs in through B, whose own memory never saw the reset
    expect((await signIn(bases.b, 'a-brand-new-password')).status).toBe(200)
  }, 120_000)
})
