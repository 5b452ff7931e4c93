/**
 * Brake calculation routes, the bore-check prefill and inspections, against the built server.
 * Every expected figure is worked by hand here (the working beside it) or comes from an outside source named beside
 * the check (/work/shared/check-values.md: published examples, FMVSS, NIST); none is rebuilt with the brake library.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { Client, as, env, people } from '../support/api'
import type { HydraulicsInputRaw, WearInputRaw } from '#shared/utils/brake'
import { BORE_MISMATCH } from '../../server/seed/catalogue-data'

await setup({ host: env().baseUrl })

const rel = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected)

/** 1 lbf = 0.45359237 kg × 9.80665 m/s² = 4.4482216152605 N (NIST SP 811, 2008, App. B.9). */
const N_PER_LBF = 4.4482216152605
/** 1 psi = 6894.757293168361 Pa (NIST SP 811, 2008, App. B.9). */
const KPA_PER_PSI = 6.894757293168361

/** The published worked example (hotrodheaven.com brakes tech page, check-values.md [PUB]): 100 lbf, 6:1, no booster. */
function worked(boreMm: number): HydraulicsInputRaw {
  return {
    pedalForceN: 100 * N_PER_LBF, pedalRatio: 6, boosterRatio: 1,
    masterCylinder: { boreMm }, split: 'front-rear',
    axles: {
      front: { kind: 'disc', caliper: 'floating', pistonDiametersMm: [54], discDiameterMm: 280, padHeightMm: 55, edgeMarginMm: 2, frictionCoefficient: 0.4, tyreSize: '205/55 R16' },
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

/**
 * The verdicts of `wear`, worked by hand:
 * - disc: thinnest reading 22.9 mm is under the stamped 23 mm: fail (Maryland COMAR 11.19.03.05 C [STD]); thickness
 *   variation 23.1 − 22.9 = 0.2 mm against the 0.020 mm default: advise (clean the hub, re-check; never a failure on
 *   its own); runout 0.03 mm within the 0.05 mm default: ok (defaults check-values.md [CP]);
 * - pads: inner 1.4 mm is under 1.5 mm, a UK roadworthiness-test failure [PUB]; outer 4 mm is over the 3 mm
 *   replace-soon mark [CP]: ok; 4 − 1.4 = 2.6 mm apart, more than 2 mm: uneven wear, advise [CP];
 * - drum: 230.5 mm is over the 230.1 mm maximum cast into it: fail (common practice: never beyond the maximum);
 * - fluid: 3 % water or more: replace [CP]; DOT 5 (silicone) must not go into DOT 4 (FMVSS No. 116 [STD]).
 */
const WEAR_VERDICTS = [
  { id: 'disc:front-left:thickness', verdict: 'fail', measured: 22.9, limit: 23 },
  { id: 'disc:front-left:thickness-variation', verdict: 'advise', measured: 0.2, limit: 0.02 },
  { id: 'disc:front-left:runout', verdict: 'ok', measured: 0.03, limit: 0.05 },
  { id: 'pad:front:inner', verdict: 'fail', measured: 1.4, limit: 1.5 },
  { id: 'pad:front:outer', verdict: 'ok', measured: 4, limit: 3 },
  { id: 'pad:front:uneven', verdict: 'advise', measured: 2.6, limit: 2 },
  { id: 'drum:rear-left:diameter', verdict: 'fail', measured: 230.5, limit: 230.1 },
  { id: 'fluid:water', verdict: 'fail', measured: 3, limit: 3 },
  { id: 'fluid:compatibility', verdict: 'fail', measured: null, limit: null },
]
/** Worn discs go in axle pairs with new pads, worn drums with new shoes (common practice); fluid for the system. */
const WEAR_PARTS = [
  { axle: 'front', partType: 'discs' }, { axle: 'front', partType: 'pads' },
  { axle: 'rear', partType: 'drums' }, { axle: 'rear', partType: 'shoes' }, { axle: 'system', partType: 'brake-fluid' },
]

interface WearAnswer { items: { id: string; verdict: string; measured: number | null; limit: number | null }[]; overall: string; recommendedParts: { axle: string; partType: string; verdict: string }[] }
/** A wear answer against the hand-worked verdicts above. */
function expectHandWorkedWear(result: WearAnswer) {
  expect(result.items.map((i) => ({ id: i.id, verdict: i.verdict }))).toEqual(WEAR_VERDICTS.map((i) => ({ id: i.id, verdict: i.verdict })))
  for (const [n, item] of result.items.entries()) {
    const want = WEAR_VERDICTS[n]!
    if (want.measured === null) expect(item.measured).toBeNull()
    else expect(item.measured).toBeCloseTo(want.measured, 9)
    expect(item.limit).toBe(want.limit)
  }
  expect(result.overall).toBe('fail')
  expect(result.recommendedParts.map((p) => ({ axle: p.axle, partType: p.partType }))).toEqual(WEAR_PARTS)
  expect(result.recommendedParts.every((p) => p.verdict === 'fail')).toBe(true)
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

  it('works the chain from pedal to tyre as by hand, the same for garage and distributor roles', async () => {
    const input = { ...worked(22.225), replacement: { masterCylinder: { boreMm: 25.4 } } }
    const [r, staff] = await Promise.all([tech.post('/api/calculations/hydraulics', input), counter.post('/api/calculations/hydraulics', input)])
    expect(r.status).toBe(200)
    expect(staff.status).toBe(200)
    expect(staff.body).toEqual(r.body)
    const o = r.body.original
    const near = (actual: number, expected: number) => expect(rel(actual, expected)).toBeLessThan(2e-5)
    // Worked by hand (check-values.md hydraulic formulas: P = F / A, A = π d² / 4, T = 2 μ F r_eff, F_tyre = T / R):
    // pushrod = 100 lbf × 6 × 1 (no booster) = 600 lbf × 4.44822 N/lbf = 2668.93 N
    near(o.pushrodForceN, 2668.93)
    // A_mc = π × 22.225² / 4 = 387.948 mm²; P = 2668.93 / 387.948 = 6.87962 N/mm² = 6879.62 kPa (997.80 psi, the
    // published 997.8 psi)
    near(o.masterCylinderAreaMm2, 387.948)
    near(o.linePressureKPa, 6879.62)
    // front, floating caliper, one 54 mm piston: A = π × 54² / 4 = 2290.22 mm²; clamp per pad = 6.87962 × 2290.22 = 15755.8 N
    near(o.axles.front.padForceN, 15755.8)
    // r_eff from the pad's swept band, uniform wear (Shigley's Mechanical Engineering Design §16-5): outer radius
    // 280 / 2 − 2 mm margin = 138 mm, inner 138 − 55 mm pad = 83 mm, mean (138 + 83) / 2 = 110.5 mm;
    // torque per wheel = 2 faces × 0.4 × 15755.8 N × 0.1105 m = 1392.82 N·m
    expect(o.axles.front.effectiveRadiusMm).toBe(110.5)
    expect(o.axles.front.effectiveRadiusSource).toBe('pad-uniform-wear')
    near(o.axles.front.torquePerWheelNm, 1392.82)
    // 205/55 R16: unloaded radius 16 × 25.4 / 2 + 205 × 0.55 = 315.95 mm; rolling radius × 3.05 / π = 306.739 mm
    // (tyre-trade rule of thumb, common practice); tyre force per wheel = 1392.82 / 0.306739 = 4540.73 N
    near(o.axles.front.tyreRollingRadiusMm, 306.739)
    near(o.axles.front.tyreForceN, 4540.73)
    // rear drum, 3/4 in wheel cylinder: A = π × 19.05² / 4 = 285.023 mm²; shoe force = 6.87962 × 285.023 = 1960.85 N;
    // torque = 1960.85 N × brake factor 2 × drum radius 0.1143 m = 448.250 N·m
    near(o.axles.rear.shoeForceN, 1960.85)
    near(o.axles.rear.torquePerWheelNm, 448.250)
    // same tyres front and rear, so the tyre forces share as the torques: 1392.82 / (1392.82 + 448.250) = 75.6527 %
    near(o.frontSharePercent, 75.6527)
    // fluid (default travel, common practice estimate): front 2 wheels × 2290.22 mm² × 0.5 mm = 2290.22 mm³; rear
    // 2 wheels × 2 pistons × 285.023 mm² × 1.0 mm = 1140.09 mm³; total 3430.31 mm³; MC stroke = 3430.31 / 387.948 =
    // 8.84220 mm; pedal travel = 8.84220 × 6 = 53.0532 mm
    near(o.fluidVolumeMm3, 3430.31)
    near(o.masterCylinderStrokeMm, 8.84220)
    near(o.pedalTravelMm, 53.0532)
    // a 1 in master cylinder: pressure and stroke × (22.225 / 25.4)² = × 0.765625 (derived from P = F / A):
    // 6879.62 × 0.765625 = 5267.21 kPa (763.94 psi, the published 763.9 psi); 8.84220 × 0.765625 = 6.76981 mm
    near(r.body.replacement.linePressureKPa, 5267.21)
    near(r.body.replacement.masterCylinderStrokeMm, 6.76981)
    near(r.body.comparison.linePressurePercent, -23.4375)
    near(r.body.comparison.pedalTravelPercent, -23.4375)
    expect(r.body.comparison.fluidVolumePercent).toBe(0)
    // findings, by the product's thresholds (15 % pedal feel, common practice): pressure per pedal force falls 23.4 %
    // (a warning, first); pedal travel shrinks 23.4 %; no stroke given for either master cylinder; piston travel
    // defaulted on both axles. Front share 76 % and tyre sizes given: no balance note; no mass: no stopping figures.
    expect(r.body.findings.map((f: { code: string }) => f.code)).toEqual([
      'pedal-gain-change', 'mc-stroke-unknown', 'piston-travel-default', 'piston-travel-default', 'pedal-travel-shorter', 'mc-stroke-unknown',
    ])
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
    const bad = JSON.parse(JSON.stringify(worked(0)))
    bad.axles.front.frictionCoefficient = 1.5
    bad.axles.front.pistonDiametersMm = [54, -2]
    delete bad.axles.rear
    bad.replacement = { axles: { front: { kind: 'drum' } } }
    const r = await tech.post('/api/calculations/hydraulics', bad)
    expect(r.status).toBe(422)
    const fields = r.body.data.fields as Record<string, string>
    expect(fields['masterCylinder.boreMm']).toMatch(/greater than 0/)
    expect(fields['axles.front.frictionCoefficient']).toMatch(/between 0\.1 and 0\.8/)
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

describe('POST /api/calculations/hydraulics: booster knee, grip and balance', () => {
  it('past the booster knee extra pedal force adds pressure unboosted, as worked by hand', async () => {
    // F_in = 100 lbf × 6 = 2668.93 N; booster 4, knee 8000 kPa, A = 387.948 mm²: boosted 2668.93 × 4 / 387.948 = 27.52 N/mm²
    // would be past the knee; the booster ran out at F_in = 8 × 387.948 / 4 = 775.896 N (129.316 N of pedal force);
    // P = 8 + (2668.93 − 775.896) / 387.948 = 8 + 4.87962 = 12.87962 N/mm² = 12 879.6 kPa
    const r = await tech.post('/api/calculations/hydraulics', { ...worked(22.225), boosterRatio: 4, boosterRunOutKPa: 8000 })
    expect(r.status).toBe(200)
    expect(rel(r.body.original.linePressureKPa, 12879.6)).toBeLessThan(2e-5)
    expect(rel(r.body.original.kneePedalForceN, 129.316)).toBeLessThan(2e-5)
    expect(r.body.original.pastKnee).toBe(true)
    expect(r.body.findings.map((f: { code: string }) => f.code)).toContain('booster-past-knee')
  })

  it('answers decelerationMps2 capped by tyre grip and adhesion { front, rear, locksFirst } at it', async () => {
    // With the worked chain the axles make 2 × 4540.73 = 9081.46 N front and 2 × 448.250 / 0.306739 = 2922.67 N rear:
    // 12 004.13 N on 1500 kg is 0.816 g, more than the default tyre-road friction 0.8 (dry asphalt, common
    // practice), so the deceleration is 0.8 × 9.80665 = 7.84532 m/s². At z = 0.8, with a 75.6527 % front share,
    // ψ = 0.6 and χ = 520 / 2600 = 0.2 (UN ECE R13-H Annex 5: f = braking force / (static load ± z P h / E)):
    // front 0.756527 × 0.8 / (0.6 + 0.16) = 0.79634, rear 0.243473 × 0.8 / (0.4 − 0.16) = 0.81158: the rear locks first.
    const vehicle = { massKg: 1500, wheelbaseMm: 2600, cogHeightMm: 520, frontStaticSharePercent: 60 }
    const r = await tech.post('/api/calculations/hydraulics', { ...worked(22.225), vehicle })
    expect(r.status).toBe(200)
    expect(rel(r.body.decelerationMps2, 7.84532)).toBeLessThan(1e-6)
    expect(r.body.original.decelerationLimitedBy).toBe('tyre grip')
    expect(rel(r.body.adhesion.front, 0.79634)).toBeLessThan(1e-4)
    expect(rel(r.body.adhesion.rear, 0.81158)).toBeLessThan(1e-4)
    expect(r.body.adhesion.locksFirst).toBe('rear')
    expect(r.body.original.adhesion).toEqual(r.body.adhesion)
    // the stop counts FMVSS No. 135's 0.10 V: 10 + 100² / (25.92 × 7.84532) = 59.176 m
    expect(rel(r.body.original.stoppingDistanceFrom100KmhM, 59.1761)).toBeLessThan(1e-5)
    // a wetter road (μ 0.5) holds it to 0.5 g
    const wet = await tech.post('/api/calculations/hydraulics', { ...worked(22.225), vehicle, tyreRoadFriction: 0.5 })
    expect(rel(wet.body.decelerationMps2, 0.5 * 9.80665)).toBeLessThan(1e-9)
  })

  it('refuses what cars do not have, with the range named', async () => {
    const r = await tech.post('/api/calculations/hydraulics', { ...worked(22.225), pedalForceN: 4000, tyreRoadFriction: 3, vehicle: { massKg: 1500, wheelbaseMm: 2.6, cogHeightMm: 520, frontStaticSharePercent: 60 } })
    expect(r.status).toBe(422)
    expect(r.body.data.fields).toMatchObject({
      pedalForceN: 'pedal force must be between 10 N and 1000 N (check the unit)',
      tyreRoadFriction: expect.stringMatching(/between 0\.1 and 1\.2/),
      'vehicle.wheelbaseMm': expect.stringMatching(/between 1700 mm and 4500 mm/),
    })
  })
})

describe('POST /api/calculations/brake-test', () => {
  // MOT Inspection Manual (DVSA, 2012) §3.8: efficiency = total brake effort / vehicle weight × 100; imbalance =
  // (higher − lower) / higher × 100. Worked by hand: 1350 kg weighs 13 238.98 N; service 8600 N = 64.960 %;
  // parking 2000 N = 15.107 % (under 16 %); front (3200 − 2800) / 3200 = 12.5 %; rear (1400 − 1200) / 1400 = 14.286 %.
  const body = {
    massKg: 1350,
    readings: [
      { wheel: 'front_left', serviceN: 3200 }, { wheel: 'front_right', serviceN: 2800 },
      { wheel: 'rear_left', serviceN: 1400, parkingN: 1100 }, { wheel: 'rear_right', serviceN: 1200, parkingN: 900 },
    ],
  }

  it('answers efficiency, imbalance per axle and verdicts as worked by hand, for garage and distributor roles', async () => {
    const [r, staff] = await Promise.all([tech.post('/api/calculations/brake-test', body), counter.post('/api/calculations/brake-test', body)])
    expect(r.status).toBe(200)
    expect(staff.body).toEqual(r.body)
    expect(rel(r.body.serviceEfficiencyPercent, 64.9597)).toBeLessThan(1e-5)
    expect(rel(r.body.parkingEfficiencyPercent, 15.1069)).toBeLessThan(1e-5)
    expect(r.body.imbalancePercent.front).toBeCloseTo(12.5, 9)
    expect(rel(r.body.imbalancePercent.rear, 14.2857)).toBeLessThan(1e-5)
    expect(r.body.verdicts.map((v: { code: string; verdict: string }) => `${v.code}:${v.verdict}`)).toEqual([
      'service-efficiency:ok', 'parking-efficiency:fail', 'imbalance-front:ok', 'imbalance-rear:ok',
    ])
  })

  it('is 401 signed out, 403 for a garage not approved, 422 naming the field', async () => {
    expect((await anon.post('/api/calculations/brake-test', body)).status).toBe(401)
    expect((await (await as(people.pendingManager)).post('/api/calculations/brake-test', body)).status).toBe(403)
    const bad = await tech.post('/api/calculations/brake-test', { massKg: 90, readings: [{ wheel: 'middle', serviceN: -1 }], extra: 1 })
    expect(bad.status).toBe(422)
    expect(bad.body.data.fields).toMatchObject({
      massKg: expect.stringMatching(/between 400 kg and 4500 kg/),
      'readings[0].wheel': expect.stringMatching(/front_left/),
      'readings[0].serviceN': expect.stringMatching(/negative/),
      extra: expect.any(String),
    })
  })
})

describe('POST /api/calculations/wear', () => {
  it('refuses an anonymous caller with 401', async () => {
    expect((await anon.post('/api/calculations/wear', wear)).status).toBe(401)
  })

  it('gives the hand-worked verdict per item and the part types to replace', async () => {
    const r = await tech.post('/api/calculations/wear', wear)
    expect(r.status).toBe(200)
    expectHandWorkedWear(r.body)
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
    // the vehicle data for grip and balance, and the booster's knee, come with it
    expect(r.body.hydraulics.vehicle).toMatchObject({ wheelbaseMm: expect.any(Number), cogHeightMm: expect.any(Number), laden: expect.any(Object) })
    expect(r.body.hydraulics.boosterRunOutKPa).toBeGreaterThan(0)
    // below the booster's knee with either bore (150 N; the knee is past 200 N for this van), pressure follows P = F / A
    const check = await tech.post('/api/calculations/hydraulics', { ...r.body.hydraulics, pedalForceN: 150 })
    expect(check.status).toBe(200)
    expect(check.body.original.pastKnee).toBe(false)
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

  it('a technician records one: the hand-worked verdicts, parts come from the catalogue for that vehicle', async () => {
    const body = { vehicleId, registration: 'MB19 KTR', odometer: '84 210 mi', answers: { front_disc_diameter_mm: '280' }, wear }
    const r = await tech.post('/api/inspections', body)
    expect(r.status).toBe(201)
    recorded = r.body
    expectHandWorkedWear(r.body.result)
    // the same answer as the wear check itself
    expect(r.body.result).toEqual((await tech.post('/api/calculations/wear', wear)).body)
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
