/**
 * Catalogue e2e: who may see it, the vehicle finder's facets, the vehicle record and fitment narrowed by option
 * answers.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { as, Client, env, people } from '../support/api'

await setup({ host: env().baseUrl })

let mgr: Client
beforeAll(async () => { mgr = await as(people.manager) })

interface Part { sku: string; type: string; specs: Record<string, unknown>; qualifiers: Record<string, string>; fit: string; note: string; oeDifferences?: { field: string; oe: unknown; part: unknown }[] }
interface PartsAnswer {
  vehicle: { id: number; mcBoreMm: number }
  questions: { key: string; values: { value: string; count: number }[] }[]
  answers: { key: string; value: string }[]
  groups: { axle: string; types: { type: string; parts: Part[] }[] }[]
  counts: { shown: number; excluded: number; total: number }
}
const partsOf = (a: PartsAnswer, axle?: string, type?: string) =>
  a.groups.filter((g) => !axle || g.axle === axle).flatMap((g) => g.types.filter((t) => !type || t.type === type).flatMap((t) => t.parts))

async function variants(make: string, model: string, year: number) {
  const r = await mgr.get(`/api/vehicles/facets?make=${make}&model=${model}&year=${year}`)
  expect(r.status).toBe(200)
  return r.body.variants as { vehicleId: number; generation: string; questionCount: number }[]
}

describe('who sees the catalogue', () => {
  it.each(['/api/vehicles/facets', '/api/vehicles/1', '/api/vehicles/1/parts', '/api/parts', '/api/parts/KP-1001'])('anonymous gets 401 from %s', async (path) => {
    const r = await new Client().get(path)
    expect(r.status).toBe(401)
    expect(r.body.message).toMatch(/sign in/i)
  })

  it('a garage that is not approved gets 403', async () => {
    const pending = await as(people.pendingManager)
    const r = await pending.get('/api/parts?q=disc')
    expect(r.status).toBe(403)
  })

  it('every signed-in role of an approved organisation may search', async () => {
    for (const who of [people.admin, people.counter, people.manager, people.technician]) {
      expect((await (await as(who)).get('/api/parts?q=disc&pageSize=1')).status).toBe(200)
    }
  })
})

describe('GET /api/vehicles/facets', () => {
  it('counts vehicles at every step from make to engine', async () => {
    const all = await mgr.get('/api/vehicles/facets')
    expect(all.body.makes.length).toBeGreaterThanOrEqual(6)
    expect(all.body.models).toBeNull()
    const veltra = all.body.makes.find((m: { value: string }) => m.value === 'Veltra')
    const make = await mgr.get('/api/vehicles/facets?make=veltra')
    expect(make.body.selection.make).toBe('Veltra') // names compare without regard to case
    expect(make.body.models.reduce((n: number, m: { count: number }) => n + m.count, 0)).toBe(veltra.count)
    const model = await mgr.get('/api/vehicles/facets?make=Veltra&model=Pennon')
    const y2020 = model.body.years.find((y: { value: number }) => y.value === 2020)
    const v = await variants('Veltra', 'Pennon', 2020)
    expect(v.length).toBe(y2020.count)
    expect(v.every((x) => x.generation === 'Mk2')).toBe(true)
  })

  it('wants the steps in order (422 naming the missing one) and numbers for years', async () => {
    const a = await mgr.get('/api/vehicles/facets?model=Pennon')
    expect(a.status).toBe(422)
    expect(a.body.data.fields).toHaveProperty('make')
    const b = await mgr.get('/api/vehicles/facets?make=Veltra&model=Pennon&year=soon')
    expect(b.status).toBe(422)
    expect(b.body.data.fields).toHaveProperty('year')
  })
})

describe('GET /api/vehicles/:id', () => {
  it('carries what the hydraulic chain needs', async () => {
    const [v] = await variants('Veltra', 'Pennon', 2020)
    const r = await mgr.get(`/api/vehicles/${v!.vehicleId}`)
    expect(r.status).toBe(200)
    expect(r.body).toMatchObject({ make: 'Veltra', model: 'Pennon', mcBoreMm: expect.any(Number), pedalRatio: expect.any(Number), circuitSplit: expect.stringMatching(/diagonal|front-rear/), kerbMassKg: expect.any(Number), tyreSize: expect.any(String) })
    const front = r.body.brakes.filter((b: { axle: string }) => b.axle === 'front')
    expect(front.map((b: { discDiameterMm: number }) => b.discDiameterMm).sort()).toEqual([280, 300])
    expect(front.map((b: { qualifiers: Record<string, string> }) => b.qualifiers.front_disc_diameter_mm).sort()).toEqual(['280', '300'])
    expect(front.every((b: { caliperType: string; pistonDiametersMm: number[] }) => b.caliperType && b.pistonDiametersMm.length)).toBe(true)
    expect(r.body.options.map((o: { key: string }) => o.key)).toContain('front_disc_diameter_mm')
  })

  it('404 with a message for an unknown vehicle, 422 for a malformed id', async () => {
    const r = await mgr.get('/api/vehicles/999999')
    expect(r.status).toBe(404)
    expect(r.body.message).toBe('Vehicle 999999 not found.')
    expect((await mgr.get('/api/vehicles/999999/parts')).status).toBe(404)
    const bad = await mgr.get('/api/vehicles/abc/parts')
    expect(bad.status).toBe(422)
    expect(bad.body.data.fields).toHaveProperty('id')
  })
})

describe('GET /api/vehicles/:id/parts with option questions', () => {
  it('asks the disc-size question; answering it removes the parts that do not fit', async () => {
    const [v] = await variants('Veltra', 'Pennon', 2020)
    const open = (await mgr.get(`/api/vehicles/${v!.vehicleId}/parts`)).body as PartsAnswer
    const q = open.questions.find((x) => x.key === 'front_disc_diameter_mm')!
    expect(q.values.map((x) => x.value)).toEqual(['280', '300'])
    const discsBefore = partsOf(open, 'front', 'disc')
    expect(new Set(discsBefore.map((p) => p.specs.diameterMm))).toEqual(new Set([280, 300]))
    expect(discsBefore.every((p) => p.fit === 'open')).toBe(true)

    const r = await mgr.get(`/api/vehicles/${v!.vehicleId}/parts?opt.front_disc_diameter_mm=300`)
    expect(r.status).toBe(200)
    const answered = r.body as PartsAnswer
    expect(answered.answers).toEqual([expect.objectContaining({ key: 'front_disc_diameter_mm', value: '300' })])
    expect(answered.questions.map((x) => x.key)).not.toContain('front_disc_diameter_mm')
    const discs = partsOf(answered, 'front', 'disc')
    expect(discs.length).toBeGreaterThan(0)
    expect(discs.every((p) => p.specs.diameterMm === 300 && p.fit === 'fits')).toBe(true)
    for (const p of partsOf(answered)) if (p.qualifiers.front_disc_diameter_mm) expect(p.qualifiers.front_disc_diameter_mm).toBe('300')
    // the parts that only fit 280 mm discs are gone, and the counts add up
    const rows = partsOf(open)
    const only280 = [...new Set(rows.map((p) => p.sku))].filter((sku) => rows.filter((p) => p.sku === sku).every((p) => p.qualifiers.front_disc_diameter_mm === '280'))
    expect(only280.length).toBeGreaterThan(0)
    const shown = new Set(partsOf(answered).map((p) => p.sku))
    expect(only280.filter((sku) => shown.has(sku))).toEqual([])
    expect(answered.counts.excluded).toBe(partsOf(open).filter((p) => p.qualifiers.front_disc_diameter_mm === '280').length)
    expect(answered.counts.shown + answered.counts.excluded).toBe(open.counts.total)
    expect(q.values.find((x) => x.value === '300')!.count).toBe(answered.counts.shown)
  })

  it('keeps calipers and pads consistent with the answer and flags the uprated caliper whose piston differs from OE', async () => {
    const [v] = await variants('Veltra', 'Pennon', 2020)
    const a = (await mgr.get(`/api/vehicles/${v!.vehicleId}/parts?opt.front_disc_diameter_mm=280`)).body as PartsAnswer
    const calipers = partsOf(a, 'front', 'caliper')
    const oe = calipers.filter((c) => !c.oeDifferences)
    expect(oe.every((c) => JSON.stringify(c.specs.pistonDiametersMm) === '[54]')).toBe(true)
    const uprated = calipers.filter((c) => c.oeDifferences)
    expect(uprated.length).toBe(2) // left and right
    expect(uprated[0]!.oeDifferences).toEqual([expect.objectContaining({ field: 'pistonDiametersMm', oe: [54], part: [57] })])
    expect(uprated[0]!.note).toMatch(/57 mm instead of the original 54 mm/)
    // pads fit the calipers: one pad shape on the front axle once the disc size is known
    const shapes = new Set([...partsOf(a, 'front', 'pad_set'), ...calipers].map((p) => p.specs.padShape))
    expect(shapes.size).toBe(1)
  })

  it('lists the Quillan Dray uprated master cylinder with its bore difference', async () => {
    const [v] = await variants('Quillan', 'Dray', 2020)
    const a = (await mgr.get(`/api/vehicles/${v!.vehicleId}/parts`)).body as PartsAnswer
    expect(a.vehicle.mcBoreMm).toBe(22.22)
    const mcs = partsOf(a, 'all', 'master_cylinder')
    expect(mcs.filter((m) => !m.oeDifferences).every((m) => m.specs.boreMm === 22.22)).toBe(true)
    expect(mcs.find((m) => m.oeDifferences)).toMatchObject({ specs: expect.objectContaining({ boreMm: 25.4 }), oeDifferences: [expect.objectContaining({ field: 'boreMm', oe: 22.22, part: 25.4 })] })
  })

  it('422 naming opt.<key> for a value the vehicle does not offer or an option it lacks', async () => {
    const [v] = await variants('Veltra', 'Pennon', 2020)
    const bad = await mgr.get(`/api/vehicles/${v!.vehicleId}/parts?opt.front_disc_diameter_mm=290`)
    expect(bad.status).toBe(422)
    expect(bad.body.data.fields['opt.front_disc_diameter_mm']).toMatch(/280, 300/)
    const none = await mgr.get(`/api/vehicles/${v!.vehicleId}/parts?opt.colour=red`)
    expect(none.status).toBe(422)
    expect(Object.keys(none.body.data.fields)).toEqual(['opt.colour'])
  })
})
