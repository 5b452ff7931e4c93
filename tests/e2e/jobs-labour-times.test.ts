/**
 * The labour guide: hours per vehicle and operation, a garage's own hours over the guide's, and a quote drafted
 * from an inspection gets labour lines with the guide's hours after the overlap rule (discs and pads on one axle
 * are one job: common practice). The manager may change the hours; the quote then says they differ.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { type Client, as, env, people } from '../support/api'
import { ownerEmail } from '../support/quotes'
import type { Line } from '../support/jobs'

await setup({ host: env().baseUrl })

let manager: Client, tech: Client, counter: Client, other: Client
beforeAll(async () => {
  ;[manager, tech, counter, other] = await Promise.all([as(people.manager), as(people.technician), as(people.counter), as(people.otherManager)])
})

const hoursOf = async (c: Client, operation: string) => (await c.get(`/api/labour-times?vehicleId=1&operation=${operation}`)).body.data[0]

describe('labour times', () => {
  it('lists the guide for a vehicle, paged', async () => {
    const r = await tech.get('/api/labour-times?vehicleId=1')
    expect(r.status, r.text).toBe(200)
    expect(r.body.meta.total).toBe(r.body.data.length)
    expect(r.body.data.map((x: { operation: string }) => x.operation)).toEqual(expect.arrayContaining(['front_pads', 'front_discs_pads', 'fluid_flush']))
    expect((await tech.get('/api/labour-times?vehicleId=abc')).status).toBe(422)
  })

  it('counter staff set the guide; a garage manager sets the garage\'s own; a technician neither', async () => {
    const guide = await hoursOf(counter, 'master_cylinder')
    expect((await tech.request('/api/labour-times', { method: 'PUT', json: { vehicleId: 1, operation: 'master_cylinder', hours: 2 } })).status).toBe(403)
    const own = await manager.request('/api/labour-times', { method: 'PUT', json: { vehicleId: 1, operation: 'master_cylinder', hours: 1.75 } })
    expect(own.status, own.text).toBe(200)
    expect(own.body[0]).toMatchObject({ hours: 1.75, source: 'garage', guideHours: guide.hours })
    // another garage still sees the guide
    expect(await hoursOf(other, 'master_cylinder')).toMatchObject({ hours: guide.hours, source: 'guide' })
    const bad = await counter.request('/api/labour-times', { method: 'PUT', json: { vehicleId: 1, operation: 'master_cylinder', hours: 1.234 } })
    expect(bad.status).toBe(422)
    expect(bad.body.data.fields.hours).toBeTruthy()
    await manager.request('/api/labour-times', { method: 'PUT', json: { vehicleId: 1, operation: 'master_cylinder', hours: null } })
    expect(await hoursOf(manager, 'master_cylinder')).toMatchObject({ source: 'guide' })
  })

  it('a quote from an inspection gets the guide\'s labour, discs and pads counted once', async () => {
    // front discs below their minimum: the inspection recommends front discs and front pads (required)
    const insp = await tech.post('/api/inspections', { vehicleId: 1, registration: 'LB12 OUR', odometer: '40 000 mi', wear: { discs: [{ position: 'front-left', thicknessReadingsMm: [22.4, 22.4, 22.4], minThicknessMm: 23 }] } })
    expect(insp.status, insp.text).toBe(201)
    const q = await tech.post('/api/quotes', { vehicleId: 1, ownerName: 'Lee Aubert', ownerEmail: ownerEmail(), inspectionId: insp.body.id })
    expect(q.status, q.text).toBe(201)
    const discsPads = (await hoursOf(tech, 'front_discs_pads')).hours
    const labour = q.body.lines.filter((l: Line) => l.kind === 'labour')
    // the pads are fitted within the disc job: one labour line with the disc job's hours, none for the pads
    expect(labour.map((l: Line) => [l.labourOperation, l.hours, l.guideHours])).toEqual([['front_discs_pads', discsPads, discsPads]])
    // the manager adjusts: the quote says the hours differ from the guide
    const changed = await manager.patch(`/api/quotes/${q.body.id}/lines/${labour[0].id}`, { hours: discsPads + 0.5 })
    expect(changed.status, changed.text).toBe(200)
    expect(changed.body.warnings.join(' ')).toMatch(new RegExp(`${discsPads + 0.5} h against the labour guide's ${discsPads} h`))
  })
})
