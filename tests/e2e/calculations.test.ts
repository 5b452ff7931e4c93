/**
 * Brake calculation routes, the bore-check prefill and inspections, against the built server.
 * The server's answers must equal the library's for the same input (shared/utils/brake, unit-tested against
 * published values); the checks that compare numbers name their outside source (../shared/check-values.md).
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { Client, as, env, people } from '../support/api'
import {
  KPA_PER_PSI, N_PER_LBF, computeHydraulics, computeWear,
  type HydraulicsInputRaw, type WearInputRaw,
} from '#shared/utils/brake'
import { BORE_MISMATCH } from '../../server/seed/catalogue-data'

await setup({ host: env().baseUrl })

/** JSON round trip: what the route's answer looks like once serialised. */
const viaJson = <T>(v: T): T => JSON.parse(JSON.stringify(v))
const rel = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected)

/** The published worked example (hotrodheaven.com brakes tech page, check-values.md [PUB]): 100 lbf, 6:1, no booster. */
function worked(boreMm: number): HydraulicsInputRaw {
  return {
    pedalForceN: 100 * N_PER_LBF, pedalRatio: 6, boosterRatio: 1,
    masterCylinder: { boreMm }, split: 'front-rear',
    axles: {
      front: { kind: 'disc', caliper: 'floating', pistonDiametersMm: [54], discDiameterMm: 280, frictionCoefficient: 0.4, tyreSize: '205/55 R16' },
      rear: { kind: 'drum', wheelCylinderBoreMm: 19.05, drumDiameterMm: 228.6, brakeFactor: 2, tyreSize: '205/55 R16' },
    },
  }
}

const wear: WearInputRaw = {
  discs: [{ position: 'front-left', thicknessReadingsMm: [22.9, 23.1, 22.95, 23.0], minThicknessMm: 23, runoutMm: 0.03 }],
  pads: [{ axle: 'front', innerMm: 1.4, outerMm: 4 }],
  drums: [{ position: 'rear-left', diameterMm: 230.5, maxDiameterMm: 230.1 }],
  fluid: { gradeInSystem: 'DOT 4', gradeToAdd: 'DOT 5', waterPercent: 3 },
}

let tech: Client, counter: Client, manager: Client, otherTech: Client, anon: Client
beforeAll(async () => {
  ;[tech, counter, manager, otherTech] = await Promise.all([as(people.technician), as(people.counter), as(people.manager), as(people.otherTechnician)])
  anon = new Client()
})

describe('POST /api/calculations/hydraulics', () => {
  it('refuses an anonymous caller with 401 before looking at the body', async () => {
    expect((await anon.post('/api/calculations/hydraulics', worked(25.4))).status).toBe(401)
    expect((await anon.post('/api/calculations/hydraulics', { nonsense: true })).status).toBe(401)
  })

  it('returns exactly what the library computes, for garage and distributor roles', async () => {
    const input = { ...worked(22.225), replacement: { masterCylinder: { boreMm: 25.4 } } }
    for (const c of [tech, counter]) {
      const r = await c.post('/api/calculations/hydraulics', input)
      expect(r.status).toBe(200)
      expect(r.body).toEqual(viaJson(computeHydraulics(input)))
    }
  })

  it('line pressure matches the published worked example for 1, 7/8 and 1-1/8 in bores', async () => {
    // hotrodheaven.com brakes tech page [PUB] (π = 3.14 there: compare within 0.1 %): 763.9 / 997.8 / 603.6 psi
    for (const [boreIn, psi] of [[1, 763.9], [7 / 8, 997.8], [1.125, 603.6]] as const) {
      const r = await tech.post('/api/calculations/hydraulics', worked(boreIn * 25.4))
      expect(r.status).toBe(200)
      expect(rel(r.body.original.linePressureKPa / KPA_PER_PSI, psi)).toBeLessThan(0.001)
    }
  })

  it('a 7/8 in -> 1 in master cylinder scales pressure by 0.7656 and says the pedal gets harder', async () => {
    // check-values.md, derived from P = F / A: (7/8)² = 0.765625
    const r = await tech.post('/api/calculations/hydraulics', { ...worked(22.225), replacement: { masterCylinder: { boreMm: 25.4 } } })
    expect(rel(1 + r.body.comparison.linePressurePercent / 100, 0.765625)).toBeLessThan(1e-9)
    expect(r.body.findings.map((f: { code: string }) => f.code)).toContain('pedal-gain-change')
    const order = { danger: 0, warning: 1, info: 2 } as Record<string, number>
    const ranks = r.body.findings.map((f: { severity: string }) => order[f.severity])
    expect(ranks).toEqual([...ranks].sort((a, b) => a - b))
  })

  it('impossible input is 422 naming each field, and nothing is computed', async () => {
    const bad = worked(0) as Record<string, any>
    bad.axles.front.frictionCoefficient = 1.5
    bad.axles.front.pistonDiametersMm = [54, -2]
    delete bad.axles.rear
    bad.replacement = { axles: { front: { kind: 'drum' } } }
    const r = await tech.post('/api/calculations/hydraulics', bad)
    expect(r.status).toBe(422)
    const fields = r.body.data.fields as Record<string, string>
    expect(fields['masterCylinder.boreMm']).toMatch(/greater than 0/)
    expect(fields['axles.front.frictionCoefficient']).toMatch(/between 0\.05 and 1\.0/)
    expect(fields['axles.front.pistonDiametersMm[1]']).toMatch(/greater than 0/)
    expect(fields['axles.rear']).toMatch(/rear axle is required/)
    expect(fields['replacement.axles.front.wheelCylinderBoreMm']).toMatch(/required/)
    expect(r.body.message).toMatch(/masterCylinder\.boreMm/)
    expect(r.body).not.toHaveProperty('original')
  })

  it('an empty or unreadable body is 422, not 500', async () => {
    const empty = await tech.post('/api/calculations/hydraulics', {})
    expect(empty.status).toBe(422)
    expect(Object.keys(empty.body.data.fields)).toEqual(expect.arrayContaining(['pedalForceN', 'masterCylinder', 'axles']))
    const garbage = await tech.request('/api/calculations/hydraulics', { method: 'POST', headers: { 'content-type': 'application/json' }, body: '{"pedalForceN": 3' })
    expect(garbage.status).toBe(422)
  })
})

