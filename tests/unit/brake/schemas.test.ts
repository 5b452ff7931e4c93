import { describe, it, expect } from 'vitest'
import { hydraulicsInputSchema, parseHydraulicsInput, type FieldIssue } from '#shared/utils/brake/schemas'
import { parseWearInput } from '#shared/utils/brake/wear-schemas'

function good() {
  return {
    pedalForceN: 300,
    pedalRatio: 4,
    boosterRatio: 4,
    masterCylinder: { boreMm: 22.22, strokeMm: 34 },
    split: 'front-rear',
    axles: {
      front: { kind: 'disc', caliper: 'fixed', pistonDiametersMm: [42, 42], discDiameterMm: 300, frictionCoefficient: 0.42 },
      rear: { kind: 'drum', wheelCylinderBoreMm: 19.05, drumDiameterMm: 228, brakeFactor: 2.1 },
    },
  } as Record<string, unknown> & { masterCylinder: Record<string, unknown>; axles: Record<string, Record<string, unknown>> }
}

function issues(body: unknown): FieldIssue[] {
  const r = parseHydraulicsInput(body)
  expect(r.ok).toBe(false)
  return r.ok ? [] : r.issues
}

describe('hydraulics input schema', () => {
  it('accepts a complete request', () => {
    const r = parseHydraulicsInput(good())
    expect(r.ok).toBe(true)
  })

  it('accepts a replacement with only a master cylinder', () => {
    expect(hydraulicsInputSchema.safeParse({ ...good(), replacement: { masterCylinder: { boreMm: 23.81 } } }).success).toBe(true)
  })

  it('zero or negative bore names the field', () => {
    const body = good()
    body.masterCylinder.boreMm = 0
    expect(issues(body)).toEqual([{ field: 'masterCylinder.boreMm', message: 'master cylinder bore must be greater than 0 mm' }])
    body.masterCylinder.boreMm = -22
    expect(issues(body)[0]!.field).toBe('masterCylinder.boreMm')
    const rear = good()
    rear.axles.rear!.wheelCylinderBoreMm = 0
    expect(issues(rear)[0]!.field).toBe('axles.rear.wheelCylinderBoreMm')
    const piston = good()
    piston.axles.front!.pistonDiametersMm = [42, -1]
    expect(issues(piston)).toContainEqual({ field: 'axles.front.pistonDiametersMm[1]', message: 'caliper piston diameter must be greater than 0 mm' })
  })

  it('friction coefficient outside 0.1-0.8 (not a brake lining)', () => {
    for (const mu of [0, 0.05, 0.81, 3]) {
      const body = good()
      body.axles.front!.frictionCoefficient = mu
      expect(issues(body)).toEqual([
        { field: 'axles.front.frictionCoefficient', message: 'friction coefficient must be between 0.1 and 0.8 (brake linings are about 0.25-0.55)' },
      ])
    }
    for (const mu of [0.1, 0.8]) {
      const body = good()
      body.axles.front!.frictionCoefficient = mu
      expect(parseHydraulicsInput(body).ok).toBe(true)
    }
  })

  it('values far outside what cars have are refused with the range named', () => {
    const pedal = good()
    pedal.pedalForceN = 2500
    expect(issues(pedal)).toEqual([{ field: 'pedalForceN', message: 'pedal force must be between 10 N and 1000 N (check the unit)' }])
    const bore = good()
    bore.masterCylinder.boreMm = 0.875
    expect(issues(bore)[0]).toEqual({ field: 'masterCylinder.boreMm', message: 'master cylinder bore must be between 14 mm and 38 mm (check the unit)' })
    const runOut = good()
    runOut.boosterRunOutKPa = 100
    expect(issues(runOut)[0]!.message).toMatch(/between 2000 kPa and 20000 kPa/)
    const grip = good()
    grip.tyreRoadFriction = 2.9
    expect(issues(grip)[0]).toEqual({ field: 'tyreRoadFriction', message: 'tyre-road friction must be between 0.1 and 1.2 (check the unit)' })
  })

  it('vehicle data: every figure named, laden not lighter than unladen, the mass given once', () => {
    const body = good()
    body.vehicle = { massKg: 1400, wheelbaseMm: 2.6, cogHeightMm: 550, frontStaticSharePercent: 60, laden: { massKg: 1200, cogHeightMm: 560, frontStaticSharePercent: 55 } }
    const found = issues(body)
    expect(found).toContainEqual({ field: 'vehicle.wheelbaseMm', message: 'wheelbase must be between 1700 mm and 4500 mm (check the unit)' })
    const laden = good()
    laden.vehicle = { massKg: 1400, wheelbaseMm: 2600, cogHeightMm: 550, frontStaticSharePercent: 60, laden: { massKg: 1200, cogHeightMm: 560, frontStaticSharePercent: 55 } }
    expect(issues(laden)).toEqual([{ field: 'vehicle.laden.massKg', message: 'laden mass must be at least the unladen mass (1400 kg)' }])
    const twice = good()
    twice.massKg = 1300
    twice.vehicle = { massKg: 1400, wheelbaseMm: 2600, cogHeightMm: 550, frontStaticSharePercent: 60 }
    expect(issues(twice)[0]!.field).toBe('massKg')
  })

  it('pad height that leaves no friction band is refused', () => {
    const body = good()
    body.axles.front!.padHeightMm = 110
    expect(issues(body)[0]).toMatchObject({ field: 'axles.front.padHeightMm', message: expect.stringMatching(/check the pad height/) })
  })

  it('missing axle', () => {
    const body = good()
    delete body.axles.front
    expect(issues(body)).toEqual([{ field: 'axles.front', message: 'front axle is required' }])
    const none: Record<string, unknown> = good()
    delete none.axles
    expect(issues(none)).toEqual([{ field: 'axles', message: 'axles is required' }])
  })

  it('unknown axle kind, caliper and split', () => {
    const kind = good()
    kind.axles.rear!.kind = 'band'
    expect(issues(kind)[0]).toEqual({ field: 'axles.rear.kind', message: 'rear axle kind must be "disc" or "drum"' })
    const caliper = good()
    caliper.axles.front!.caliper = 'sliding-ish'
    expect(issues(caliper)[0]).toEqual({ field: 'axles.front.caliper', message: 'caliper must be "fixed" or "floating"' })
    const split = good()
    split.split = 'triangular'
    expect(issues(split)[0]).toEqual({ field: 'split', message: 'split must be "front-rear" or "diagonal"' })
  })

  it('missing and non-numeric values', () => {
    const body = good()
    delete body.pedalForceN
    body.pedalRatio = '4'
    const found = issues(body)
    expect(found).toContainEqual({ field: 'pedalForceN', message: 'pedal force is required' })
    expect(found).toContainEqual({ field: 'pedalRatio', message: 'pedal ratio must be a number' })
    expect(issues(null)).toEqual([{ field: '(body)', message: 'request body must be an object' }])
  })

  it('implausible geometry and unit slips', () => {
    const radius = good()
    radius.axles.front!.effectiveRadiusMm = 160
    expect(issues(radius)[0]).toEqual({ field: 'axles.front.effectiveRadiusMm', message: 'effective radius must be smaller than the disc radius (150 mm)' })
    const booster = good()
    booster.boosterRatio = 0.5
    expect(issues(booster)[0]!.message).toMatch(/1 means no booster/)
    const inches = good()
    inches.axles.front!.discDiameterMm = 11.75
    expect(issues(inches)[0]!.message).toMatch(/between 150 mm and 480 mm \(check the unit\)/)
    const tyre = good()
    tyre.axles.front!.tyreSize = '31x10.50R15'
    expect(issues(tyre)[0]).toEqual({ field: 'axles.front.tyreSize', message: 'tyre size must be a metric size code like "205/55 R16"' })
    const ports = good()
    ports.masterCylinder = { boreMm: 22.22, tandem: true, ports: 1 }
    expect(issues(ports)[0]).toEqual({ field: 'masterCylinder.ports', message: 'a tandem master cylinder has at least 2 ports' })
  })

  it('bad replacement fields are named under replacement', () => {
    const body = { ...good(), replacement: { masterCylinder: { boreMm: 0 }, axles: { front: { kind: 'disc' } } } }
    const found = issues(body).map((i) => i.field)
    expect(found).toContain('replacement.masterCylinder.boreMm')
    expect(found).toContain('replacement.axles.front.caliper')
    expect(found).toContain('replacement.axles.front.frictionCoefficient')
  })
})

