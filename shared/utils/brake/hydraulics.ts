/**
 * The hydraulic brake chain (Pascal's law, P = F / A), from pedal to tyre, for one brake system: pedal and booster
 * (with its run-out, booster.ts) to line pressure, the rear valve when the vehicle has one, pistons to pad or shoe
 * force, the pad's friction radius (effective-radius.ts) or the drum's brake factor (shoe-layouts.ts) to torque,
 * the rolling radius to tyre force; then the grip and balance of the vehicle (vehicle-dynamics.ts).
 *
 * Units: forces N, lengths mm, areas mm², volumes mm³, torque N·m, pressure kPa at the interface.
 * Theoretical figures: no push-out (threshold) pressure, no caliper/hose compliance, no temperature or fade
 * effects. Those are stated in {@link CHAIN_ASSUMPTIONS}.
 */
import type { Axle, CircuitSplit, DiscAxle, DrumAxle, MasterCylinder, VehicleData } from './schemas'
import { parseTyreSize } from './units'
import {
  circleAreaMm2, discTorqueNm, drumTorqueNm, fluidVolumeMm3, frontSharePercent, hydraulicRatio,
  masterCylinderStrokeMm, pedalTravelMm, pistonForceN, totalPistonAreaMm2, tyreForceN,
} from './hydraulics-basics'
import { boostedPressure } from './booster'
import { padSweep, uniformWearRadiusMm, type PadSweep } from './effective-radius'
import { drumBrakeFactor } from './shoe-layouts'
import { rearPressureKPa } from './vehicle-load'
import { vehicleDynamics, type VehicleDynamics } from './vehicle-dynamics'

export * from './hydraulics-basics'

/** Theoretical-figure assumptions every hydraulics result carries. */
export const CHAIN_ASSUMPTIONS: readonly string[] = [
  'Theoretical figures (Pascal\'s law, P = F / A): no push-out (threshold) pressure, no hose or caliper compliance, no temperature or fade effects.',
  'Input rod force = pedal force × pedal ratio; the booster multiplies it up to its run-out (knee) pressure, and beyond the knee extra pedal force adds pressure unboosted.',
  'Pad force is per pad: a fixed caliper is entered with the pistons of one side, a floating caliper with all its pistons (its frame pulls the outer pad with the same force).',
  'Disc torque per wheel = 2 × friction coefficient × pad force × effective radius (two friction faces); the effective radius is the mean radius of the annulus the pad sweeps (uniform wear of a bedded pad).',
  'Drum torque per wheel = wheel-cylinder piston force × brake factor × drum radius (brake factor for both shoes together); drum wheel cylinders are taken as double-acting (two pistons).',
  'Fluid volume = Σ piston area × piston travel; master cylinder stroke = total volume / master cylinder piston area; pedal travel = stroke × pedal ratio (booster and pushrod free play not counted).',
]

/** Piston travel used when none is given, mm (common practice estimate of running clearance plus take-up). */
export const DEFAULT_PISTON_TRAVEL_MM = { disc: 0.5, drum: 1.0 } as const

/** Line pressure (kPa) = pushrod force / master cylinder piston area (Pascal's law). */
export function linePressureKPa(pushrodN: number, masterCylinderBoreMm: number): number {
  return ((pushrodN / circleAreaMm2(masterCylinderBoreMm)) * 1000)
}

/** The rolling radius of an axle's tyres: as given, or from the tyre size code, or null. */
export function axleRollingRadiusMm(axle: Axle): { radiusMm: number; source: 'given' | 'tyre-size' } | null {
  if (axle.tyreRollingRadiusMm !== undefined) return { radiusMm: axle.tyreRollingRadiusMm, source: 'given' }
  if (axle.tyreSize !== undefined) {
    const size = parseTyreSize(axle.tyreSize)
    if (size) return { radiusMm: size.rollingRadiusMm, source: 'tyre-size' }
  }
  return null
}

