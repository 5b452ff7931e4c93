/**
 * Roller brake tester figures against a worked example: the MOT Inspection Manual (DVSA, 2012) §3.8 works a vehicle's
 * brake efficiency as the total brake effort / the vehicle weight × 100, and the imbalance on an axle as (higher −
 * lower) / higher × 100. The example below is worked by hand with those formulas, the working beside each check.
 */
import { describe, expect, it } from 'vitest'
import { unit } from 'mathjs'
import { BRAKE_TEST_LIMITS, computeBrakeTest, parseBrakeTestInput } from '#shared/utils/brake/brake-test'

function expectRel(actual: number, expected: number, tol: number) {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(tol * Math.abs(expected))
}

/*
 * A 1350 kg car on the rollers: service brake front left 3200 N, front right 2800 N, rear left 1400 N, rear right
 * 1200 N; parking brake rear left 1100 N, rear right 900 N. Weight = 1350 × 9.80665 = 13 238.98 N.
 *  - service: (3200 + 2800 + 1400 + 1200) / 13 238.98 = 8600 / 13 238.98 = 64.960 %: at least 50 %, passes;
 *  - parking: (1100 + 900) / 13 238.98 = 15.107 %: under 16 %, fails;
 *  - front imbalance (3200 − 2800) / 3200 = 12.5 %; rear (1400 − 1200) / 1400 = 14.286 %: both within 30 %.
 */
const readings = [
  { wheel: 'front_left', serviceN: 3200 }, { wheel: 'front_right', serviceN: 2800 },
  { wheel: 'rear_left', serviceN: 1400, parkingN: 1100 }, { wheel: 'rear_right', serviceN: 1200, parkingN: 900 },
] as const

describe('roller brake tester, worked example', () => {
  const r = computeBrakeTest({ massKg: 1350, readings: [...readings] })

  it('service efficiency 64.960 %, and in kilograms-force as the manual counts it: 876.96 kgf / 1350 kg', () => {
    expectRel(r.serviceEfficiencyPercent, 64.9597, 1e-5)
    // mathjs units: the same figure from efforts in kgf against the weight in kg
    expectRel(r.serviceEfficiencyPercent, (unit(8600, 'N').toNumber('kgf') / 1350) * 100, 1e-9)
    expect(r.verdicts.find((v) => v.code === 'service-efficiency')!.verdict).toBe('ok')
  })

  it('parking efficiency 15.107 %: under the 16 % pass mark', () => {
    expectRel(r.parkingEfficiencyPercent!, 15.1069, 1e-5)
    const v = r.verdicts.find((x) => x.code === 'parking-efficiency')!
    expect(v.verdict).toBe('fail')
    expect(v.limit).toBe(16)
  })

  it('imbalance 12.5 % front and 14.286 % rear, within 30 %', () => {
    expect(r.imbalancePercent.front).toBeCloseTo(12.5, 12)
    expectRel(r.imbalancePercent.rear!, 14.2857, 1e-5)
    expect(r.verdicts.filter((v) => v.code.startsWith('imbalance')).every((v) => v.verdict === 'ok')).toBe(true)
  })

  it('an unbalanced front axle names the weaker wheel: 2000 against 3200 N is 37.5 % (fail, the steered axle)', () => {
    const uneven = computeBrakeTest({ massKg: 1350, readings: [{ wheel: 'front_left', serviceN: 2000 }, { wheel: 'front_right', serviceN: 3200 }] })
    const v = uneven.verdicts.find((x) => x.code === 'imbalance-front')!
    expect(v).toMatchObject({ verdict: 'fail', wheel: 'front_left' })
    expect(v.message).toMatch(/^The front left brake gives 2\.00 kN against 3\.20 kN on the front right: 37\.5 % imbalance/)
    expect(uneven.assumptions.join(' ')).toMatch(/Only 2 of 4 wheels/)
  })

  it('limits are configurable; the defaults are the MOT pass marks', () => {
    expect(BRAKE_TEST_LIMITS).toEqual({ serviceEfficiencyPercent: 50, parkingEfficiencyPercent: 16, imbalancePercent: 30 })
    const strict = computeBrakeTest({ massKg: 1350, readings: [...readings], limits: { serviceEfficiencyPercent: 70 } })
    expect(strict.verdicts.find((v) => v.code === 'service-efficiency')!.verdict).toBe('fail')
  })

  it('readings far over the test weight are a unit slip, refused with the reason', () => {
    const r = parseBrakeTestInput({ massKg: 1350, readings: [{ wheel: 'front_left', serviceN: 12000 }, { wheel: 'front_right', serviceN: 11000 }] })
    expect(r.ok).toBe(false)
    if (!r.ok) expect(r.issues[0]).toMatchObject({ field: 'readings', message: expect.stringMatching(/check the unit/) })
    const twice = parseBrakeTestInput({ massKg: 1350, readings: [{ wheel: 'front_left', serviceN: 1 }, { wheel: 'front_left', serviceN: 2 }] })
    expect(twice.ok).toBe(false)
    if (!twice.ok) expect(twice.issues[0]!.field).toBe('readings[1]')
  })
})
