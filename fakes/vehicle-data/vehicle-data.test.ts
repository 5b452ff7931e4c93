/** The vehicle-data fake driven by the app's own client (server/services/vehicle-data/client.ts). */
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest'
import { fetchVehicleRecord, VehicleDataUnavailable, type VehicleDataConfig } from '../../server/services/vehicle-data/client'
import { createVehicleDataFake, type VehicleDataFake } from './server'
import { FAKE_VEHICLES } from './data'
import { readVin } from '../../shared/utils/vehicles/vin'
import { ukRegistrationAge } from '../../shared/utils/vehicles/registration'

let fake: VehicleDataFake
let config: VehicleDataConfig
let base: string
const mode = (body: unknown) => fetch(`${base}/_fake/mode`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) })

beforeAll(async () => {
  fake = createVehicleDataFake({ port: 0, apiKey: 'vd_unit' })
  const { port, url } = await fake.listen()
  base = url
  config = { protocol: 'http', host: '127.0.0.1', port, key: 'vd_unit', timeoutMs: 400 }
})
afterAll(() => fake.close())
beforeEach(async () => { await fetch(`${base}/_fake/reset`, { method: 'POST' }) })

describe('vehicle-data fake', () => {
  it('answers a demo registration, whatever its spacing, and null for an unknown one', async () => {
    const r = await fetchVehicleRecord(config, 'lm65 wrd')
    expect(r).toMatchObject({ registration: 'LM65WRD', make: 'KASKEL', model: 'VELL', yearOfManufacture: 2015, engineCapacityCc: 1968, vin: 'WK3VB2D18FT104472' })
    expect(await fetchVehicleRecord(config, 'ZZ99ZZZ')).toBeNull()
    expect(fake.state.requests.map((q) => q.status)).toEqual([200, 404])
  })

  it('holds invented vehicles whose VINs and marks agree with the published rules', () => {
    for (const v of FAKE_VEHICLES) {
      expect(readVin(v.vin).checkDigit, v.vin).toBe('valid')
      expect(readVin(v.vin, new Date('2026-12-01T00:00:00Z')).modelYears, v.vin).toContain(v.yearOfManufacture)
      const age = ukRegistrationAge(v.registration)!
      expect(v.firstRegistered >= age.from && v.firstRegistered <= age.to, v.registration).toBe(true)
    }
  })

  it('refuses a wrong key, and the client reports it as unavailable', async () => {
    await expect(fetchVehicleRecord({ ...config, key: 'wrong' }, 'LM65WRD')).rejects.toThrow(/refused our key/)
  })

  it('can be down, unavailable or slow; the client says which and never hangs', async () => {
    await mode({ mode: 'down' })
    await expect(fetchVehicleRecord(config, 'LM65WRD')).rejects.toBeInstanceOf(VehicleDataUnavailable)
    await mode({ mode: 'unavailable' })
    await expect(fetchVehicleRecord(config, 'LM65WRD')).rejects.toThrow(/status 503/)
    await mode({ mode: 'slow', delayMs: 2000 })
    const started = Date.now()
    await expect(fetchVehicleRecord(config, 'LM65WRD')).rejects.toThrow(/did not answer within 0.4 s/)
    expect(Date.now() - started).toBeLessThan(1500)
    await mode({ mode: 'normal' })
    expect(await fetchVehicleRecord(config, 'LM65WRD')).not.toBeNull()
  })

  it('checks its control input', async () => {
    const r = await mode({ mode: 'sideways' })
    expect(r.status).toBe(400)
    expect((await r.json()).error.message).toMatch(/normal, unavailable, down or slow/)
  })
})
