import { describe, it, expect } from 'vitest'
import {
  BrakeInputError,
  computeHydraulics,
  percentChange,
  sortFindings,
  type BoreCheckFinding,
  type HydraulicsInputRaw,
} from '#shared/utils/brake'

/** A = π d² / 4 (check-values.md), worked here rather than with the library. */
const pistonArea = (d: number) => (Math.PI * d * d) / 4

function expectRel(actual: number, expected: number, tol: number) {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(tol * Math.abs(expected))
}

/** An invented compact hatchback: floating calipers front and rear, diagonal split. */
function vehicle(): HydraulicsInputRaw {
  return {
    pedalForceN: 300,
    pedalRatio: 4,
    boosterRatio: 4,
    masterCylinder: { boreMm: 22.22, strokeMm: 12, tandem: true, ports: 2, portLayout: 'diagonal' },
    split: 'diagonal',
    massKg: 1350,
    axles: {
      front: { kind: 'disc', caliper: 'floating', pistonDiametersMm: [57], discDiameterMm: 280, frictionCoefficient: 0.4, tyreSize: '205/55 R16', pistonTravelMm: 0.5 },
      rear: { kind: 'disc', caliper: 'floating', pistonDiametersMm: [34], discDiameterMm: 260, frictionCoefficient: 0.38, tyreSize: '205/55 R16', pistonTravelMm: 0.5 },
    },
  }
}

const codes = (findings: BoreCheckFinding[]) => findings.map((f) => f.code)

describe('computeHydraulics without a replacement', () => {
  const r = computeHydraulics(vehicle())

  it('returns the chain, no comparison, and the contract fields', () => {
    expect(r.replacement).toBeNull()
    expect(r.comparison).toBeNull()
    expect(r.circuitFailure.replacement).toBeNull()
    for (const key of ['linePressureKPa', 'frontSharePercent', 'fluidVolumeMm3', 'masterCylinderStrokeMm', 'pedalTravelMm'] as const) {
      expect(typeof r.original[key]).toBe('number')
    }
    for (const axle of [r.original.axles.front, r.original.axles.rear]) {
      expect(typeof axle.padForceN).toBe('number')
      expect(typeof axle.torquePerWheelNm).toBe('number')
      expect(typeof axle.tyreForceN).toBe('number')
    }
    expect(r.units.linePressureKPa).toBe('kPa')
    expect(r.assumptions.join(' ')).toMatch(/push-out/)
    expect(r.assumptions.join(' ')).toMatch(/3\.05/)
    expect(r.cautions.length).toBeGreaterThan(0)
    expect(r.inputs.pedalForceN).toBe(300)
  })

  it('line pressure follows P = F / A (unit check: no run-out given, the booster is a fixed ratio)', () => {
    // Pascal's law, check-values.md: pushrod = pedal × pedal ratio × booster ratio
    expectRel(r.original.linePressureKPa, ((300 * 4 * 4) / pistonArea(22.22)) * 1000, 1e-12)
    expectRel(r.original.axles.front.padForceN!, (r.original.linePressureKPa / 1000) * pistonArea(57), 1e-12)
  })

  it('a healthy original system gives no warnings or dangers', () => {
    expect(r.findings.filter((f) => f.severity !== 'info')).toEqual([])
  })
})

