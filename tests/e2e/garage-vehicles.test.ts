/**
 * A garage's register of customers and vehicles: who may use it, each garage sees only its own (404 for another
 * garage's customer or vehicle), bad input refused beside its field and never stored, a VIN unique within a garage
 * but not across garages, search by registration, VIN and owner, the VIN read, and quotes and inspections attached
 * to a vehicle landing in its history.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { Client, as, env, people } from '../support/api'
import { addVehicle, newRegistration, newVin } from '../support/garage-vehicles'

await setup({ host: env().baseUrl })

let manager: Client, tech: Client, other: Client, counter: Client, anon: Client
/** Kaskel Vell V3 2.0 diesel: asks rear brake (disc/drum) and parking brake (cable/electric) */
let vellId: number

beforeAll(async () => {
  ;[manager, tech, other, counter] = await Promise.all([as(people.manager), as(people.technician), as(people.otherManager), as(people.counter)])
  anon = new Client()
  const facets = await tech.get('/api/vehicles/facets?make=Kaskel&model=Vell&year=2016')
  vellId = facets.body.variants.find((v: { engineCode: string }) => v.engineCode.endsWith('D20')).vehicleId
})

describe('who may use the register', () => {
  it('garage people may; distributor staff may not; nobody signed out', async () => {
    expect((await tech.get('/api/garage/vehicles')).status).toBe(200)
    expect((await manager.get('/api/garage/customers')).status).toBe(200)
    expect((await counter.get('/api/garage/vehicles')).status).toBe(403)
    expect((await counter.post('/api/garage/vehicles', { registration: newRegistration() })).status).toBe(403)
    expect((await anon.get('/api/garage/vehicles')).status).toBe(401)
    expect((await anon.get('/api/garage/customers')).status).toBe(401)
  })
})

