/**
 * "Also needed": the part page lists what a part needs beside it with quantity and reason, the quote offers what
 * fits its vehicle and is not on it yet, and one request adds it; counter staff maintain the relations.
 * Seed facts (server/seed/jobs.ts): a front pad set needs the front fitting kit of the same vehicle; a caliper
 * needs fluid of the vehicle's grade, as many packs as its capacity takes (vehicle 1: 700 ml of DOT 5.1, packs
 * of 500 ml -> ceil(700 / 500) = 2 packs).
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { type Client, as, env, people } from '../support/api'
import { startQuote } from '../support/quotes'

await setup({ host: env().baseUrl })

let manager: Client, counter: Client
beforeAll(async () => {
  ;[manager, counter] = await Promise.all([as(people.manager), as(people.counter)])
})

describe('also needed', () => {
  it('the part page lists the fitting kit for a pad set', async () => {
    const r = await manager.get('/api/parts/KP-1001')
    expect(r.status, r.text).toBe(200)
    expect(r.body.alsoNeeded).toContainEqual(expect.objectContaining({ sku: 'KK-1001', relation: 'fitting_kit', quantity: 1, reason: expect.stringMatching(/clips/) }))
  })

  it('fluid comes in packs for the vehicle\'s capacity', async () => {
    const r = await manager.get('/api/parts/KC-1001?vehicleId=1')
    const fluid = r.body.alsoNeeded.find((a: { relation: string }) => a.relation === 'fluid')
    expect(fluid).toMatchObject({ sku: 'KF-1005', quantity: 2, fits: true })
  })

  it('the quote offers it, and one request adds it', async () => {
    const { quote } = await startQuote(manager, { vehicleId: 1 })
    await manager.post(`/api/quotes/${quote.id}/lines`, { kind: 'part', sku: 'KP-1001' })
    const offer = await manager.get(`/api/quotes/${quote.id}/also-needed`)
    expect(offer.status).toBe(200)
    const kit = offer.body.data.find((a: { sku: string }) => a.sku === 'KK-1001')
    expect(kit).toMatchObject({ forSku: 'KP-1001', fits: true })
    const add = await manager.post(`/api/quotes/${quote.id}/lines`, { kind: 'part', sku: kit.sku, quantity: kit.quantity })
    expect(add.status, add.text).toBe(201)
    expect((await manager.get(`/api/quotes/${quote.id}/also-needed`)).body.data.map((a: { sku: string }) => a.sku)).not.toContain('KK-1001')
  })

  it('counter staff maintain the relations; a garage may not', async () => {
    const before = (await counter.get('/api/parts/KD-1001')).body.alsoNeeded
    const body = { relations: [...before.map((a: { sku: string; relation: string; quantity: number; reason: string }) => ({ sku: a.sku, relation: a.relation, quantity: a.quantity, reason: a.reason })), { sku: 'KK-1001', relation: 'hardware', quantity: 1, reason: 'New guide pins with new discs.' }] }
    expect((await manager.request('/api/parts/KD-1001/relations', { method: 'PUT', json: body })).status).toBe(403)
    const bad = await counter.request('/api/parts/KD-1001/relations', { method: 'PUT', json: { relations: [{ sku: 'NOPE-1', relation: 'hardware', quantity: 1, reason: 'x y z' }] } })
    expect(bad.status).toBe(422)
    expect(bad.body.data.fields['relations.0.sku']).toMatch(/No part NOPE-1/)
    const r = await counter.request('/api/parts/KD-1001/relations', { method: 'PUT', json: body })
    expect(r.status, r.text).toBe(200)
    expect(r.body.alsoNeeded.map((a: { sku: string }) => a.sku)).toContain('KK-1001')
    await counter.request('/api/parts/KD-1001/relations', { method: 'PUT', json: { relations: body.relations.slice(0, -1) } })
  })
})