describe('POST /api/calculations/wear', () => {
  it('refuses an anonymous caller with 401', async () => {
    expect((await anon.post('/api/calculations/wear', wear)).status).toBe(401)
  })

  it('returns the library verdicts: a verdict per item and the part types to replace', async () => {
    const r = await tech.post('/api/calculations/wear', wear)
    expect(r.status).toBe(200)
    expect(r.body).toEqual(viaJson(computeWear(wear)))
    const verdict = (id: string) => r.body.items.find((i: { id: string }) => i.id === id)?.verdict
    // disc below the stamped minimum: replace (check-values.md, Maryland COMAR 11.19.03.05 C [STD])
    expect(verdict('disc:front-left:thickness')).toBe('fail')
    // under 1.5 mm of pad: a UK roadworthiness-test failure (check-values.md [PUB])
    expect(verdict('pad:front:inner')).toBe('fail')
    expect(verdict('pad:front:outer')).toBe('ok')
    // DOT 5 is silicone and must not be mixed with DOT 4 (FMVSS No. 116, 49 CFR 571.116 [STD])
    expect(verdict('fluid:compatibility')).toBe('fail')
    // 3 % water or more: replace (check-values.md [CP])
    expect(verdict('fluid:water')).toBe('fail')
    expect(r.body.overall).toBe('fail')
    expect(r.body.recommendedParts).toEqual(expect.arrayContaining([
      expect.objectContaining({ axle: 'front', partType: 'discs' }),
      expect.objectContaining({ axle: 'front', partType: 'pads' }),
      expect.objectContaining({ axle: 'system', partType: 'brake-fluid' }),
    ]))
  })

  it('impossible input is 422 naming the field', async () => {
    const r = await tech.post('/api/calculations/wear', { pads: [{ axle: 'middle', innerMm: -1, outerMm: 3 }], discs: [{ position: 'front-left', thicknessReadingsMm: [], minThicknessMm: 23 }] })
    expect(r.status).toBe(422)
    expect(r.body.data.fields).toMatchObject({
      'pads[0].axle': expect.stringMatching(/front.*rear/),
      'pads[0].innerMm': expect.stringMatching(/negative/),
      'discs[0].thicknessReadingsMm': expect.stringMatching(/at least one/),
    })
    const empty = await tech.post('/api/calculations/wear', {})
    expect(empty.status).toBe(422)
    expect(empty.body.data.fields._).toMatch(/nothing to check/)
  })
})

/** The seeded uprated part of a bore-change pair and a vehicle it is listed for (catalogue seed, BORE_MISMATCH). */
async function upratedPart(type: 'master_cylinder' | 'caliper'): Promise<{ sku: string; vehicleId: number }> {
  const list = await tech.get(`/api/parts?type=${type}&q=Uprated&pageSize=100`)
  expect(list.status).toBe(200)
  const part = (list.body.data as { sku: string; productLine: string; specs: Record<string, unknown> }[])
    .find((p) => p.productLine === BORE_MISMATCH.masterCylinder.productLine && (type === 'master_cylinder' || p.specs.position === 'front-left'))
  expect(part, `an uprated ${type} in the seed`).toBeTruthy()
  const detail = await tech.get(`/api/parts/${part!.sku}`)
  return { sku: part!.sku, vehicleId: detail.body.vehicles[0].vehicleId }
}

