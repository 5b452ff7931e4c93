/**
 * Registration look-ups through the vehicle-data client and its local fake: a known mark mapped to the catalogue,
 * remembered per garage; an unknown one answered 404 with what the mark's age identifier tells, so the manual
 * finder narrows the year; the service down, unavailable or slow answered 503 with a message, the finder still
 * working.
 */
import { afterEach, beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { Client, as, env, people } from '../support/api'
import { fakeMode, fakeRequests } from '../support/garage-vehicles'

await setup({ host: env().baseUrl })

let manager: Client, tech: Client, other: Client, counter: Client
beforeAll(async () => {
  ;[manager, tech, other, counter] = await Promise.all([as(people.manager), as(people.technician), as(people.otherManager), as(people.counter)])
})
afterEach(() => fakeMode('normal'))

const asked = async (registration: string) => (await fakeRequests()).filter((r) => r.registration === registration).length

describe('a registration the service knows', () => {
  it('is mapped to the one catalogue vehicle that matches make, model, year, engine and fuel', async () => {
    const r = await tech.get('/api/registrations/lm65%20wrd')
    expect(r.status, r.text).toBe(200)
    expect(r.body).toMatchObject({
      registration: 'LM65WRD', cached: false,
      reported: { make: 'Kaskel', model: 'Vell', yearOfManufacture: 2015, engineCc: 1968, fuel: 'diesel', vin: 'WK3VB2D18FT104472' },
      age: { format: 'current', from: '2015-09', to: '2016-02' },
    })
    expect(r.body.candidates).toHaveLength(1)
    expect(r.body.vehicleId).toBe(r.body.candidates[0].id)
    expect(r.body.candidates[0].label).toMatch(/^Kaskel Vell V3/)
  })

  it('offers every candidate when the catalogue has two variants alike', async () => {
    const r = await tech.get('/api/registrations/WF21KNE') // Quillan Dray: two 2.0 diesel variants
    expect(r.status).toBe(200)
    expect(r.body.candidates.length).toBe(2)
    expect(r.body.vehicleId).toBeNull()
  })

  it('is remembered per garage: asked again, the service is not; another garage asks it afresh', async () => {
    await manager.get('/api/registrations/YT68KDM')
    const before = await asked('YT68KDM')
    const again = await tech.get('/api/registrations/YT68KDM') // same garage, another person
    expect(again.body.cached).toBe(true)
    expect(await asked('YT68KDM')).toBe(before)
    const theirs = await other.get('/api/registrations/YT68KDM')
    expect(theirs.body.cached).toBe(false)
    expect(await asked('YT68KDM')).toBe(before + 1)
  })
})

describe('when the service has nothing', () => {
  it('an unknown registration is 404 with what the mark tells, and the finder works for that year', async () => {
    const r = await tech.get('/api/registrations/EV16XKD')
    expect(r.status).toBe(404)
    expect(r.body.message).toMatch(/does not know this registration.*make, model and year/)
    // DVLA INF104: "16" = first registered March to August 2016
    expect(r.body.data.fallback).toEqual({ registration: 'EV16XKD', age: { format: 'current', from: '2016-03', to: '2016-08' }, years: [2016] })
    const finder = await tech.get('/api/vehicles/facets?make=Kaskel&model=Vell&year=2016')
    expect(finder.status).toBe(200)
    expect(finder.body.variants.length).toBeGreaterThan(0)
  })

  it('a service that is down answers 503 with the message to show', async () => {
    await fakeMode('down')
    const r = await tech.get('/api/registrations/BX70LRT')
    expect(r.status).toBe(503)
    expect(r.body.message).toMatch(/cannot be reached.*make, model and year/)
    expect(r.body.data.fallback.age).toEqual({ format: 'current', from: '2020-09', to: '2021-02' })
  })

  it('a service that says it is unavailable answers 503 too', async () => {
    await fakeMode('unavailable')
    const r = await tech.get('/api/registrations/BX70LRT')
    expect(r.status).toBe(503)
    expect(r.body.message).toMatch(/not answering properly/)
  })

  it('a slow service is cut off at the configured time-out (1.5 s in the tests) and answers 503', async () => {
    await fakeMode('slow', 5_000)
    const started = Date.now()
    const r = await tech.get('/api/registrations/BX70LRT')
    const took = Date.now() - started
    expect(r.status).toBe(503)
    expect(r.body.message).toMatch(/did not answer within 1.5 s/)
    expect(took).toBeGreaterThanOrEqual(1_400)
    expect(took).toBeLessThan(4_500)
  })

  it('failures are not remembered: once the service is back the same mark is found', async () => {
    await fakeMode('unavailable')
    expect((await tech.get('/api/registrations/NG14DXA')).status).toBe(503)
    await fakeMode('normal')
    const r = await tech.get('/api/registrations/NG14DXA')
    expect(r.status).toBe(200)
    expect(r.body.cached).toBe(false)
  })
})

describe('input and roles', () => {
  it('a malformed registration is 422 naming registration; distributor staff and the signed-out are refused', async () => {
    const bad = await tech.get('/api/registrations/AB!12')
    expect(bad.status).toBe(422)
    expect(bad.body.data.fields.registration).toMatch(/letters and digits/)
    expect((await counter.get('/api/registrations/LM65WRD')).status).toBe(403)
    expect((await new Client().get('/api/registrations/LM65WRD')).status).toBe(401)
  })
})