describe('adding and changing a vehicle', () => {
  it('stores a registration and VIN normalised, the owner with consent stamped, answers and a reading', async () => {
    const reg = newRegistration()
    const vin = newVin()
    const v = await addVehicle(tech, {
      registration: `${reg.slice(0, 4).toLowerCase()} ${reg.slice(4).toLowerCase()}`, vin: vin.toLowerCase(), vehicleId: vellId,
      answers: { rear_brake: 'DRUM' }, built: '2015-10',
      customer: { name: 'Wren Castell', email: 'WREN.castell@owners.test', reminderConsent: true, consentSource: 'asked at the counter' },
      odometer: { reading: 61_200, unit: 'mi' },
    })
    expect(v).toMatchObject({
      registration: `${reg.slice(0, 4)} ${reg.slice(4)}`, vin, answers: { rear_brake: 'drum' }, built: '2015-10',
      customer: { name: 'Wren Castell', email: 'wren.castell@owners.test', reminderConsent: true, consentSource: 'asked at the counter' },
      lastOdometer: { reading: 61_200, unit: 'mi', source: 'recorded' },
      answerLabels: [{ key: 'rear_brake', label: expect.any(String), value: 'drum' }],
      vinReading: { valid: true, checkDigit: 'valid', maker: { make: 'Kaskel' }, modelYears: [1985, 2015] },
    })
    expect(Date.now() - Date.parse(v.customer.consentChangedAt)).toBeLessThan(60_000)
    // straight to the parts that fit, with the remembered answers, VIN and build month applied
    expect(v.partsQuery).toMatchObject({ make: 'Kaskel', model: 'Vell', vehicle: String(vellId), 'opt.rear_brake': 'drum', 'opt.vin': vin, 'opt.built': '2015-10' })
    const parts = await tech.get(`/api/vehicles/${vellId}/parts?${new URLSearchParams(Object.entries(v.partsQuery).filter(([k]) => k.startsWith('opt.')) as [string, string][])}`)
    expect(parts.status).toBe(200)
    expect(parts.body.answers.map((a: { key: string }) => a.key).sort()).toEqual(['built', 'rear_brake', 'vin'])

    const changed = await tech.patch(`/api/garage/vehicles/${v.id}`, { answers: { rear_brake: 'drum', parking_brake: 'cable' }, odometer: { reading: 64_000, unit: 'mi' } })
    expect(changed.status).toBe(200)
    expect(changed.body).toMatchObject({ answers: { rear_brake: 'drum', parking_brake: 'cable' }, lastOdometer: { reading: 64_000 } })
    const withdrawn = await manager.patch(`/api/garage/vehicles/${v.id}`, { customer: { name: 'Wren Castell', email: 'wren.castell@owners.test', reminderConsent: false, consentSource: 'asked by phone' } })
    expect(withdrawn.body.customer).toMatchObject({ reminderConsent: false, consentSource: 'asked by phone' })
  })

  it('refuses malformed input beside its field and stores nothing', async () => {
    const reg = newRegistration()
    const before = (await manager.get('/api/garage/vehicles')).body.meta.total
    const cases: [Record<string, unknown>, string, RegExp][] = [
      [{ registration: reg, vin: 'WK3VB2D18FT10447' }, 'vin', /17 characters/],
      [{ registration: reg, vin: 'WK3VB2D18FTO04472' }, 'vin', /never contains O/],
      // a North American VIN (check digit compulsory, 49 CFR 565) with a wrong 9th character
      [{ registration: reg, vin: '5KKVB2D10FT104472' }, 'vin', /check digit/],
      [{ registration: 'AB-12!' }, 'registration', /only letters and digits/],
      [{ customer: { name: 'No Car' } }, 'registration', /registration or the VIN/],
      [{ registration: reg, vehicleId: vellId, answers: { rear_brake: 'ceramic' } }, 'answers.rear_brake', /disc, drum/],
      [{ registration: reg, answers: { rear_brake: 'drum' } }, 'vehicleId', /Choose the vehicle/],
      [{ registration: reg, customer: { name: 'Ann Ode', reminderConsent: true, consentSource: 'asked' } }, 'customer.email', /e-mail/],
      [{ registration: reg, colour: 'red' }, 'colour', /./],
    ]
    for (const [body, field, message] of cases) {
      const r = await manager.post('/api/garage/vehicles', body)
      expect(r.status, JSON.stringify(body)).toBe(422)
      expect(r.body.data.fields[field], JSON.stringify(r.body.data.fields)).toMatch(message)
    }
    expect((await manager.get('/api/garage/vehicles')).body.meta.total).toBe(before)
  })

  it('keeps a VIN and a registration to one vehicle per garage, while another garage may hold the same car', async () => {
    const vin = newVin()
    const reg = newRegistration()
    await addVehicle(manager, { registration: reg, vin })
    const twiceVin = await manager.post('/api/garage/vehicles', { registration: newRegistration(), vin })
    expect(twiceVin.status).toBe(409)
    expect(twiceVin.body.data.fields.vin).toMatch(/another of your vehicles/)
    const twiceReg = await tech.post('/api/garage/vehicles', { registration: reg.toLowerCase() })
    expect(twiceReg.status).toBe(409)
    expect(twiceReg.body.data.fields.registration).toMatch(/another of your vehicles/)
    const elsewhere = await other.post('/api/garage/vehicles', { registration: reg, vin })
    expect(elsewhere.status).toBe(201)
  })
})