describe('GET /api/calculations/prefill', () => {
  it('builds the check from the vehicle and an uprated master cylinder, and the check finds the harder pedal', async () => {
    const { sku, vehicleId } = await upratedPart('master_cylinder')
    const r = await tech.get(`/api/calculations/prefill?vehicleId=${vehicleId}&sku=${sku}`)
    expect(r.status).toBe(200)
    expect(r.body.part).toMatchObject({ sku, role: 'master-cylinder', fitsVehicle: true })
    expect(r.body.hydraulics.masterCylinder.boreMm).toBe(BORE_MISMATCH.masterCylinder.oeBoreMm)
    expect(r.body.hydraulics.replacement.masterCylinder.boreMm).toBe(BORE_MISMATCH.masterCylinder.replacementBoreMm)
    expect(r.body.missing).toEqual([])
    expect(r.body.assumptions.join(' ')).toMatch(/Pedal force 300 N/)
    const check = await tech.post('/api/calculations/hydraulics', r.body.hydraulics)
    expect(check.status).toBe(200)
    // derived from P = F / A (check-values.md): (22.22 / 25.40)² ≈ 0.7656 (22.22 is 7/8 in rounded: within 0.1 %)
    expect(rel(1 + check.body.comparison.linePressurePercent / 100, 0.7656)).toBeLessThan(0.001)
    expect(check.body.findings.map((f: { code: string }) => f.code)).toContain('pedal-gain-change')
  })

  it('an uprated caliper answers the option it is listed for and scales clamp force by (57/54)²', async () => {
    const { sku, vehicleId } = await upratedPart('caliper')
    const r = await tech.get(`/api/calculations/prefill?vehicleId=${vehicleId}&sku=${sku}`)
    expect(r.status).toBe(200)
    const option = r.body.options.find((o: { key: string }) => o.key === 'front_disc_diameter_mm')
    expect(option).toMatchObject({ answer: '280', implied: true })
    expect(r.body.hydraulics.axles.front.pistonDiametersMm).toEqual([BORE_MISMATCH.caliper.oePistonMm])
    expect(r.body.hydraulics.replacement.axles.front.pistonDiametersMm).toEqual([BORE_MISMATCH.caliper.replacementPistonMm])
    // μ from the pads' SAE J866 code "FF": middle of the F range 0.35-0.45 (SAE J866 Table 1 [STD])
    expect(r.body.hydraulics.axles.front.frictionCoefficient).toBe(0.4)
    const check = await tech.post('/api/calculations/hydraulics', r.body.hydraulics)
    // check-values.md, derived: caliper piston 54 mm replaced by 57 mm -> clamp force × 1.1142
    expect(rel(1 + check.body.comparison.clampForcePercent.front / 100, 1.1142)).toBeLessThan(1e-4)
  })

  it('names a bad query, 404s an unknown vehicle or part, and refuses anonymous callers', async () => {
    const { vehicleId } = await upratedPart('caliper')
    expect((await anon.get(`/api/calculations/prefill?vehicleId=${vehicleId}`)).status).toBe(401)
    const noVehicle = await tech.get('/api/calculations/prefill')
    expect(noVehicle.status).toBe(422)
    expect(noVehicle.body.data.fields.vehicleId).toBeTruthy()
    const badOpt = await tech.get(`/api/calculations/prefill?vehicleId=${vehicleId}&opt.front_disc_diameter_mm=290`)
    expect(badOpt.status).toBe(422)
    expect(badOpt.body.data.fields['opt.front_disc_diameter_mm']).toMatch(/280/)
    expect((await tech.get('/api/calculations/prefill?vehicleId=999999')).status).toBe(404)
    expect((await tech.get(`/api/calculations/prefill?vehicleId=${vehicleId}&sku=KX-0000`)).status).toBe(404)
  })
})

