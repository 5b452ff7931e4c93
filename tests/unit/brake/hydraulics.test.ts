import { describe, it, expect } from 'vitest'
import { unit, type Unit } from 'mathjs'
import {
  computeAxle,
  computeChain,
  discTorqueNm,
  drumTorqueNm,
  frontSharePercent,
  hydraulicRatio,
  linePressureKPa,
  masterCylinderStrokeMm,
  pedalTravelMm,
  pistonForceN,
  pressureKPa,
  pushrodForceN,
  totalPistonAreaMm2,
  tyreForceN,
  workshopEffectiveRadiusMm,
  type BrakeSystem,
} from '#shared/utils/brake/hydraulics'
import type { Axle, DiscAxle } from '#shared/utils/brake/schemas'
import { inchToMm, kPaToPsi, lbfToN } from '#shared/utils/brake/units'
import { prng } from '../../../server/seed/catalogue-data'

/** mathjs types unit arithmetic as Unit | number; these expressions always stay units. */
const asUnit = (x: Unit | number) => x as Unit

function expectRel(actual: number, expected: number, tol: number) {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(tol * Math.abs(expected))
}

/** The seed's small seeded generator (mulberry32), so property tests are repeatable. */
const rng = prng
const between = (r: () => number, lo: number, hi: number) => lo + (hi - lo) * r()
/** A = π d² / 4 (check-values.md), worked here, not with the library. */
const pistonArea = (d: number) => (Math.PI * d * d) / 4

/** Published example: 100 lbf pedal, 6:1 pedal ratio, no booster. Result in psi. */
function examplePsi(boreInch: number): number {
  const pushrod = pushrodForceN(lbfToN(100), 6, 1)
  return kPaToPsi(linePressureKPa(pushrod, inchToMm(boreInch)))
}

describe('line pressure against published worked examples', () => {
  it('MC bore 1 in -> 763.9 psi', () => {
    // hotrodheaven.com brakes tech page [PUB]: 100 lbf × 6 on a 1 in bore = 764 psi with π = 3.14
    expectRel(examplePsi(1), 763.9, 0.001)
    expectRel(examplePsi(1), 764, 0.001)
  })

  it('MC bore 7/8 in -> 997.8 psi', () => {
    // hotrodheaven.com brakes tech page [PUB]: 998 psi with π = 3.14
    expectRel(examplePsi(7 / 8), 997.8, 0.001)
    expectRel(examplePsi(7 / 8), 998, 0.001)
  })

  it('MC bore 1-1/8 in -> 603.6 psi', () => {
    // hotrodheaven.com brakes tech page; calcady.com brake-pressure page [PUB]: 603-604 psi
    expectRel(examplePsi(1.125), 603.6, 0.001)
  })

  it('agrees with mathjs unit arithmetic (P = F / A) to 1e-9', () => {
    // mathjs 15 units as a general-purpose reference: 600 lbf / (π/4 · (1 in)²) in kPa
    const reference = asUnit(unit(600, 'lbf').divide(unit(Math.PI / 4, 'inch^2'))).toNumber('kPa')
    expectRel(linePressureKPa(lbfToN(600), 25.4), reference, 1e-9)
  })

  it('100 lbf on 1 in² and 2 in²', () => {
    // NIST SP 811 (2008) App. B.8/B.9: 100 psi = 689.4757 kPa, 50 psi = 344.7379 kPa
    expect(pressureKPa(lbfToN(100), 645.16)).toBeCloseTo(689.4757, 4)
    expect(pressureKPa(lbfToN(100), 2 * 645.16)).toBeCloseTo(344.7379, 4)
  })
})

describe('workshop rule for the effective radius', () => {
  it('11.75 in disc, 2.75 in piston -> 5.1875 in', () => {
    // board.moparts.org thread [PUB]: r_eff = (2 D − d) / 4
    expectRel(workshopEffectiveRadiusMm(inchToMm(11.75), inchToMm(2.75)), inchToMm(5.1875), 1e-12)
  })

  it('is used with the largest piston when none is given', () => {
    const axle: DiscAxle = { kind: 'disc', caliper: 'fixed', pistonDiametersMm: [38, 44], discDiameterMm: 320, frictionCoefficient: 0.4 }
    const r = computeAxle(axle, 10000, 23.81)
    expect(r.effectiveRadiusSource).toBe('workshop-rule')
    expect(r.effectiveRadiusMm).toBeCloseTo((2 * 320 - 44) / 4, 12)
    const given = computeAxle({ ...axle, effectiveRadiusMm: 135 }, 10000, 23.81)
    expect(given.effectiveRadiusMm).toBe(135)
    expect(given.effectiveRadiusSource).toBe('given')
  })
})