describe('each garage sees only its own', () => {
  let mine: { id: number; customer: { id: number } }
  beforeAll(async () => {
    mine = await addVehicle(manager, { registration: newRegistration(), customer: { name: 'Perrin Lodge', phone: '07700 900 901' } })
  })

  it('answers 404 for another garage\'s vehicle and customer, whatever the verb', async () => {
    expect((await other.get(`/api/garage/vehicles/${mine.id}`)).status).toBe(404)
    expect((await other.patch(`/api/garage/vehicles/${mine.id}`, { notes: 'mine now' })).status).toBe(404)
    expect((await other.get(`/api/garage/vehicles/${mine.id}/history`)).status).toBe(404)
    expect((await other.get(`/api/garage/customers/${mine.customer.id}`)).status).toBe(404)
    expect((await other.post('/api/garage/vehicles', { registration: newRegistration(), customerId: mine.customer.id })).status).toBe(404)
    expect((await other.post('/api/quotes', { vehicleId: 1, ownerName: 'X', ownerEmail: 'x@owners.test', garageVehicleId: mine.id })).status).toBe(404)
    expect((await manager.get(`/api/garage/customers/${mine.customer.id}`)).status).toBe(200)
    expect((await manager.get('/api/garage/vehicles/999999')).status).toBe(404)
  })

  it('never lists or finds another garage\'s records', async () => {
    const theirs = await other.get('/api/garage/vehicles?q=Perrin')
    expect(theirs.body.meta.total).toBe(0)
    const customers = await other.get('/api/garage/customers?q=Perrin')
    expect(customers.body.meta.total).toBe(0)
    expect((await manager.get('/api/garage/customers?q=perrin')).body.data.map((c: { name: string }) => c.name)).toContain('Perrin Lodge')
  })
})

describe('finding a car', () => {
  it('by registration typed any way, by the end of the VIN, by the owner\'s name', async () => {
    expect((await tech.get('/api/garage/vehicles?q=lm65 wrd')).body.data[0]).toMatchObject({ registration: 'LM65 WRD', owner: { name: 'Bryony Tallis' } })
    expect((await tech.get('/api/garage/vehicles?q=104472')).body.data.map((v: { registration: string }) => v.registration)).toContain('LM65 WRD')
    expect((await tech.get('/api/garage/vehicles?q=tallis')).body.data.map((v: { registration: string }) => v.registration)).toEqual(['LM65 WRD'])
    const page = await tech.get('/api/garage/vehicles?pageSize=2')
    expect(page.body.meta).toMatchObject({ page: 1, pageSize: 2 })
    expect(page.body.data).toHaveLength(2)
  })
})

describe('GET /api/vin/:vin', () => {
  it('reads the check digit, model years, maker and catalogue candidates', async () => {
    const r = await tech.get('/api/vin/WK3VB2D18FT104472')
    expect(r.status).toBe(200)
    expect(r.body).toMatchObject({ valid: true, checkDigit: 'valid', modelYears: [1985, 2015], maker: { wmi: 'WK3', make: 'Kaskel', country: 'Germany' } })
    expect(r.body.candidates.length).toBeGreaterThan(0)
    expect(r.body.candidates.every((c: { make: string; yearFrom: number; yearTo: number | null }) => c.make === 'Kaskel' && c.yearFrom <= 2015 && (c.yearTo ?? 9999) >= 2015)).toBe(true)
    // Europe: a mismatching 9th character is a warning, not an error
    expect((await tech.get('/api/vin/WK3VB2D10FT104472')).body).toMatchObject({ valid: true, checkDigit: 'not_used' })
    // North America: it is an error
    expect((await tech.get('/api/vin/5KKVB2D10FT104472')).body).toMatchObject({ valid: false, checkDigit: 'invalid', candidates: [] })
    expect((await tech.get('/api/vin/5KKVB2D15FT104472')).body).toMatchObject({ valid: true, checkDigit: 'valid', maker: { make: 'Kaskel', country: 'United States' } })
  })

  it('answers 422 naming vin for a malformed one', async () => {
    const r = await tech.get('/api/vin/WK3VB2D18FTQ04472')
    expect(r.status).toBe(422)
    expect(r.body.data.fields.vin).toMatch(/never contains Q/)
    expect((await anon.get('/api/vin/WK3VB2D18FT104472')).status).toBe(401)
  })
})

