/**
 * The hydraulic chain against outside values: published worked examples (named beside each check), values worked by
 * hand from the published formulas (the working in the comment), and mathjs units as a general-purpose reference.
 * Checks that only restate a formula in another form are kept as unit checks and say so.
 */
import { describe, it, expect } from 'vitest'
import { unit, type Unit } from 'mathjs'
import {
  computeAxle, computeChain, discTorqueNm, drumTorqueNm, frontSharePercent, hydraulicRatio, linePressureKPa,
  masterCylinderStrokeMm, pedalTravelMm, pistonForceN, pressureKPa, totalPistonAreaMm2, tyreForceN,
  type BrakeSystem,
} from '#shared/utils/brake/hydraulics'
import { boostedPressure } from '#shared/utils/brake/booster'
import { padSweep, uniformPressureRadiusMm, uniformWearRadiusMm } from '#shared/utils/brake/effective-radius'
import { SHOE_LAYOUT_BRAKE_FACTORS } from '#shared/utils/brake/shoe-layouts'
import { adhesionUtilisation, dynamicAxleLoadsN, type LoadState } from '#shared/utils/brake/vehicle-load'
import { stoppingDistanceM } from '#shared/utils/brake/stopping'
import type { Axle, DiscAxle } from '#shared/utils/brake/schemas'
import { inchToMm, kPaToPsi, lbfToN, mmToInch, nToLbf } from '#shared/utils/brake/units'
import { prng } from '../../../server/seed/catalogue-data'

/** mathjs types unit arithmetic as Unit | number; these expressions always stay units. */
const asUnit = (x: Unit | number) => x as Unit

function expectRel(actual: number, expected: number, tol: number) {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(tol * Math.abs(expected))
}

/** Published example: 100 lbf pedal, 6:1 pedal ratio, no booster. Result in psi. */
function examplePsi(boreInch: number): number {
  return kPaToPsi(boostedPressure(lbfToN(100), 6, 1, inchToMm(boreInch)).linePressureKPa)
}