describe('derived bore-change ratios', () => {
  it('MC 7/8 in replaced by 1 in: pressure × 0.7656', () => {
    // check-values.md, derived from P = F / A: (7/8)² = 0.765625
    const f = 2000
    expectRel(linePressureKPa(f, inchToMm(1)) / linePressureKPa(f, inchToMm(7 / 8)), 0.7656, 1e-4)
  })

  it('caliper piston 54 mm replaced by 57 mm: clamp force and fluid demand × 1.1142', () => {
    // check-values.md, derived: (57/54)² = 1.11420
    const base: DiscAxle = { kind: 'disc', caliper: 'floating', pistonDiametersMm: [54], discDiameterMm: 280, frictionCoefficient: 0.4, pistonTravelMm: 0.4 }
    const a = computeAxle(base, 8000, 22.22)
    const b = computeAxle({ ...base, pistonDiametersMm: [57] }, 8000, 22.22)
    expectRel(b.padForceN! / a.padForceN!, 1.1142, 1e-4)
    expectRel(b.fluidVolumeMm3 / a.fluidVolumeMm3, 1.1142, 1e-4)
  })
})

describe('chain formulas against mathjs units', () => {
  it('pad force, torque and tyre force', () => {
    // mathjs 15 units as a general-purpose reference, 1e-9 relative
    const p = 9000 // kPa
    const area = pistonArea(57)
    const pad = pistonForceN(p, area)
    expectRel(pad, unit(p, 'kPa').multiply(unit(area, 'mm^2')).toNumber('N'), 1e-9)
    const torque = discTorqueNm(0.42, pad, 120)
    expectRel(torque, unit(2 * 0.42 * pad, 'N').multiply(unit(120, 'mm')).toNumber('N m'), 1e-9)
    expectRel(tyreForceN(torque, 310), asUnit(unit(torque, 'N m').divide(unit(310, 'mm'))).toNumber('N'), 1e-9)
    const drum = drumTorqueNm(3000, 2.2, 228)
    expectRel(drum, unit(3000 * 2.2, 'N').multiply(unit(114, 'mm')).toNumber('N m'), 1e-9)
  })

  it('fluid volume, MC stroke and pedal travel', () => {
    // Fluid volume = piston area × travel; stroke = volume / MC area (check-values.md, Pascal's law chain)
    const volume = 2 * pistonArea(54) * 0.5
    const stroke = masterCylinderStrokeMm(volume, 22.22)
    expectRel(stroke, volume / ((Math.PI * 22.22 ** 2) / 4), 1e-12)
    expect(pedalTravelMm(stroke, 4)).toBeCloseTo(4 * stroke, 12)
    // mathjs: mm³ / mm² = mm
    expectRel(stroke, asUnit(unit(volume, 'mm^3').divide(unit((Math.PI * 22.22 ** 2) / 4, 'mm^2'))).toNumber('mm'), 1e-9)
  })

  it('fixed caliper: pistons of one side push one pad, both sides take fluid', () => {
    // check-values.md: fixed (opposed) caliper pad force = P × area of one side
    const fixed = computeAxle({ kind: 'disc', caliper: 'fixed', pistonDiametersMm: [44], discDiameterMm: 300, frictionCoefficient: 0.4, pistonTravelMm: 0.5 }, 10000, 22)
    const floating = computeAxle({ kind: 'disc', caliper: 'floating', pistonDiametersMm: [44], discDiameterMm: 300, frictionCoefficient: 0.4, pistonTravelMm: 0.5 }, 10000, 22)
    expect(fixed.padForceN).toBeCloseTo(floating.padForceN!, 9)
    expect(fixed.fluidVolumeMm3).toBeCloseTo(2 * floating.fluidVolumeMm3, 9)
    // per axle: 2 wheels × 2 sides × area × travel
    expect(fixed.fluidVolumeMm3).toBeCloseTo(2 * 2 * pistonArea(44) * 0.5, 9)
  })

  it('drum: double-acting wheel cylinder, shoe force and torque', () => {
    const r = computeAxle({ kind: 'drum', wheelCylinderBoreMm: 20.64, drumDiameterMm: 230, brakeFactor: 2, pistonTravelMm: 1 }, 7000, 22)
    expect(r.padForceN).toBeNull()
    expect(r.shoeForceN).toBeCloseTo(7 * pistonArea(20.64), 9)
    expect(r.torquePerWheelNm).toBeCloseTo((r.shoeForceN! * 2 * 115) / 1000, 9)
    expect(r.fluidVolumeMm3).toBeCloseTo(2 * 2 * pistonArea(20.64), 9)
  })

  it('hydraulic ratio is wheel area / MC area', () => {
    expect(hydraulicRatio(pistonArea(54), 22.22)).toBeCloseTo((54 / 22.22) ** 2, 12)
  })
})

