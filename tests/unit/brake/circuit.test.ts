/**
 * Circuit failure: which wheels still brake (check-values.md, dual-circuit layouts), what is left of the braking,
 * the grip those wheels have, and the FMVSS No. 135 partial-failure figure with its build-up term.
 */
import { describe, it, expect } from 'vitest'
import { circuitFailure } from '#shared/utils/brake/circuit'
import { computeChain, type BrakeSystem } from '#shared/utils/brake/hydraulics'
import { computeHydraulics } from '#shared/utils/brake/bore-check'
import { fmvssStoppingDistanceM } from '#shared/utils/brake/stopping'

function expectRel(actual: number, expected: number, tol: number) {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(tol * Math.abs(expected))
}

function system(split: BrakeSystem['split'], pedalForceN = 60): BrakeSystem {
  return {
    pedalForceN, pedalRatio: 4, boosterRatio: 3, masterCylinder: { boreMm: 22.22 }, split, massKg: 1500,
    axles: {
      front: { kind: 'disc', caliper: 'floating', pistonDiametersMm: [54], discDiameterMm: 280, padHeightMm: 55, frictionCoefficient: 0.4, tyreRollingRadiusMm: 305 },
      rear: { kind: 'drum', wheelCylinderBoreMm: 19.05, drumDiameterMm: 228, brakeFactor: 2, tyreRollingRadiusMm: 305 },
    },
  }
}

describe('front/rear split', () => {
  const chain = computeChain(system('front-rear'))
  const result = circuitFailure(chain, 'front-rear', 60)

  it('a failed circuit leaves one axle only', () => {
    expect(result.map((r) => r.failedCircuit)).toEqual(['front', 'rear'])
    expect(result[0]!.wheelsBraking).toEqual(['rear-left', 'rear-right'])
    expect(result[0]!.remainingSharePercent).toBeCloseTo(chain.rearSharePercent, 12)
    expect(result[1]!.remainingSharePercent).toBeCloseTo(chain.frontSharePercent, 12)
  })

  it('below the grip limit the deceleration is the remaining tyre force / mass, and the stop counts the 0.10 V term', () => {
    // unit check (restates the formulas): a light pedal keeps the front alone under μ g
    const front = result[1]!
    expectRel(front.decelerationMps2!, chain.axles.front.axleTyreForceN! / 1500, 1e-12)
    expectRel(front.stoppingDistanceFrom100KmhM!, fmvssStoppingDistanceM(100, front.decelerationMps2!), 1e-12)
    expect(typeof front.meetsReference).toBe('boolean')
  })

  it('a hard pedal on the front alone is held to the grip of the front wheels', () => {
    const hard = computeChain({ ...system('front-rear', 400), vehicle: { massKg: 1500, wheelbaseMm: 2600, cogHeightMm: 520, frontStaticSharePercent: 60 }, massKg: undefined })
    const [, frontOnly] = circuitFailure(hard, 'front-rear', 400, { massKg: 1500, wheelbaseMm: 2600, cogHeightMm: 520, frontStaticSharePercent: 60 })
    // μ ψ / (1 − μ χ) = 0.8 × 0.6 / (1 − 0.8 × 0.2) = 0.571429 g (worked in vehicle.test.ts)
    expectRel(frontOnly!.decelerationG!, 0.571429, 1e-6)
    expect(frontOnly!.notes.join(' ')).toMatch(/tyre grip/)
  })
})

describe('diagonal split', () => {
  it('each failed circuit leaves half the braking, with a pull note', () => {
    const result = circuitFailure(computeChain(system('diagonal')), 'diagonal', 60)
    for (const r of result) {
      expect(r.remainingSharePercent).toBeCloseTo(50, 10)
      expect(r.notes.join(' ')).toMatch(/pull/)
    }
    expect(result[0]!.wheelsBraking).toEqual(['front-right', 'rear-left'])
  })
})

describe('when the comparison is not possible', () => {
  it('no mass: no deceleration, no verdict', () => {
    const [r] = circuitFailure(computeChain({ ...system('diagonal'), massKg: undefined }), 'diagonal', 60)
    expect(r!.decelerationMps2).toBeNull()
    expect(r!.meetsReference).toBeNull()
  })

  it('pedal force above 500 N: figures given, no FMVSS verdict', () => {
    const [r] = circuitFailure(computeChain(system('front-rear', 700)), 'front-rear', 700)
    expect(r!.decelerationMps2).not.toBeNull()
    expect(r!.meetsReference).toBeNull()
    expect(r!.notes.join(' ')).toMatch(/500 N/)
  })

  it('a weak failed-circuit stop is flagged against 168 m (FMVSS No. 135 S7.10, from memory)', () => {
    const s = system('front-rear', 100)
    s.axles.rear = { kind: 'drum', wheelCylinderBoreMm: 12, drumDiameterMm: 180, brakeFactor: 1, tyreRollingRadiusMm: 305 }
    const r = computeHydraulics(s)
    expect(r.circuitFailure.original[0]!.meetsReference).toBe(false)
    expect(r.findings.map((f) => f.code)).toContain('circuit-failure-short')
  })
})