describe('bore-change comparison', () => {
  it('MC 7/8 in -> 1 in: pressure, clamp force and torque × 0.7656, share unchanged', () => {
    const input = vehicle()
    input.masterCylinder = { boreMm: 22.225, strokeMm: 36 }
    input.replacement = { masterCylinder: { boreMm: 25.4 } }
    const r = computeHydraulics(input)
    const c = r.comparison!
    // check-values.md, derived from P = F / A: (7/8)² = 0.765625 -> −23.44 %
    expectRel(1 + c.linePressurePercent! / 100, 0.7656, 1e-4)
    expectRel(1 + c.clampForcePercent.front! / 100, 0.7656, 1e-4)
    expectRel(1 + c.torquePerAxlePercent.rear! / 100, 0.7656, 1e-4)
    expect(c.frontShareChangePoints).toBeCloseTo(0, 9)
    expect(c.fluidVolumePercent).toBeCloseTo(0, 9)
    expect(codes(r.findings)).toContain('pedal-gain-change')
    expect(r.findings.find((f) => f.code === 'pedal-gain-change')!.message).toMatch(/harder/)
    // stroke available not given on the replacement: taken from the original and said so
    expect(r.inputs.resolvedReplacement!.masterCylinder.strokeMm).toBe(36)
    expect(r.assumptions.join(' ')).toMatch(/taken from the original: master cylinder stroke/)
  })

  it('front caliper piston 54 -> 57 mm: clamp force and fluid demand × 1.1142', () => {
    const input = vehicle()
    input.axles.front = { kind: 'disc', caliper: 'floating', pistonDiametersMm: [54], discDiameterMm: 280, effectiveRadiusMm: 118, frictionCoefficient: 0.4, tyreSize: '205/55 R16', pistonTravelMm: 0.5 }
    input.replacement = { axles: { front: { kind: 'disc', caliper: 'floating', pistonDiametersMm: [57], discDiameterMm: 280, effectiveRadiusMm: 118, frictionCoefficient: 0.4 } } }
    const r = computeHydraulics(input)
    // check-values.md, derived: (57/54)² = 1.11420
    expectRel(1 + r.comparison!.clampForcePercent.front! / 100, 1.1142, 1e-4)
    expectRel(r.replacement!.axles.front.fluidVolumeMm3 / r.original.axles.front.fluidVolumeMm3, 1.1142, 1e-4)
    expect(r.comparison!.clampForcePercent.rear).toBeCloseTo(0, 12)
    // tyre and travel taken from the original axle
    expect(r.replacement!.axles.front.tyreForceN).not.toBeNull()
    expect(r.assumptions.join(' ')).toMatch(/front tyre size/)
    expect(r.comparison!.frontShareChangePoints).toBeGreaterThan(0)
  })

  it('bigger rear calipers move the front share rearward by more than 3 points: danger', () => {
    const input = vehicle()
    input.replacement = { axles: { rear: { kind: 'disc', caliper: 'floating', pistonDiametersMm: [42], discDiameterMm: 260, frictionCoefficient: 0.38 } } }
    const r = computeHydraulics(input)
    expect(r.comparison!.frontShareChangePoints).toBeLessThan(-3)
    const f = r.findings.find((x) => x.code === 'front-share-rearward')
    expect(f?.severity).toBe('danger')
    expect(f?.message).toMatch(/rear wheels may lock first/)
    expect(r.findings[0]!.severity).toBe('danger')
    expect(codes(r.findings)).toContain('rear-torque-change')
  })

  it('a small front-share move (≤ 3 points) gives no share finding', () => {
    const input = vehicle()
    input.replacement = { axles: { rear: { kind: 'disc', caliper: 'floating', pistonDiametersMm: [35], discDiameterMm: 260, frictionCoefficient: 0.38 } } }
    const r = computeHydraulics(input)
    expect(Math.abs(r.comparison!.frontShareChangePoints)).toBeLessThan(3)
    expect(codes(r.findings)).not.toContain('front-share-rearward')
    expect(codes(r.findings)).not.toContain('front-share-forward')
  })

  it('smaller MC bore: stroke needed exceeds stroke available -> danger; pressure gain > 15 % -> warning', () => {
    const input = vehicle()
    input.replacement = { masterCylinder: { boreMm: 17.46, strokeMm: 12 } }
    const r = computeHydraulics(input)
    expect(r.original.masterCylinderStrokeMm).toBeLessThan(12)
    expect(r.replacement!.masterCylinderStrokeMm).toBeGreaterThan(12)
    const stroke = r.findings.find((f) => f.code === 'mc-stroke-exceeded')
    expect(stroke?.severity).toBe('danger')
    expect(stroke?.message).toMatch(/floor/)
    const gain = r.findings.find((f) => f.code === 'pedal-gain-change')
    expect(gain?.severity).toBe('warning')
    expect(r.comparison!.pressurePerPedalForcePercent!).toBeGreaterThan(15)
    expect(codes(r.findings)).toContain('pedal-travel-longer')
  })

  it('a pressure change within 15 % gives no pedal-feel finding', () => {
    const input = vehicle()
    input.replacement = { masterCylinder: { boreMm: 23.0 } } // (22.22/23)² − 1 = −6.7 %
    const r = computeHydraulics(input)
    expect(codes(r.findings)).not.toContain('pedal-gain-change')
  })

  it('tandem master cylinder whose ports do not match the split -> danger', () => {
    const input = vehicle()
    input.replacement = { masterCylinder: { boreMm: 22.22, tandem: true, ports: 4, portLayout: 'front-rear' } }
    const r = computeHydraulics(input)
    expect(r.findings.find((f) => f.code === 'mc-port-mismatch')?.severity).toBe('danger')
    expect(r.findings.find((f) => f.code === 'mc-port-count-differs')?.severity).toBe('warning')
  })

  it('single-circuit master cylinder on a dual-circuit vehicle -> danger', () => {
    const input = vehicle()
    input.replacement = { masterCylinder: { boreMm: 22.22, tandem: false, ports: 1 } }
    const r = computeHydraulics(input)
    expect(r.findings.find((f) => f.code === 'mc-not-tandem')?.severity).toBe('danger')
  })

  it('findings are ordered danger, warning, info', () => {
    const input = vehicle()
    input.replacement = {
      masterCylinder: { boreMm: 17.46, portLayout: 'front-rear' },
      axles: { rear: { kind: 'disc', caliper: 'floating', pistonDiametersMm: [42], discDiameterMm: 260, frictionCoefficient: 0.38 } },
    }
    const r = computeHydraulics(input)
    const rank = { danger: 0, warning: 1, info: 2 }
    const ranks = r.findings.map((f) => rank[f.severity])
    expect(ranks).toEqual([...ranks].sort((a, b) => a - b))
    expect(new Set(r.findings.map((f) => f.severity)).size).toBeGreaterThan(1)
  })

  it('disc to drum on the rear is reported', () => {
    const input = vehicle()
    input.replacement = { axles: { rear: { kind: 'drum', wheelCylinderBoreMm: 19.05, drumDiameterMm: 228, brakeFactor: 2 } } }
    const r = computeHydraulics(input)
    expect(codes(r.findings)).toContain('rear-brake-kind-change')
    expect(r.replacement!.axles.rear.shoeForceN).toBeGreaterThan(0)
    expect(r.replacement!.axles.rear.padForceN).toBeNull()
  })

  it('an empty replacement is noted, not compared', () => {
    const input = vehicle()
    input.replacement = {}
    const r = computeHydraulics(input)
    expect(codes(r.findings)).toContain('no-replacement-parts')
  })
})