describe('quotes and inspections attach to the vehicle and make its history', () => {
  it('lists the inspection, its odometer reading and the quote, newest first', async () => {
    const v = await addVehicle(manager, { registration: newRegistration(), vehicleId: vellId, customer: { name: 'Hollis Varga', email: 'hollis.varga@owners.test' } })
    const wear = { pads: [{ axle: 'front', innerMm: 6, outerMm: 6 }] }
    const insp = await tech.post('/api/inspections', { vehicleId: vellId, registration: v.registration, odometer: '70 120 mi', answers: { rear_brake: 'drum' }, wear, garageVehicleId: v.id })
    expect(insp.status, insp.text).toBe(201)
    const quote = await tech.post('/api/quotes', { vehicleId: vellId, registration: v.registration, ownerName: 'Hollis Varga', ownerEmail: 'hollis.varga@owners.test', garageVehicleId: v.id })
    expect(quote.status, quote.text).toBe(201)
    const h = await manager.get(`/api/garage/vehicles/${v.id}/history`)
    expect(h.status).toBe(200)
    expect(h.body.data.map((e: { kind: string }) => e.kind).sort()).toEqual(['inspection', 'odometer', 'quote'])
    expect(h.body.data.find((e: { kind: string }) => e.kind === 'odometer')).toMatchObject({ reading: 70_120, unit: 'mi', source: 'inspection' })
    expect(h.body.data.find((e: { kind: string }) => e.kind === 'quote')).toMatchObject({ id: quote.body.id, status: 'draft' })
    expect((await tech.post('/api/inspections', { vehicleId: vellId, wear, garageVehicleId: 999_999 })).status).toBe(404)
  })
})

describe('VIN-pattern and build-date breakpoints narrow the parts list', () => {
  type Part = { sku: string; type: string; side: string; fit: string; dependsOn?: string[] }
  const partsOf = (body: { groups: { axle: string; types: { parts: Part[] }[] }[] }, axle?: string) =>
    body.groups.filter((g) => !axle || g.axle === axle).flatMap((g) => g.types.flatMap((t) => t.parts))

  it('keeps a breakpoint fitment open until the car is identified, then fits or leaves it out', async () => {
    const vell = partsOf((await tech.get(`/api/vehicles/${vellId}/parts`)).body)
    const orrinId = (await tech.get('/api/vehicles/facets?make=Kaskel&model=Orrin&year=2016')).body.variants[0].vehicleId
    const hose = partsOf((await tech.get(`/api/vehicles/${orrinId}/parts`)).body, 'front').find((p) => p.type === 'hose' && !vell.some((v) => v.sku === p.sku))!
    expect(hose).toBeTruthy()
    // counter staff record that petrol-plant cars (7th character P) built from March 2016 take this hose
    const bad = await counter.post(`/api/parts/${hose.sku}/fitments`, { vehicleId: vellId, axle: 'front', side: hose.side, qualifiers: { vin: 'WK3 VB', built_from: 'March 2016' }, note: '' })
    expect(bad.status).toBe(422)
    expect(Object.keys(bad.body.data.fields).sort()).toEqual(['qualifiers.built_from', 'qualifiers.vin'])
    const added = await counter.post(`/api/parts/${hose.sku}/fitments`, { vehicleId: vellId, axle: 'front', side: hose.side, qualifiers: { vin: 'WK3VB*P', built_from: '2016-03' }, note: 'Petrol-plant cars from March 2016' })
    expect(added.status, added.text).toBe(201)

    const listed = async (q: string) => partsOf((await tech.get(`/api/vehicles/${vellId}/parts${q}`)).body).find((p) => p.sku === hose.sku)
    expect(await listed('')).toMatchObject({ fit: 'open', dependsOn: ['vin', 'built_from'] })
    expect(await listed('?opt.vin=WK3VB2D18FT104472')).toBeUndefined()
    expect(await listed('?opt.vin=WK3VB2P10GT104472&opt.built=2015-11')).toBeUndefined()
    expect(await listed('?opt.vin=WK3VB2P10GT104472&opt.built=2016-03')).toMatchObject({ fit: 'fits' })
    expect(await listed('?opt.vin=WK3VB2P10GT104472')).toMatchObject({ fit: 'open', dependsOn: ['built_from'] })
  })
})
