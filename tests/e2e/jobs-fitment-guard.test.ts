/**
 * The fitment guard on quote lines: a disc for another car is refused on `sku`, a manager may override with a
 * reason (recorded, shown to the garage as a warning, never to the owner), a part whose fit depends on an open
 * option question asks it, and a pair part goes on in its fitted quantity.
 * Catalogue facts (server/seed/catalogue-data.ts, vehicles seeded in order): vehicle 1 (Veltra Pennon Mk1) takes
 * front discs KD-1001/KD-1002 only; vehicle 2 (Veltra Pennon Mk1, another engine) asks the front disc diameter
 * (288 or 312 mm), and KD-1005 fits it with 312 mm; front discs fit as a pair (quantity 2).
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { type Client, as, env, people } from '../support/api'
import { sendAndReadLink, startQuote } from '../support/quotes'
import type { Line } from '../support/jobs'

await setup({ host: env().baseUrl })

let manager: Client, tech: Client
beforeAll(async () => {
  ;[manager, tech] = await Promise.all([as(people.manager), as(people.technician)])
})

describe('fitment guard', () => {
  it('refuses a disc for another car with 422 on sku', async () => {
    const { quote } = await startQuote(manager, { vehicleId: 1 })
    const r = await manager.post(`/api/quotes/${quote.id}/lines`, { kind: 'part', sku: 'KD-1005' })
    expect(r.status, r.text).toBe(422)
    expect(r.body.data.fields.sku).toMatch(/^KD-1005 does not fit Veltra Pennon Mk1/)
    expect((await manager.get(`/api/quotes/${quote.id}`)).body.lines).toHaveLength(0)
  })

  it('puts a fitting disc on in the fitted quantity (a pair: 2)', async () => {
    const { quote } = await startQuote(tech, { vehicleId: 1 })
    const r = await tech.post(`/api/quotes/${quote.id}/lines`, { kind: 'part', sku: 'KD-1001' })
    expect(r.status, r.text).toBe(201)
    expect(r.body.lines.find((l: Line) => l.sku === 'KD-1001').quantity).toBe(2)
  })

  it('records a manager\'s override with its reason, warns the garage, tells the owner nothing', async () => {
    const { quote, ownerEmail } = await startQuote(manager, { vehicleId: 1 })
    const tried = await tech.post(`/api/quotes/${quote.id}/lines`, { kind: 'part', sku: 'KD-1005', override: { reason: 'Car has the larger brakes fitted' } })
    expect(tried.status).toBe(403)
    const r = await manager.post(`/api/quotes/${quote.id}/lines`, { kind: 'part', sku: 'KD-1005', override: { reason: 'Car has the larger brakes fitted' } })
    expect(r.status, r.text).toBe(201)
    const line = r.body.lines.find((l: Line & { fitOverride: string }) => l.sku === 'KD-1005')
    expect(line.fitOverride).toBe('Car has the larger brakes fitted')
    expect(r.body.warnings.join(' ')).toMatch(/KD-1005 does not fit this vehicle by the catalogue.*larger brakes/)
    const { token } = await sendAndReadLink(manager, r.body.id, ownerEmail)
    const owner = await fetch(`${env().baseUrl}/api/quote-links/${token}`).then((x) => x.text())
    expect(owner).not.toMatch(/larger brakes|does not fit|fitOverride/)
  })

  it('asks the open option question, then takes the answer', async () => {
    const { quote } = await startQuote(manager, { vehicleId: 2 })
    const r = await manager.post(`/api/quotes/${quote.id}/lines`, { kind: 'part', sku: 'KD-1005' })
    expect(r.status, r.text).toBe(422)
    expect(r.body.data.fields['answers.front_disc_diameter_mm']).toBeTruthy()
    expect(r.body.data.questions[0]).toMatchObject({ key: 'front_disc_diameter_mm' })
    expect(r.body.data.questions[0].values.map((v: { value: string }) => v.value)).toEqual(['288', '312'])
    const wrong = await manager.post(`/api/quotes/${quote.id}/lines`, { kind: 'part', sku: 'KD-1005', answers: { front_disc_diameter_mm: '288' } })
    expect(wrong.status).toBe(422)
    expect(wrong.body.data.fields.sku).toMatch(/does not fit/)
    const right = await manager.post(`/api/quotes/${quote.id}/lines`, { kind: 'part', sku: 'KD-1005', answers: { front_disc_diameter_mm: '312' } })
    expect(right.status, right.text).toBe(201)
    expect(right.body.lines[0]).toMatchObject({ sku: 'KD-1005', quantity: 2 })
  })
})
