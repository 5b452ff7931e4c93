import { describe, it, expect } from 'vitest'
import {
  hydraulicsInputSchema,
  parseHydraulicsInput,
  parseWearInput,
  type FieldIssue,
} from '#shared/utils/brake/schemas'

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

  it('friction coefficient outside 0.05-1.0', () => {
    for (const mu of [0, 0.04, 1.01, 3]) {
      const body = good()
      body.axles.front!.frictionCoefficient = mu
      expect(issues(body)).toEqual([
        { field: 'axles.front.frictionCoefficient', message: 'friction coefficient must be between 0.05 and 1.0' },
      ])
    }
    for (const mu of [0.05, 1.0]) {
      const body = good()
      body.axles.front!.frictionCoefficient = mu
      expect(parseHydraulicsInput(body).ok).toBe(true)
    }
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
    inches.axles.front!.discDiameterMm = 11.75 * 25.4 * 25.4
    expect(issues(inches)[0]!.message).toMatch(/check the unit/)
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
      'grade in system must be "DOT 3" or "DOT 4" or "DOT 5.1" or "DOT 5"',
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