describe('helpers', () => {
  it('percentChange', () => {
    expect(percentChange(100, 115)).toBeCloseTo(15, 12)
    expect(percentChange(0, 5)).toBeNull()
  })

  it('sortFindings keeps order within a severity', () => {
    const f: BoreCheckFinding[] = [
      { severity: 'info', code: 'a', message: '' },
      { severity: 'danger', code: 'b', message: '' },
      { severity: 'info', code: 'c', message: '' },
      { severity: 'warning', code: 'd', message: '' },
      { severity: 'danger', code: 'e', message: '' },
    ]
    expect(codes(sortFindings(f))).toEqual(['b', 'e', 'd', 'a', 'c'])
  })
})

describe('nothing is computed from half an input', () => {
  it('throws BrakeInputError naming the field', () => {
    const input = vehicle()
    input.masterCylinder.boreMm = 0
    expect(() => computeHydraulics(input)).toThrow(BrakeInputError)
    try {
      computeHydraulics(input)
    } catch (e) {
      expect((e as BrakeInputError).issues).toEqual([
        { field: 'masterCylinder.boreMm', message: 'master cylinder bore must be greater than 0 mm' },
      ])
      expect((e as Error).message).toMatch(/^masterCylinder\.boreMm: /)
    }
  })

  it('throws for a missing axle', () => {
    const input = vehicle() as { axles: Record<string, unknown> }
    delete input.axles.rear
    expect(() => computeHydraulics(input as HydraulicsInputRaw)).toThrow(/axles\.rear: rear axle is required/)
  })
})