describe('line pressure against published worked examples', () => {
  it('100 lbf × 6:1 on 1, 7/8 and 1-1/8 in bores -> 763.9, 997.8, 603.6 psi', () => {
    // hotrodheaven.com brakes tech page [PUB] (764 / 998 psi with π = 3.14); 1-1/8 in also calcady.com brake-pressure page
    expectRel(examplePsi(1), 763.9, 0.001)
    expectRel(examplePsi(7 / 8), 997.8, 0.001)
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

describe('the booster runs out at its knee', () => {
  // Worked by hand from the knee as the brake engineering brief gives it: F_in = pedal force × pedal ratio;
  // P = F_in × boost / A up to P_ro, then P = P_ro + (F_in − P_ro × A / boost) / A.
  // Pedal ratio 4, boost 5, master cylinder 7/8 in = 22.225 mm: A = π × 22.225² / 4 = 0.785398 × 493.950625 = 387.94791 mm².
  // Run-out 9000 kPa = 9 N/mm².
  const A = 387.94791

  it('knee at P_ro × A / (boost × pedal ratio) = 9 × 387.94791 / 20 = 174.5766 N of pedal force', () => {
    expectRel(boostedPressure(200, 4, 5, 22.225, 9000).kneePedalForceN!, 9 * A / 20, 1e-6)
    expectRel(boostedPressure(200, 4, 5, 22.225, 9000).kneePedalForceN!, 174.5766, 1e-6)
  })

  it('below the knee: 120 N -> F_in 480 N -> 480 × 5 / 387.94791 = 6.186397 N/mm² = 6186.40 kPa, boosted', () => {
    const p = boostedPressure(120, 4, 5, 22.225, 9000)
    expectRel(p.linePressureKPa, 6186.40, 1e-6)
    expect(p.pastKnee).toBe(false)
  })

  it('past the knee: 300 N -> F_in 1200 N; the booster gave out at F_in = 9 × 387.94791 / 5 = 698.3062 N; (1200 − 698.3062) / 387.94791 = 1.293199 N/mm² more: 10293.20 kPa', () => {
    const p = boostedPressure(300, 4, 5, 22.225, 9000)
    expectRel(p.linePressureKPa, 10293.20, 1e-6)
    expect(p.pastKnee).toBe(true)
    // without the knee the same pedal force would claim 1200 × 5 / 387.94791 = 15.466 N/mm²: 50 % more than it makes
    expectRel(boostedPressure(300, 4, 5, 22.225).linePressureKPa, 15465.99, 1e-6)
    // the pushrod force is what the piston takes: 10.29320 N/mm² × 387.94791 mm² = 3993.22 N
    expectRel(p.pushrodForceN, 3993.22, 1e-5)
  })

  it('no booster (ratio 1): the knee is irrelevant', () => {
    const p = boostedPressure(300, 4, 1, 22.225, 9000)
    expect(p.kneePedalForceN).toBeNull()
    expectRel(p.linePressureKPa, (1200 / A) * 1000, 1e-6)
  })
})

describe('effective radius from the pad (uniform wear)', () => {
  it('Shigley Example 16-3 (annular-pad caliper brake): Ro 5.5 in, Ri 3.875 in -> re = 4.6875 in; 3748 lbf at f 0.37 -> 13 000 lbf·in', () => {
    // Budynas & Nisbett, Shigley's Mechanical Engineering Design (9th ed.), Example 16-3, from memory: two annular pads
    // ri = 3.875 in, ro = 5.50 in, f = 0.37, torque 13 000 lbf·in; uniform wear gives re = (ro + ri) / 2 = 4.6875 in,
    // an actuating force F = 3748 lbf and, on 1.5 in cylinders, 2121 psi.
    const sweep = padSweep(inchToMm(11), inchToMm(1.625), 0)
    expectRel(mmToInch(sweep.outerRadiusMm), 5.5, 1e-12)
    expectRel(mmToInch(sweep.innerRadiusMm), 3.875, 1e-12)
    const re = uniformWearRadiusMm(sweep.outerRadiusMm, sweep.innerRadiusMm)
    expectRel(mmToInch(re), 4.6875, 1e-12)
    // T = 2 f F re (two friction faces): 2 × 0.37 × 3748 × 4.6875 = 13 000.9 lbf·in
    const torqueLbfIn = nToLbf(discTorqueNm(0.37, lbfToN(3748), re) * 1000) / 25.4
    expectRel(torqueLbfIn, 13000, 0.001)
    // 3748 lbf on a 1.5 in piston: 3748 / 1.76715 in² = 2121 psi
    expectRel(kPaToPsi(pressureKPa(lbfToN(3748), totalPistonAreaMm2([inchToMm(1.5)]))), 2121, 0.001)
  })

  it('uniform pressure (a new pad) acts further out: 2/3 (5.5³ − 3.875³) / (5.5² − 3.875²) = 2/3 × 108.18945 / 15.234375 = 4.73444 in', () => {
    // worked by hand from the uniform-pressure formula (Shigley §16-5)
    expectRel(mmToInch(uniformPressureRadiusMm(inchToMm(5.5), inchToMm(3.875))), 4.73444, 1e-5)
  })

  it('a 280 mm disc, 55 mm pad, 2 mm margin: Ro 138, Ri 83, r_eff 110.5 mm (the old (2D − d)/4 rule said 126.5 mm, 14.5 % high)', () => {
    // worked by hand: Ro = 280 / 2 − 2 = 138 mm; Ri = 138 − 55 = 83 mm; (138 + 83) / 2 = 110.5 mm
    const axle: DiscAxle = { kind: 'disc', caliper: 'floating', pistonDiametersMm: [54], discDiameterMm: 280, padHeightMm: 55, edgeMarginMm: 2, frictionCoefficient: 0.4 }
    const r = computeAxle(axle, 10000, 22.22)
    expect(r.effectiveRadiusMm).toBe(110.5)
    expect(r.effectiveRadiusSource).toBe('pad-uniform-wear')
    expect(r.padSweep).toMatchObject({ outerRadiusMm: 138, innerRadiusMm: 83, padHeightSource: 'given', edgeMarginSource: 'given' })
    // a typed-in radius wins; the pad's figure stays for comparison
    const typed = computeAxle({ ...axle, effectiveRadiusMm: 112 }, 10000, 22.22)
    expect(typed.effectiveRadiusMm).toBe(112)
    expect(typed.effectiveRadiusSource).toBe('given')
    // no pad data: a fifth of the disc (56 mm) and a 2 mm margin, said to be estimated
    const bare = computeAxle({ ...axle, padHeightMm: undefined, edgeMarginMm: undefined }, 10000, 22.22)
    expect(bare.padSweep).toMatchObject({ padHeightMm: 56, padHeightSource: 'estimated', edgeMarginSource: 'default' })
    expect(bare.effectiveRadiusMm).toBe(110)
  })
})

describe('a whole chain against a published worked example', () => {
  /*
   * "Brake Team Data" (a student brake team's calculation sheet, scribd.com document 458887167): a 120 kg vehicle,
   * wheelbase 1.1303 m, CG height 0.2032 m, CG 0.8255 m from the front axle, road friction 0.7, rear tyre rolling
   * radius 0.127 m, disc effective radius 0.0825 m, pad friction 0.4, a caliper with two 20 mm cylinders (one each
   * side), a 20 mm master cylinder and a pedal factor 5. Worked back from its design deceleration 7.1573 m/s²: pedal
   * force 189.780 N, master cylinder force 948.90 N, 3 021 981 Pa (its piston area rounded to 0.000314 m²), brake
   * torque 62.6275 N·m, rear tyre force 493.13 N = 0.7 × the dynamic rear load 704.47 N, and a stop from 75 km/h of
   * 30.32 m. Run forward from its pedal force, the chain must give the same figures (0.1 % for its rounded π, g = 9.8).
   */
  const axle: Axle = { kind: 'disc', caliper: 'fixed', pistonDiametersMm: [20], discDiameterMm: 200, effectiveRadiusMm: 82.5, frictionCoefficient: 0.4, tyreRollingRadiusMm: 127 }
  const system: BrakeSystem = {
    pedalForceN: 189.780395, pedalRatio: 5, boosterRatio: 1, masterCylinder: { boreMm: 20 }, split: 'front-rear', axles: { front: axle, rear: axle },
  }
  const chain = computeChain(system)

  it('pedal -> master cylinder force -> line pressure', () => {
    expectRel(chain.inputRodForceN, 948.9019752, 1e-9)
    expectRel(chain.linePressureKPa * 1000, 3021980.813, 0.001)
  })

  it('-> clamp force -> torque -> tyre force', () => {
    // the sheet's caliper force is both cylinders together (1897.80 N): each pad takes half
    expectRel(chain.axles.rear.padForceN! * 2, 1897.80395, 1e-6)
    expectRel(chain.axles.rear.torquePerWheelNm, 62.62753036, 1e-6)
    expectRel(chain.axles.rear.tyreForceN!, 493.1301603, 1e-6)
  })

  it('-> the dynamic rear axle load and the friction it needs -> the stopping distance', () => {
    // the sheet's weight 1176 N is 120 kg × 9.8; its deceleration as a braking rate z = 7.157303 / 9.8
    const state: LoadState = { name: 'unladen', massKg: 120, cogHeightMm: 203.2, frontStaticSharePercent: (1 - 0.8255 / 1.1303) * 100, wheelbaseMm: 1130.3, valveKneeKPa: null, valveSlope: null }
    const z = 7.157303371 / 9.8
    expectRel(dynamicAxleLoadsN(state, z).rear, 704.4716576, 0.001)
    // adhesion utilisation = tyre force / dynamic load: the sheet's road friction 0.7
    const f = adhesionUtilisation({ front: 0, rear: chain.axles.rear.tyreForceN! }, state, z)
    expectRel(f.rear, 0.7, 0.001)
    expectRel(stoppingDistanceM(75, 7.157303371), 30.32042779, 0.001)
  })
})

describe('drum brake factor by shoe layout', () => {
  it('leading/trailing 2.0, two-leading 3.0, duo-servo 5.0 (from memory: Limpert, Bosch Automotive Handbook)', () => {
    expect(SHOE_LAYOUT_BRAKE_FACTORS).toEqual({ 'leading-trailing': 2, 'two-leading': 3, 'duo-servo': 5 })
    const drum = (shoeLayout?: 'two-leading' | 'duo-servo', brakeFactor?: number) => computeAxle({ kind: 'drum', wheelCylinderBoreMm: 20.64, drumDiameterMm: 230, shoeLayout, brakeFactor }, 7000, 22)
    expect(drum().brakeFactorSource).toBe('leading-trailing')
    expect(drum('duo-servo').brakeFactor).toBe(5)
    expect(drum('duo-servo', 4.2)).toMatchObject({ brakeFactor: 4.2, brakeFactorSource: 'given' })
    // the torque scales with the factor: duo-servo 5 / leading-trailing 2
    expectRel(drum('duo-servo').torquePerWheelNm / drum().torquePerWheelNm, 2.5, 1e-12)
  })
})

describe('unit checks of the chain formulas (mathjs units)', () => {
  // These restate the formulas; they catch unit slips (mm against m, kPa against N/mm²), not physics.
  it('pad force, torque and tyre force', () => {
    const p = 9000
    const area = (Math.PI * 57 * 57) / 4
    const pad = pistonForceN(p, area)
    expectRel(pad, unit(p, 'kPa').multiply(unit(area, 'mm^2')).toNumber('N'), 1e-9)
    const torque = discTorqueNm(0.42, pad, 120)
    expectRel(torque, unit(2 * 0.42 * pad, 'N').multiply(unit(120, 'mm')).toNumber('N m'), 1e-9)
    expectRel(tyreForceN(torque, 310), asUnit(unit(torque, 'N m').divide(unit(310, 'mm'))).toNumber('N'), 1e-9)
    expectRel(drumTorqueNm(3000, 2.2, 228), unit(3000 * 2.2, 'N').multiply(unit(114, 'mm')).toNumber('N m'), 1e-9)
  })

  it('fluid volume, MC stroke and pedal travel', () => {
    const volume = 2 * ((Math.PI * 54 * 54) / 4) * 0.5
    const stroke = masterCylinderStrokeMm(volume, 22.22)
    expectRel(stroke, asUnit(unit(volume, 'mm^3').divide(unit((Math.PI * 22.22 ** 2) / 4, 'mm^2'))).toNumber('mm'), 1e-9)
    expect(pedalTravelMm(stroke, 4)).toBeCloseTo(4 * stroke, 12)
  })

  it('fixed caliper: the pistons of one side push one pad, both sides take fluid', () => {
    // check-values.md: fixed (opposed) caliper pad force = P × area of one side
    const base = { kind: 'disc', pistonDiametersMm: [44], discDiameterMm: 300, frictionCoefficient: 0.4, pistonTravelMm: 0.5 } as const
    const fixed = computeAxle({ ...base, caliper: 'fixed' }, 10000, 22)
    const floating = computeAxle({ ...base, caliper: 'floating' }, 10000, 22)
    expect(fixed.padForceN).toBeCloseTo(floating.padForceN!, 9)
    expect(fixed.fluidVolumeMm3).toBeCloseTo(2 * floating.fluidVolumeMm3, 9)
  })

  it('caliper piston 54 -> 57 mm: clamp force and fluid demand × 1.1142; MC 7/8 -> 1 in: pressure × 0.7656', () => {
    // check-values.md, derived from P = F / A: (57 / 54)² = 1.11420; (7/8)² = 0.765625
    const base: DiscAxle = { kind: 'disc', caliper: 'floating', pistonDiametersMm: [54], discDiameterMm: 280, frictionCoefficient: 0.4, pistonTravelMm: 0.4 }
    const a = computeAxle(base, 8000, 22.22)
    const b = computeAxle({ ...base, pistonDiametersMm: [57] }, 8000, 22.22)
    expectRel(b.padForceN! / a.padForceN!, 1.1142, 1e-4)
    expectRel(b.fluidVolumeMm3 / a.fluidVolumeMm3, 1.1142, 1e-4)
    expectRel(linePressureKPa(2000, inchToMm(1)) / linePressureKPa(2000, inchToMm(7 / 8)), 0.7656, 1e-4)
    expect(hydraulicRatio((Math.PI * 54 * 54) / 4, 22.22)).toBeCloseTo((54 / 22.22) ** 2, 12)
  })
})

function randomAxle(r: () => number): Axle {
  const between = (lo: number, hi: number) => lo + (hi - lo) * r()
  if (r() < 0.7) {
    return {
      kind: 'disc', caliper: r() < 0.5 ? 'fixed' : 'floating', pistonDiametersMm: [between(30, 60)], discDiameterMm: between(240, 360),
      padHeightMm: between(40, 70), frictionCoefficient: between(0.3, 0.5), tyreRollingRadiusMm: between(280, 350), pistonTravelMm: between(0.2, 1),
    }
  }
  return { kind: 'drum', wheelCylinderBoreMm: between(15, 25), drumDiameterMm: between(180, 280), brakeFactor: between(1.5, 3), tyreRollingRadiusMm: between(280, 350) }
}

describe('properties over random systems (seeded)', () => {
  it('shares sum to 100; a larger MC bore lowers pressure by the square of the ratio below the knee', () => {
    const r = prng(3)
    for (let i = 0; i < 300; i++) {
      const sys: BrakeSystem = {
        pedalForceN: 50 + 200 * r(), pedalRatio: 3 + 3 * r(), boosterRatio: 1 + 6 * r(), masterCylinder: { boreMm: 18 + 8 * r() },
        split: 'diagonal', massKg: 900 + 1500 * r(), axles: { front: randomAxle(r), rear: randomAxle(r) },
      }
      const a = computeChain(sys)
      expect(a.frontSharePercent + a.rearSharePercent).toBeCloseTo(100, 10)
      const bigger = computeChain({ ...sys, masterCylinder: { boreMm: sys.masterCylinder.boreMm * 1.2 } })
      expectRel(bigger.linePressureKPa / a.linePressureKPa, 1 / 1.44, 1e-12)
      // the deceleration never exceeds the tyre-road friction (0.8 g by default)
      expect(a.decelerationG!).toBeLessThanOrEqual(0.8 + 1e-12)
      expect(frontSharePercent(3, 1)).toBe(75)
    }
  })
})