/** Result for one axle (both wheels alike). */
export interface AxleResult {
  kind: 'disc' | 'drum'
  caliper: 'fixed' | 'floating' | null
  /** Line pressure this axle's pistons see (after the rear valve, for the rear), kPa. */
  linePressureKPa: number
  /** Piston area pressing one pad (disc) or one wheel-cylinder piston (drum), mm². */
  pistonAreaMm2: number
  /** Disc: clamp force on each pad, N. Null for a drum. */
  padForceN: number | null
  /** Drum: force of one wheel-cylinder piston on its shoe, N. Null for a disc. */
  shoeForceN: number | null
  /** The apply force whichever the kind (pad force or shoe force), N. */
  applyForceN: number
  /** Disc: friction radius used, mm; drum: drum radius. */
  effectiveRadiusMm: number
  /** `given` typed in; `pad-uniform-wear` from the pad's swept annulus; `drum-radius` for a drum. */
  effectiveRadiusSource: 'given' | 'pad-uniform-wear' | 'drum-radius'
  /** Disc: the annulus the pad sweeps (also when a typed radius wins, for comparison); null for a drum. */
  padSweep: PadSweep | null
  /** Drum: the brake factor used and where it came from; null for a disc. */
  brakeFactor: number | null
  brakeFactorSource: 'given' | 'leading-trailing' | 'two-leading' | 'duo-servo' | null
  torquePerWheelNm: number
  torquePerAxleNm: number
  tyreRollingRadiusMm: number | null
  tyreRollingRadiusSource: 'given' | 'tyre-size' | null
  /** Braking force at one tyre, N; null when no rolling radius is known. */
  tyreForceN: number | null
  /** Both tyres of the axle, N. */
  axleTyreForceN: number | null
  hydraulicRatio: number
  pistonTravelMm: number
  pistonTravelSource: 'given' | 'default'
  /** Fluid both wheels of the axle take for the piston travel, mm³. */
  fluidVolumeMm3: number
}

/** Computes one axle at the line pressure its pistons see. */
export function computeAxle(axle: Axle, pressureKPa: number, masterCylinderBoreMm: number): AxleResult {
  return axle.kind === 'disc'
    ? computeDiscAxle(axle, pressureKPa, masterCylinderBoreMm)
    : computeDrumAxle(axle, pressureKPa, masterCylinderBoreMm)
}

/**
 * The figures every axle has from its torque and pistons: torque per wheel and axle, tyre force, hydraulic ratio and
 * piston travel (as given, or the default for its kind).
 */
function wheelFigures(axle: Axle, pressureKPa: number, torquePerWheelNm: number, pistonAreaMm2: number, mcBoreMm: number) {
  const radius = axleRollingRadiusMm(axle)
  const perWheel = radius ? tyreForceN(torquePerWheelNm, radius.radiusMm) : null
  return {
    linePressureKPa: pressureKPa,
    torquePerWheelNm,
    torquePerAxleNm: 2 * torquePerWheelNm,
    tyreRollingRadiusMm: radius?.radiusMm ?? null,
    tyreRollingRadiusSource: radius?.source ?? null,
    tyreForceN: perWheel,
    axleTyreForceN: perWheel === null ? null : 2 * perWheel,
    hydraulicRatio: hydraulicRatio(pistonAreaMm2, mcBoreMm),
    pistonTravelMm: axle.pistonTravelMm ?? DEFAULT_PISTON_TRAVEL_MM[axle.kind],
    pistonTravelSource: axle.pistonTravelMm === undefined ? ('default' as const) : ('given' as const),
  }
}

function computeDiscAxle(axle: DiscAxle, pressureKPa: number, mcBoreMm: number): AxleResult {
  // Pistons entered: one side (fixed) or all (floating). Either way they push one pad with P × their area.
  const areaPerPad = totalPistonAreaMm2(axle.pistonDiametersMm)
  const padForce = pistonForceN(pressureKPa, areaPerPad)
  const sweep = padSweep(axle.discDiameterMm, axle.padHeightMm, axle.edgeMarginMm)
  const given = axle.effectiveRadiusMm
  const rEff = given ?? uniformWearRadiusMm(sweep.outerRadiusMm, sweep.innerRadiusMm)
  const wheel = wheelFigures(axle, pressureKPa, discTorqueNm(axle.frictionCoefficient, padForce, rEff), areaPerPad, mcBoreMm)
  // A fixed caliper has the same pistons again on the other side; they move and take fluid too.
  const wheelArea = axle.caliper === 'fixed' ? 2 * areaPerPad : areaPerPad
  return {
    kind: 'disc', caliper: axle.caliper, pistonAreaMm2: areaPerPad,
    padForceN: padForce, shoeForceN: null, applyForceN: padForce,
    effectiveRadiusMm: rEff, effectiveRadiusSource: given === undefined ? 'pad-uniform-wear' : 'given', padSweep: sweep,
    brakeFactor: null, brakeFactorSource: null,
    ...wheel,
    fluidVolumeMm3: 2 * fluidVolumeMm3(wheelArea, wheel.pistonTravelMm),
  }
}

function computeDrumAxle(axle: DrumAxle, pressureKPa: number, mcBoreMm: number): AxleResult {
  const area = circleAreaMm2(axle.wheelCylinderBoreMm)
  const shoeForce = pistonForceN(pressureKPa, area)
  const factor = drumBrakeFactor(axle)
  const wheel = wheelFigures(axle, pressureKPa, drumTorqueNm(shoeForce, factor.factor, axle.drumDiameterMm), area, mcBoreMm)
  return {
    kind: 'drum', caliper: null, pistonAreaMm2: area,
    padForceN: null, shoeForceN: shoeForce, applyForceN: shoeForce,
    effectiveRadiusMm: axle.drumDiameterMm / 2, effectiveRadiusSource: 'drum-radius', padSweep: null,
    brakeFactor: factor.factor, brakeFactorSource: factor.source,
    ...wheel,
    // Double-acting wheel cylinder: two pistons per wheel, two wheels per axle.
    fluidVolumeMm3: 2 * 2 * fluidVolumeMm3(area, wheel.pistonTravelMm),
  }
}

