import { describe, it, expect } from 'vitest'
import { unit, type Unit } from 'mathjs'
import { FMVSS_135, circuitFailure, stoppingDistanceM } from '#shared/utils/brake/circuit'
import { computeChain, type BrakeSystem } from '#shared/utils/brake/hydraulics'
import { computeHydraulics } from '#shared/utils/brake/bore-check'

/** mathjs types unit arithmetic as Unit | number; these expressions always stay units. */
const asUnit = (x: Unit | number) => x as Unit
const speedSquared = () => unit(100, 'km/h').multiply(unit(100, 'km/h'))

function expectRel(actual: number, expected: number, tol: number) {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(tol * Math.abs(expected))
}

function system(split: BrakeSystem['split'], pedalForceN = 250): BrakeSystem {
  return {
    pedalForceN,
    pedalRatio: 4,
    boosterRatio: 3,
    masterCylinder: { boreMm: 22.22 },
    split,
    massKg: 1500,
    axles: {
      front: { kind: 'disc', caliper: 'floating', pistonDiametersMm: [54], discDiameterMm: 280, frictionCoefficient: 0.4, tyreRollingRadiusMm: 305 },
      rear: { kind: 'drum', wheelCylinderBoreMm: 19.05, drumDiameterMm: 228, brakeFactor: 2, tyreRollingRadiusMm: 305 },
    },
  }
}

describe('FMVSS No. 135 reference figures', () => {
  it('service stop: 70 m from 100 km/h at ≤ 500 N pedal force', () => {
    // FMVSS No. 135 S7.5 (49 CFR 571.135) [STD]
    expect(FMVSS_135.service.distanceM).toBe(70)
    expect(FMVSS_135.service.speedKmh).toBe(100)
    expect(FMVSS_135.service.maxPedalForceN).toBe(500)
    // v² / (2 s) with mathjs units: (100 km/h)² / (2 × 70 m)
    const ref = asUnit(speedSquared().divide(unit(140, 'm'))).toNumber('m/s^2')
    expectRel(FMVSS_135.service.meanDecelerationMps2, ref, 1e-9)
  })

  it('partial failure figure is marked as recalled', () => {
    // from memory: FMVSS No. 135 S7.10, 0.10 V + 0.0158 V² = 168 m at 100 km/h
    expect(FMVSS_135.partialFailure.distanceM).toBeCloseTo(0.1 * 100 + 0.0158 * 100 * 100, 9)
    expect(FMVSS_135.partialFailure.source).toMatch(/from memory/)
  })

  it('stopping distance s = v² / (2 a) agrees with mathjs', () => {
    // mathjs 15 units, 1e-9 relative
    const ref = asUnit(speedSquared().divide(unit(2 * 6.5, 'm/s^2'))).toNumber('m')
    expectRel(stoppingDistanceM(100, 6.5), ref, 1e-9)
  })
})

describe('front/rear split', () => {
  const chain = computeChain(system('front-rear'))
  const result = circuitFailure(chain, 'front-rear', 250, 1500)

  it('a failed circuit leaves one axle only', () => {
    // check-values.md, dual-circuit layouts
    expect(result.map((r) => r.failedCircuit)).toEqual(['front', 'rear'])
    expect(result[0]!.wheelsBraking).toEqual(['rear-left', 'rear-right'])
    expect(result[0]!.remainingSharePercent).toBeCloseTo(chain.rearSharePercent, 12)
    expect(result[1]!.remainingSharePercent).toBeCloseTo(chain.frontSharePercent, 12)
    expect(result[0]!.remainingSharePercent + result[1]!.remainingSharePercent).toBeCloseTo(100, 10)
  })

  it('remaining deceleration = remaining tyre force / mass', () => {
    const front = result[1]!
    expectRel(front.remainingBrakingForceN!, chain.axles.front.axleTyreForceN!, 1e-12)
    expectRel(front.decelerationMps2!, chain.axles.front.axleTyreForceN! / 1500, 1e-12)
    expectRel(front.stoppingDistanceFrom100KmhM!, stoppingDistanceM(100, front.decelerationMps2!), 1e-12)
    expect(typeof front.meetsReference).toBe('boolean')
  })
})

describe('diagonal split', () => {
  it('each failed circuit leaves half the braking, with a pull note', () => {
    // check-values.md: diagonal split leaves about half the braking
    const chain = computeChain(system('diagonal'))
    const result = circuitFailure(chain, 'diagonal', 250, 1500)
    expect(result).toHaveLength(2)
    for (const r of result) {
      expect(r.remainingSharePercent).toBeCloseTo(50, 10)
      expect(r.wheelsBraking).toHaveLength(2)
      expect(r.notes.join(' ')).toMatch(/pull/)
    }
    expect(result[0]!.wheelsBraking).toEqual(['front-right', 'rear-left'])
  })
})

describe('when the comparison is not possible', () => {
  it('no mass: no deceleration, no verdict', () => {
    const chain = computeChain({ ...system('diagonal'), massKg: undefined })
    const [r] = circuitFailure(chain, 'diagonal', 250)
    expect(r!.decelerationMps2).toBeNull()
    expect(r!.meetsReference).toBeNull()
  })

  it('pedal force above 500 N: figures given, no FMVSS verdict', () => {
    const chain = computeChain(system('front-rear', 700))
    const [r] = circuitFailure(chain, 'front-rear', 700, 1500)
    expect(r!.decelerationMps2).not.toBeNull()
    expect(r!.meetsReference).toBeNull()
    expect(r!.notes.join(' ')).toMatch(/500 N/)
  })

  it('computeHydraulics reports circuit failure for original and replacement', () => {
    const s = system('front-rear')
    const r = computeHydraulics({ ...s, replacement: { masterCylinder: { boreMm: 23.81 } } })
    expect(r.circuitFailure.original).toHaveLength(2)
    expect(r.circuitFailure.replacement).toHaveLength(2)
    expect(r.circuitFailure.replacement![1]!.decelerationMps2!).toBeLessThan(r.circuitFailure.original[1]!.decelerationMps2!)
  })

  it('a weak failed-circuit stop is flagged', () => {
    // tiny rear brakes, light pedal: rear-only stop well beyond 168 m (FMVSS No. 135 S7.10, from memory)
    const s = system('front-rear', 100)
    s.axles.rear = { kind: 'drum', wheelCylinderBoreMm: 12, drumDiameterMm: 180, brakeFactor: 1, tyreRollingRadiusMm: 305 }
    const r = computeHydraulics(s)
    expect(r.circuitFailure.original[0]!.meetsReference).toBe(false)
    expect(r.findings.map((f) => f.code)).toContain('circuit-failure-short')
  })
})