describe('wear input schema', () => {
  it('accepts a full inspection and normalises fluid grades', () => {
    const r = parseWearInput({
      discs: [{ position: 'front-left', thicknessReadingsMm: [24.1, 24.12, 24.1], minThicknessMm: 22, runoutMm: 0.03 }],
      pads: [{ axle: 'front', innerMm: 6, outerMm: 7 }],
      drums: [{ position: 'rear-right', diameterMm: 228.2, maxDiameterMm: 229 }],
      fluid: { gradeInSystem: 'dot 5.1', gradeToAdd: 'DOT4', waterPercent: 1.2 },
    })
    expect(r.ok).toBe(true)
    if (r.ok) {
      expect(r.data.fluid?.gradeInSystem).toBe('DOT 5.1')
      expect(r.data.fluid?.gradeToAdd).toBe('DOT 4')
    }
    const class6 = parseWearInput({ fluid: { gradeInSystem: 'class 6', boilingPointC: 190 } })
    expect(class6.ok && class6.data.fluid?.gradeInSystem).toBe('ISO 4925 Class 6')
    const noGrade = parseWearInput({ fluid: { boilingPointC: 190 } })
    expect(noGrade.ok).toBe(false)
    if (!noGrade.ok) expect(noGrade.issues[0]).toMatchObject({ field: 'fluid.gradeInSystem' })
  })

  it('rejects bad readings with the field named', () => {
    const r = parseWearInput({
      discs: [{ position: 'front-middle', thicknessReadingsMm: [24, -1], minThicknessMm: 0 }],
      pads: [{ axle: 'front', innerMm: -2, outerMm: 5 }],
      fluid: { gradeInSystem: 'DOT 6', waterPercent: 120 },
    })
    expect(r.ok).toBe(false)
    if (r.ok) return
    const fields = r.issues.map((i) => i.field)
    expect(fields).toEqual(
      expect.arrayContaining([
        'discs[0].position',
        'discs[0].thicknessReadingsMm[1]',
        'discs[0].minThicknessMm',
        'pads[0].innerMm',
        'fluid.gradeInSystem',
        'fluid.waterPercent',
      ]),
    )
    expect(r.issues.find((i) => i.field === 'fluid.gradeInSystem')!.message).toBe(
      'grade in system must be "DOT 3" or "DOT 4" or "DOT 5.1" or "DOT 5" or "ISO 4925 Class 6"',
    )
  })

  it('rejects an empty check and duplicate positions', () => {
    const empty = parseWearInput({})
    expect(empty.ok).toBe(false)
    if (!empty.ok) expect(empty.issues[0]!.message).toMatch(/nothing to check/)
    const twice = parseWearInput({
      discs: [
        { position: 'front-left', thicknessReadingsMm: [24], minThicknessMm: 22 },
        { position: 'front-left', thicknessReadingsMm: [24], minThicknessMm: 22 },
      ],
    })
    expect(twice.ok).toBe(false)
    if (!twice.ok) expect(twice.issues[0]).toEqual({ field: 'discs[1]', message: 'disc front-left is listed twice' })
  })
})