/** One brake system as the chain needs it (the original, or the replacement once merged). */
export interface BrakeSystem {
  pedalForceN: number
  pedalRatio: number
  boosterRatio: number
  boosterRunOutKPa?: number | undefined
  tyreRoadFriction?: number | undefined
  masterCylinder: MasterCylinder
  split: CircuitSplit
  /** Mass when no vehicle data is given (deceleration only). */
  massKg?: number | undefined
  vehicle?: VehicleData | undefined
  axles: { front: Axle; rear: Axle }
}

/** The whole chain for one brake system. */
export interface ChainResult extends VehicleDynamics {
  /** Pedal force × pedal ratio, N. */
  inputRodForceN: number
  /** Force on the master cylinder piston (line pressure × its area), N. */
  pushrodForceN: number
  masterCylinderAreaMm2: number
  linePressureKPa: number
  /** Line pressure per newton of pedal force, kPa/N: what the driver feels as pedal "gain". */
  pressurePerPedalForceKPaPerN: number
  boosterRunOutKPa: number | null
  /** Pedal force at the booster's knee, N; null without a run-out pressure. */
  kneePedalForceN: number | null
  pastKnee: boolean
  /** Pressure at the rear pistons (after the rear valve when the vehicle has one), kPa. */
  rearLinePressureKPa: number
  axles: { front: AxleResult; rear: AxleResult }
  /** Front axle share of the braking, %; rear = 100 − front. */
  frontSharePercent: number
  rearSharePercent: number
  /** Tyre forces when both axles have a rolling radius, else torques (equal tyre radii assumed). */
  shareBasis: 'tyre-force' | 'torque'
  /** Fluid for all four wheels, mm³. */
  fluidVolumeMm3: number
  /** Master cylinder stroke needed for that fluid, mm. */
  masterCylinderStrokeMm: number
  /** Stroke available (from the part data), mm; null when unknown. */
  masterCylinderStrokeAvailableMm: number | null
  pedalTravelMm: number
  /** Sum of the four tyre forces the brakes make, N; null without rolling radii. */
  totalBrakingForceN: number | null
}

/** Runs the chain pedal -> booster -> line pressure -> (valve) -> pistons -> torque -> tyre -> vehicle for one system. */
export function computeChain(system: BrakeSystem): ChainResult {
  const mc = system.masterCylinder
  const boost = boostedPressure(system.pedalForceN, system.pedalRatio, system.boosterRatio, mc.boreMm, system.boosterRunOutKPa)
  const pressure = boost.linePressureKPa
  const rearPressure = rearPressureKPa(pressure, system.vehicle?.rearValve)
  const front = computeAxle(system.axles.front, pressure, mc.boreMm)
  const rear = computeAxle(system.axles.rear, rearPressure, mc.boreMm)
  const byForce = front.axleTyreForceN !== null && rear.axleTyreForceN !== null
  const share = byForce
    ? frontSharePercent(front.axleTyreForceN as number, rear.axleTyreForceN as number)
    : frontSharePercent(front.torquePerAxleNm, rear.torquePerAxleNm)
  const volume = front.fluidVolumeMm3 + rear.fluidVolumeMm3
  const stroke = masterCylinderStrokeMm(volume, mc.boreMm)
  const totalForce = byForce ? (front.axleTyreForceN as number) + (rear.axleTyreForceN as number) : null
  return {
    inputRodForceN: boost.inputRodForceN,
    pushrodForceN: boost.pushrodForceN,
    masterCylinderAreaMm2: circleAreaMm2(mc.boreMm),
    linePressureKPa: pressure,
    pressurePerPedalForceKPaPerN: pressure / system.pedalForceN,
    boosterRunOutKPa: boost.runOutKPa,
    kneePedalForceN: boost.kneePedalForceN,
    pastKnee: boost.pastKnee,
    rearLinePressureKPa: rearPressure,
    axles: { front, rear },
    frontSharePercent: share,
    rearSharePercent: 100 - share,
    shareBasis: byForce ? 'tyre-force' : 'torque',
    fluidVolumeMm3: volume,
    masterCylinderStrokeMm: stroke,
    masterCylinderStrokeAvailableMm: mc.strokeMm ?? null,
    pedalTravelMm: pedalTravelMm(stroke, system.pedalRatio),
    totalBrakingForceN: totalForce,
    ...vehicleDynamics(system, pressure, byForce ? { front: front.axleTyreForceN! / pressure, rear: rear.axleTyreForceN! / rearPressure } : null),
  }
}