describe('inspections', () => {
  let vehicleId: number
  let recorded: { id: number; recommendedParts: { axle: string; partType: string; parts: { sku: string; condition: string | null }[] }[] }
  beforeAll(async () => { vehicleId = (await upratedPart('caliper')).vehicleId })

  it('a technician records one: verdicts equal the library, parts come from the catalogue for that vehicle', async () => {
    const body = { vehicleId, registration: 'MB19 KTR', odometer: '84 210 mi', answers: { front_disc_diameter_mm: '280' }, wear }
    const r = await tech.post('/api/inspections', body)
    expect(r.status).toBe(201)
    recorded = r.body
    expect(r.body.result).toEqual(viaJson(computeWear(wear)))
    expect(r.body).toMatchObject({ vehicleId, registration: 'MB19 KTR', overall: 'fail', author: 'Sol Brennan' })
    const discs = r.body.recommendedParts.find((x: { axle: string; partType: string }) => x.axle === 'front' && x.partType === 'discs')
    expect(discs.parts.length).toBeGreaterThan(0)
    for (const p of discs.parts) {
      const detail = await tech.get(`/api/parts/${p.sku}`)
      expect(detail.body.type).toBe('disc')
      // the answer "280 mm" is honoured: only the 280 mm discs of this vehicle
      expect(detail.body.specs.diameterMm).toBe(280)
      expect(detail.body.vehicles.some((v: { vehicleId: number }) => v.vehicleId === vehicleId)).toBe(true)
    }
    const fluid = r.body.recommendedParts.find((x: { partType: string }) => x.partType === 'brake-fluid')
    expect(fluid.parts.length).toBeGreaterThan(0)
    // this vehicle has rear discs: the drum verdict recommends drums, but the catalogue has none for it
    expect(r.body.recommendedParts.find((x: { partType: string }) => x.partType === 'drums').parts).toEqual([])
  })

  it('is listed and readable within the garage (manager too), and 404 for another garage', async () => {
    const own = await manager.get(`/api/inspections/${recorded.id}`)
    expect(own.status).toBe(200)
    expect(own.body.recommendedParts).toEqual(recorded.recommendedParts)
    const list = await tech.get(`/api/inspections?vehicleId=${vehicleId}`)
    expect(list.status).toBe(200)
    expect(list.body.data.map((i: { id: number }) => i.id)).toContain(recorded.id)
    expect(list.body.meta).toMatchObject({ page: 1, pageSize: 20 })
    expect((await otherTech.get(`/api/inspections/${recorded.id}`)).status).toBe(404)
    const theirs = await otherTech.get('/api/inspections')
    expect(theirs.body.data.map((i: { id: number }) => i.id)).not.toContain(recorded.id)
  })

  it('garages not approved (pending, rejected) may use neither the calculations nor inspections', async () => {
    for (const who of [people.pendingManager, people.rejectedManager]) {
      const c = await as(who)
      expect((await c.post('/api/calculations/hydraulics', worked(25.4))).status).toBe(403)
      expect((await c.post('/api/calculations/wear', wear)).status).toBe(403)
      expect((await c.get(`/api/calculations/prefill?vehicleId=${vehicleId}`)).status).toBe(403)
      expect((await c.post('/api/inspections', { vehicleId, wear })).status).toBe(403)
      expect((await c.get('/api/inspections')).status).toBe(403)
    }
  })

  it('refuses anonymous (401) and distributor staff (403)', async () => {
    expect((await anon.post('/api/inspections', { vehicleId, wear })).status).toBe(401)
    expect((await anon.get('/api/inspections')).status).toBe(401)
    expect((await anon.get(`/api/inspections/${recorded.id}`)).status).toBe(401)
    expect((await counter.post('/api/inspections', { vehicleId, wear })).status).toBe(403)
    expect((await counter.get('/api/inspections')).status).toBe(403)
    expect((await counter.get(`/api/inspections/${recorded.id}`)).status).toBe(403)
  })

  it('bad input is 422 with the fields named (wear paths under wear.), and nothing is stored', async () => {
    const before = (await tech.get('/api/inspections')).body.meta.total
    const r = await tech.post('/api/inspections', {
      vehicleId, organisationId: 99, registration: 'X'.repeat(30),
      wear: { discs: [{ position: 'front-left', thicknessReadingsMm: [22.5] }] },
    })
    expect(r.status).toBe(422)
    expect(r.body.data.fields).toMatchObject({
      organisationId: expect.any(String),
      registration: expect.stringMatching(/20 characters/),
      'wear.discs[0].minThicknessMm': expect.stringMatching(/required/),
    })
    const badAnswer = await tech.post('/api/inspections', { vehicleId, answers: { front_disc_diameter_mm: '290' }, wear })
    expect(badAnswer.status).toBe(422)
    expect(badAnswer.body.data.fields['answers.front_disc_diameter_mm']).toBeTruthy()
    const noWear = await tech.post('/api/inspections', { vehicleId })
    expect(noWear.status).toBe(422)
    expect(noWear.body.data.fields.wear).toBeTruthy()
    expect((await tech.post('/api/inspections', { vehicleId: 999999, wear })).status).toBe(404)
    expect((await tech.get('/api/inspections')).body.meta.total).toBe(before)
    expect((await tech.get('/api/inspections/not-a-number')).status).toBe(422)
  })
})
