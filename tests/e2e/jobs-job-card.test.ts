/**
 * The job card of an approved quote: lines by wheel, declined lines as declined by the owner, torques, fluid grade
 * and capacity, the bleeding sequence for the vehicle's circuit split (common practice: farthest wheel first; the
 * demo garage is right-hand drive, master cylinder on the right), checks and the sign-off.
 * Catalogue facts: vehicle 1 (Veltra Pennon Mk1) is split diagonally, fluid DOT 5.1; vehicle 7 (Veltra Skerry
 * Series A) front/rear. KC-1001 is vehicle 1's front left caliper, KD-1001 its front disc (a pair), KP-1004 a
 * rear pad set.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { type Client, as, env, people } from '../support/api'
import { startQuote } from '../support/quotes'
import { ALL_CHECKS, decidedQuote } from '../support/jobs'

await setup({ host: env().baseUrl })

let manager: Client, tech: Client
beforeAll(async () => {
  ;[manager, tech] = await Promise.all([as(people.manager), as(people.technician)])
})

describe('job card', () => {
  it('is refused before the owner approved (409)', async () => {
    const { quote } = await startQuote(manager, { vehicleId: 1 })
    expect((await tech.get(`/api/quotes/${quote.id}/job-card`)).status).toBe(409)
  })

  it('diagonal split: lines by wheel, declined listed, figures and the diagonal bleeding order', async () => {
    const { quoteId } = await decidedQuote(manager, 1, ['KC-1001', 'KD-1001', 'KP-1004'], ['KP-1004'], { odometer: '41 200 mi' })
    const r = await tech.get(`/api/quotes/${quoteId}/job-card`)
    expect(r.status, r.text).toBe(200)
    const card = r.body
    expect(card.groups.map((g: { where: string }) => g.where)).toEqual(['front-left', 'front', 'labour'])
    expect(card.groups[0].lines[0]).toMatchObject({ sku: 'KC-1001', decision: 'approved' })
    expect(card.groups[1].lines[0]).toMatchObject({ sku: 'KD-1001', quantity: 2 })
    expect(card.declined).toEqual([expect.objectContaining({ sku: 'KP-1004', decision: 'declined' })])
    expect(card.circuitSplit).toBe('diagonal')
    expect(card.bleedingSequence).toEqual(['left rear', 'right front', 'right rear', 'left front'])
    expect(card.fluid).toEqual({ grade: 'DOT 5.1', capacityMl: 700 })
    expect(card.torques.map((t: { what: string }) => t.what)).toContain('Bleed nipples')
    expect(card.checks.map((c: { key: string; done: boolean }) => [c.key, c.done])).toEqual(ALL_CHECKS.map((k) => [k, false]))
    expect(card.signedOff).toBeNull()

    const pdf = await tech.get(`/api/quotes/${quoteId}/job-card.pdf`)
    expect(pdf.status).toBe(200)
    expect(pdf.headers.get('content-type')).toBe('application/pdf')
  })

  it('front/rear split: the rears first, then the fronts', async () => {
    const parts = await manager.get('/api/vehicles/7/parts')
    const disc = parts.body.groups.find((g: { axle: string }) => g.axle === 'front').types.find((t: { type: string }) => t.type === 'disc').parts[0].sku
    const { quoteId } = await decidedQuote(manager, 7, [disc])
    const card = (await tech.get(`/api/quotes/${quoteId}/job-card`)).body
    expect(card.circuitSplit).toBe('front-rear')
    expect(card.bleedingSequence).toEqual(['left rear', 'right rear', 'left front', 'right front'])
  })

  it('signs off with every check ticked and an odometer not below the one at the quote, once', async () => {
    const { quoteId } = await decidedQuote(manager, 1, ['KD-1001'], [], { odometer: '41 200 mi' })
    const missing = await tech.post(`/api/quotes/${quoteId}/job-card/complete`, { odometer: 41_230, checks: ALL_CHECKS.slice(1) })
    expect(missing.status).toBe(422)
    expect(missing.body.data.fields.checks).toMatch(/Tick every check/)
    const lower = await tech.post(`/api/quotes/${quoteId}/job-card/complete`, { odometer: 40_000, checks: ALL_CHECKS })
    expect(lower.status).toBe(422)
    expect(lower.body.data.fields.odometer).toMatch(/41200 mi/)
    const done = await tech.post(`/api/quotes/${quoteId}/job-card/complete`, { odometer: 41_230, checks: ALL_CHECKS })
    expect(done.status, done.text).toBe(200)
    expect(done.body.signedOff).toMatchObject({ by: expect.any(String), odometer: 41_230 })
    expect(done.body.checks.every((c: { done: boolean }) => c.done)).toBe(true)
    expect((await tech.post(`/api/quotes/${quoteId}/job-card/complete`, { odometer: 41_231, checks: ALL_CHECKS })).status).toBe(409)
  })
})
