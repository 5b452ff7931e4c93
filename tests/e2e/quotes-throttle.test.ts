/**
 * The owner's link routes are throttled per client address: after 10 links that are not valid in 15 minutes,
 * that address gets 429 for every link (so tokens cannot be guessed even slowly), while other addresses carry
 * on. Run from 127.0.0.2, so the rest of the suite (on 127.0.0.1) is not affected.
 */
import { describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { as, env, people } from '../support/api'
import { getFrom, sendAndReadLink, startQuote } from '../support/quotes'

await setup({ host: env().baseUrl })

describe('throttling the owner\'s link', () => {
  it('refuses an address that tried 10 links that were not valid, for valid links too', async () => {
    const manager = await as(people.manager)
    const s = await startQuote(manager)
    await manager.post(`/api/quotes/${s.quote.id}/lines`, { kind: 'labour', description: 'Check', hours: 0.5 })
    const { token } = await sendAndReadLink(manager, s.quote.id, s.ownerEmail)
    expect((await getFrom('127.0.0.2', `/api/quote-links/${token}`)).status).toBe(200)
    for (let i = 0; i < 10; i++) {
      const guess = `${String(i).padStart(2, '0')}${'x'.repeat(41)}`
      expect((await getFrom('127.0.0.2', `/api/quote-links/${guess}`)).status).toBe(404)
    }
    const blocked = await getFrom('127.0.0.2', `/api/quote-links/${'y'.repeat(43)}`)
    expect(blocked.status).toBe(429)
    expect(JSON.parse(blocked.body).message).toMatch(/Too many tries/)
    expect((await getFrom('127.0.0.2', `/api/quote-links/${token}`)).status).toBe(429)
    expect((await getFrom('127.0.0.2', `/q/${token}`)).status).toBe(429)
    // another address is not affected
    expect((await getFrom('127.0.0.1', `/api/quote-links/${token}`)).status).toBe(200)
  })
})