describe('grip, balance and the order of locking', () => {
  /** The same car with its vehicle data: 1350 kg, wheelbase 2600 mm, CG 540 mm, 58 % on the front; laden 1800 kg. */
  function withVehicle(extra: Record<string, unknown> = {}): HydraulicsInputRaw {
    const { massKg: _m, ...rest } = vehicle() as HydraulicsInputRaw & { massKg?: number }
    return {
      ...rest, boosterRunOutKPa: 10000,
      vehicle: { massKg: 1350, wheelbaseMm: 2600, cogHeightMm: 540, frontStaticSharePercent: 58, laden: { massKg: 1800, cogHeightMm: 555, frontStaticSharePercent: 55 }, ...extra },
    }
  }

  it('answers the contract: per axle effectiveRadiusMm, decelerationMps2 and adhesion { front, rear, locksFirst }', () => {
    const r = computeHydraulics(withVehicle())
    expect(r.original.axles.front.effectiveRadiusMm).toBeGreaterThan(0)
    expect(r.decelerationMps2).toBe(r.original.decelerationMps2)
    expect(r.adhesion).toEqual(r.original.adhesion)
    expect(['front', 'rear', 'together']).toContain(r.adhesion!.locksFirst)
    // never more than the tyre-road friction: 0.8 g by default, said in the assumptions
    expect(r.decelerationMps2!).toBeLessThanOrEqual(0.8 * 9.80665 + 1e-9)
    expect(r.assumptions.join(' ')).toMatch(/Tyre-road friction 0\.8/)
    expect(r.lockingOrder.original).toHaveLength(2)
    expect(r.serviceStop.original.map((s) => s.loadState)).toEqual(['unladen', 'laden'])
  })

  it('the original locks the front first in the band; much bigger rear calipers push it out: danger, naming the band', () => {
    const original = computeHydraulics(withVehicle())
    expect(original.lockingOrder.original!.every((o) => o.meets)).toBe(true)
    const input = withVehicle()
    input.replacement = { axles: { rear: { kind: 'disc', caliper: 'floating', pistonDiametersMm: [48], discDiameterMm: 260, frictionCoefficient: 0.38 } } }
    const r = computeHydraulics(input)
    expect(r.lockingOrder.replacement!.some((o) => !o.meets)).toBe(true)
    const f = r.findings.find((x) => x.code === 'locking-order-worse')
    expect(f?.severity).toBe('danger')
    expect(f?.message).toMatch(/UN ECE Regulation 13-H Annex 5/)
    expect(f?.message).toMatch(/z = 0\.\d\d to 0\.80 unladen/)
  })

  it('with electronic distribution fitted the same change is a warning that says so', () => {
    const input = withVehicle({ electronicDistribution: true })
    input.replacement = { axles: { rear: { kind: 'disc', caliper: 'floating', pistonDiametersMm: [48], discDiameterMm: 260, frictionCoefficient: 0.38 } } }
    const f = computeHydraulics(input).findings.find((x) => x.code === 'locking-order-worse')
    expect(f?.severity).toBe('warning')
    expect(f?.message).toMatch(/electronic brake-force distribution/)
  })

  it('a weak system fails the FMVSS No. 135 service stop at 500 N in the laden state', () => {
    const input = withVehicle()
    input.pedalRatio = 2
    input.boosterRatio = 1
    const r = computeHydraulics(input)
    const laden = r.serviceStop.original.find((s) => s.loadState === 'laden')!
    expect(laden.pedalForceN).toBe(500)
    expect(laden.meets).toBe(false)
    expect(r.findings.filter((f) => f.code === 'service-stop-long').some((f) => /, laden \(1800 kg\)/.test(f.message))).toBe(true)
  })
})