function randomAxle(r: () => number, front: boolean): Axle {
  if (front || r() < 0.5) {
    const n = 1 + Math.floor(r() * 2)
    return {
      kind: 'disc',
      caliper: r() < 0.5 ? 'fixed' : 'floating',
      pistonDiametersMm: Array.from({ length: n }, () => between(r, 30, 60)),
      discDiameterMm: between(r, 240, 360),
      frictionCoefficient: between(r, 0.3, 0.5),
      tyreRollingRadiusMm: between(r, 280, 350),
      pistonTravelMm: between(r, 0.2, 1),
    }
  }
  return {
    kind: 'drum',
    wheelCylinderBoreMm: between(r, 15, 25),
    drumDiameterMm: between(r, 180, 280),
    brakeFactor: between(r, 1.5, 3),
    tyreRollingRadiusMm: between(r, 280, 350),
  }
}

function randomSystem(r: () => number): BrakeSystem {
  return {
    pedalForceN: between(r, 50, 800),
    pedalRatio: between(r, 2.5, 7),
    boosterRatio: between(r, 1, 8),
    masterCylinder: { boreMm: between(r, 17, 28), strokeMm: 36 },
    split: r() < 0.5 ? 'front-rear' : 'diagonal',
    massKg: between(r, 800, 3000),
    axles: { front: randomAxle(r, true), rear: randomAxle(r, false) },
  }
}

describe('properties over random systems (seeded)', () => {
  const N = 300

  it('doubling piston area doubles pad force', () => {
    const r = rng(1)
    for (let i = 0; i < N; i++) {
      const axle = randomAxle(r, true) as DiscAxle
      const p = between(r, 1000, 15000)
      const a = computeAxle(axle, p, 22)
      // same pistons twice over, and each diameter × √2: both double the area
      const twice = computeAxle({ ...axle, pistonDiametersMm: [...axle.pistonDiametersMm, ...axle.pistonDiametersMm] }, p, 22)
      const wider = computeAxle({ ...axle, pistonDiametersMm: axle.pistonDiametersMm.map((d) => d * Math.SQRT2) }, p, 22)
      expectRel(twice.padForceN!, 2 * a.padForceN!, 1e-12)
      expectRel(wider.padForceN!, 2 * a.padForceN!, 1e-12)
      expect(a.pistonAreaMm2).toBe(totalPistonAreaMm2(axle.pistonDiametersMm))
      expectRel(wider.pistonAreaMm2, 2 * a.pistonAreaMm2, 1e-12)
    }
  })

  it('a larger MC bore lowers pressure by the square of the ratio, and stroke likewise', () => {
    const r = rng(2)
    for (let i = 0; i < N; i++) {
      const sys = randomSystem(r)
      const bigger = between(r, 1.01, 1.6) * sys.masterCylinder.boreMm
      const a = computeChain(sys)
      const b = computeChain({ ...sys, masterCylinder: { boreMm: bigger } })
      const ratio = (sys.masterCylinder.boreMm / bigger) ** 2
      expectRel(b.linePressureKPa / a.linePressureKPa, ratio, 1e-12)
      expectRel(b.masterCylinderStrokeMm / a.masterCylinderStrokeMm, ratio, 1e-12)
      expect(b.linePressureKPa).toBeLessThan(a.linePressureKPa)
    }
  })

  it('front and rear shares always sum to 100 and stay within 0-100', () => {
    const r = rng(3)
    for (let i = 0; i < N; i++) {
      const sys = randomSystem(r)
      if (r() < 0.3) {
        // without rolling radii the share comes from torque; still sums to 100
        delete sys.axles.rear.tyreRollingRadiusMm
      }
      const c = computeChain(sys)
      expect(c.frontSharePercent + c.rearSharePercent).toBeCloseTo(100, 10)
      expect(c.frontSharePercent).toBeGreaterThanOrEqual(0)
      expect(c.frontSharePercent).toBeLessThanOrEqual(100)
    }
  })

  it('torque is linear in pedal force and friction coefficient', () => {
    const r = rng(4)
    for (let i = 0; i < N; i++) {
      const sys = randomSystem(r)
      const a = computeChain(sys)
      const b = computeChain({ ...sys, pedalForceN: 2 * sys.pedalForceN })
      expectRel(b.axles.front.torquePerWheelNm, 2 * a.axles.front.torquePerWheelNm, 1e-12)
      expectRel(b.frontSharePercent, a.frontSharePercent, 1e-12)
      const front = sys.axles.front as DiscAxle
      const c = computeChain({ ...sys, axles: { ...sys.axles, front: { ...front, frictionCoefficient: front.frictionCoefficient / 2 } } })
      expectRel(c.axles.front.torquePerWheelNm, a.axles.front.torquePerWheelNm / 2, 1e-12)
    }
  })

  it('share helper', () => {
    expect(frontSharePercent(3, 1)).toBe(75)
    expect(frontSharePercent(0, 0)).toBe(0)
  })
})
