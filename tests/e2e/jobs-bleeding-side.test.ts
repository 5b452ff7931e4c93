/**
 * The job card's bleeding order follows the vehicle: the wheel farthest from the master cylinder first, and the
 * master cylinder sits on the steering side (common practice: workshop manuals and brake-fluid makers'
 * instructions; the vehicle maker's own sequence comes first). Left- and right-hand drive start at opposite rear
 * wheels; a vehicle whose steering side is not recorded gets no order, and the card says so instead of guessing.
 * Vehicle 3 is a seeded demo vehicle (right-hand drive); the test sets its side and puts it back.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { Client, as, env, people } from '../support/api'
import { decidedQuote } from '../support/jobs'
import { models } from '../support/orders'
import { dbAll } from '../support/db'
import { withWrite } from '../../server/utils/db'
import { Vehicle } from '../../server/models/catalogue'

await setup({ host: env().baseUrl })

const VEHICLE = 3
let manager: Client, tech: Client, counter: Client
let quoteId = 0
let split: 'front-rear' | 'diagonal'
const setSide = (steeringSide: 'left' | 'right' | null) => withWrite((t) => Vehicle.update({ steeringSide }, { where: { id: VEHICLE }, transaction: t }))

beforeAll(async () => {
  models()
  ;[manager, tech, counter] = await Promise.all([as(people.manager), as(people.technician), as(people.counter)])
  const parts = await manager.get(`/api/vehicles/${VEHICLE}/parts`)
  const disc = parts.body.groups.find((g: { axle: string }) => g.axle === 'front').types.find((t: { type: string }) => t.type === 'disc').parts[0].sku
  ;({ quoteId } = await decidedQuote(manager, VEHICLE, [disc]))
  split = (await Vehicle.findByPk(VEHICLE))!.circuitSplit
})
afterAll(async () => { await setSide('right') })

describe('bleeding order by the vehicle\'s steering side', () => {
  // right-hand master cylinder: farthest is the left rear. Front/rear: the other rear, then the fronts far first;
  // diagonal: the left rear's circuit partner (right front), then the other circuit rear first. Left-hand drive is
  // the mirror image.
  const expected = {
    right: { 'front-rear': ['left rear', 'right rear', 'left front', 'right front'], diagonal: ['left rear', 'right front', 'right rear', 'left front'] },
    left: { 'front-rear': ['right rear', 'left rear', 'right front', 'left front'], diagonal: ['right rear', 'left front', 'left rear', 'right front'] },
  } as const
  it.each(['right', 'left'] as const)('%s-hand drive: the rear wheel on the other side first', async (side) => {
    await setSide(side)
    const card = (await tech.get(`/api/quotes/${quoteId}/job-card`)).body
    expect(card.steeringSide).toBe(side)
    expect(card.bleedingSequence).toEqual(expected[side][split])
  })

  it('not recorded: no order, and the card and its PDF still come', async () => {
    await setSide(null)
    const r = await tech.get(`/api/quotes/${quoteId}/job-card`)
    expect(r.status, r.text).toBe(200)
    expect(r.body).toMatchObject({ steeringSide: null, bleedingSequence: [] })
    const pdf = await tech.get(`/api/quotes/${quoteId}/job-card.pdf`)
    expect(pdf.status).toBe(200)
  })
})

describe('PATCH /api/vehicles/:id: counter staff record the steering side', () => {
  it('counter staff set it; the finder and the job card follow at once; the change is audited', async () => {
    await setSide(null)
    const r = await counter.patch(`/api/vehicles/${VEHICLE}`, { steeringSide: 'left' })
    expect(r.status, r.text).toBe(200)
    expect(r.body).toEqual({ id: VEHICLE, steeringSide: 'left' })
    expect((await manager.get(`/api/vehicles/${VEHICLE}/parts`)).body.vehicle.steeringSide).toBe('left')
    expect((await tech.get(`/api/quotes/${quoteId}/job-card`)).body.bleedingSequence[0]).toBe('right rear')
    const back = await counter.patch(`/api/vehicles/${VEHICLE}`, { steeringSide: null })
    expect(back.body.steeringSide).toBeNull()
    expect((await tech.get(`/api/quotes/${quoteId}/job-card`)).body.bleedingSequence).toEqual([])
    const audits = await dbAll<{ action: string; changes: string }>("SELECT action, changes FROM audit_log WHERE entity = 'vehicle' AND entity_id = ? ORDER BY id", [String(VEHICLE)])
    expect(audits.map((a) => a.action).slice(-2)).toEqual(['catalogue.vehicle.update', 'catalogue.vehicle.update'])
    expect(audits.at(-2)!.changes).toMatch(/left/)
  })

  it('refuses other values beside the field, garages, strangers and unknown vehicles, and changes nothing', async () => {
    await setSide('right')
    const bad = await counter.patch(`/api/vehicles/${VEHICLE}`, { steeringSide: 'middle' })
    expect(bad.status).toBe(422)
    expect(bad.body.data.fields.steeringSide).toMatch(/left, right or not recorded/)
    expect((await manager.patch(`/api/vehicles/${VEHICLE}`, { steeringSide: 'left' })).status).toBe(403)
    expect((await tech.patch(`/api/vehicles/${VEHICLE}`, { steeringSide: 'left' })).status).toBe(403)
    expect((await new Client().patch(`/api/vehicles/${VEHICLE}`, { steeringSide: 'left' })).status).toBe(401)
    expect((await counter.patch('/api/vehicles/999999', { steeringSide: 'left' })).status).toBe(404)
    expect((await Vehicle.findByPk(VEHICLE))!.steeringSide).toBe('right')
  })
})
