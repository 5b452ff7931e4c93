/**
 * The hydraulic brake chain (Pascal's law, P = F / A), from pedal to tyre.
 *
 * Units: forces N, lengths mm, areas mm², volumes mm³, torque N·m, pressure kPa at the interface.
 * Internally N / mm² = MPa, so kPa = 1000 × N/mm².
 *
 * Theoretical figures only: no push-out (threshold) pressure, no caliper/hose compliance, no temperature or
 * fade effects, no proportioning valve or ABS. Those are stated in {@link CHAIN_ASSUMPTIONS}.
 */
import type { Axle, CircuitSplit, DiscAxle, DrumAxle, MasterCylinder } from './schemas'
import { STANDARD_GRAVITY_MPS2, parseTyreSize } from './units'

/** Theoretical-figure assumptions every hydraulics result carries. */
export const CHAIN_ASSUMPTIONS: readonly string[] = [
  'Theoretical figures (Pascal\'s law, P = F / A): no push-out (threshold) pressure, no hose or caliper compliance, no temperature or fade effects.',
  'No proportioning or load-sensing valve, no ABS: every wheel sees the same line pressure.',
  'Pushrod force = pedal force × pedal ratio × booster ratio; the booster is taken as a fixed ratio below its run-out point.',
  'Pad force is per pad: a fixed caliper is entered with the pistons of one side, a floating caliper with all its pistons (its frame pulls the outer pad with the same force).',
  'Disc torque per wheel = 2 × friction coefficient × pad force × effective radius (two friction faces).',
  'Drum torque per wheel = wheel-cylinder piston force × brake factor × drum radius (brake factor for both shoes together); drum wheel cylinders are taken as double-acting (two pistons).',
  'Fluid volume = Σ piston area × piston travel; master cylinder stroke = total volume / master cylinder piston area; pedal travel = stroke × pedal ratio (booster and pushrod free play not counted).',
]

/** Piston travel used when none is given, mm (common practice estimate of running clearance plus take-up). */
export const DEFAULT_PISTON_TRAVEL_MM = { disc: 0.5, drum: 1.0 } as const

/** Area of a circle from its diameter: A = π d² / 4 (mm², for d in mm). */
export function circleAreaMm2(diameterMm: number): number {
  return (Math.PI * diameterMm * diameterMm) / 4
}

/** Sum of piston areas for a list of piston diameters (mm²). */
export function totalPistonAreaMm2(diametersMm: readonly number[]): number {
  return diametersMm.reduce((sum, d) => sum + circleAreaMm2(d), 0)
}

/** Force on the master cylinder pushrod (N) = pedal force × pedal ratio × booster ratio. */
export function pushrodForceN(pedalForceN: number, pedalRatio: number, boosterRatio: number): number {
  return pedalForceN * pedalRatio * boosterRatio
}

/** Pressure (kPa) of a force (N) on an area (mm²): P = F / A (1 N/mm² = 1000 kPa). */
export function pressureKPa(forceN: number, areaMm2: number): number {
  return (forceN / areaMm2) * 1000
}

/** Line pressure (kPa) = pushrod force / master cylinder piston area (Pascal's law). */
export function linePressureKPa(pushrodN: number, masterCylinderBoreMm: number): number {
  return pressureKPa(pushrodN, circleAreaMm2(masterCylinderBoreMm))
}

/** Force a piston (or set of pistons) of total area `areaMm2` exerts at `pressureKPa` (N) = P × A. */
export function pistonForceN(pressureKPa: number, areaMm2: number): number {
  return (pressureKPa / 1000) * areaMm2
}

/**
 * Effective (mean) friction radius from the disc diameter and the piston diameter, mm:
 * r_eff = (2 D − d) / 4, a published workshop rule (disc outer radius less a quarter of the piston diameter).
 * With several piston sizes the largest is used, since it sets the pad's radial height.
 */
export function workshopEffectiveRadiusMm(discDiameterMm: number, pistonDiameterMm: number): number {
  return (2 * discDiameterMm - pistonDiameterMm) / 4
}

/** Disc brake torque per wheel (N·m) = 2 × μ × pad force × effective radius (two friction faces). */
export function discTorqueNm(frictionCoefficient: number, padForce: number, effectiveRadiusMm: number): number {
  return (2 * frictionCoefficient * padForce * effectiveRadiusMm) / 1000
}

/** Drum brake torque per wheel (N·m) = wheel-cylinder force × brake factor × drum radius. */
export function drumTorqueNm(wheelCylinderForceN: number, brakeFactor: number, drumDiameterMm: number): number {
  return (wheelCylinderForceN * brakeFactor * (drumDiameterMm / 2)) / 1000
}

/** Braking force at the tyre contact patch (N) = torque / rolling radius. */
export function tyreForceN(torqueNm: number, rollingRadiusMm: number): number {
  return (torqueNm * 1000) / rollingRadiusMm
}

/** Front share of braking in percent of the total (front + rear), from axle forces or torques. */
export function frontSharePercent(front: number, rear: number): number {
  const total = front + rear
  return total > 0 ? (front / total) * 100 : 0
}

/**
 * Hydraulic ratio (dimensionless): piston area acting on one pad (or one wheel-cylinder piston) divided by the
 * master cylinder piston area, i.e. the force gain from pushrod to pad.
 */
export function hydraulicRatio(wheelAreaMm2: number, masterCylinderBoreMm: number): number {
  return wheelAreaMm2 / circleAreaMm2(masterCylinderBoreMm)
}

/** Fluid displaced (mm³) = piston area × piston travel. */
export function fluidVolumeMm3(areaMm2: number, travelMm: number): number {
  return areaMm2 * travelMm
}

/** Master cylinder stroke (mm) needed to displace `volumeMm3` = volume / MC piston area. */
export function masterCylinderStrokeMm(volumeMm3: number, masterCylinderBoreMm: number): number {
  return volumeMm3 / circleAreaMm2(masterCylinderBoreMm)
}

/** Pedal travel (mm) = master cylinder stroke × pedal ratio (pushrod free play not counted). */
export function pedalTravelMm(strokeMm: number, pedalRatio: number): number {
  return strokeMm * pedalRatio
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
  /** Piston area pressing one pad (disc) or one wheel-cylinder piston (drum), mm². */
  pistonAreaMm2: number
  /** Disc: clamp force on each pad, N. Null for a drum. */
  padForceN: number | null
  /** Drum: force of one wheel-cylinder piston on its shoe, N. Null for a disc. */
  shoeForceN: number | null
  /** The apply force whichever the kind (pad force or shoe force), N. */
  applyForceN: number
  /** Disc: effective friction radius used, mm; drum: drum radius. */
  effectiveRadiusMm: number
  effectiveRadiusSource: 'given' | 'workshop-rule' | 'drum-radius'
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

/** Computes one axle at a given line pressure. */
export function computeAxle(axle: Axle, pressureKPa: number, masterCylinderBoreMm: number): AxleResult {
  return axle.kind === 'disc'
    ? computeDiscAxle(axle, pressureKPa, masterCylinderBoreMm)
    : computeDrumAxle(axle, pressureKPa, masterCylinderBoreMm)
}

/**
 * The figures every axle has from its torque and pistons: torque per wheel and axle, tyre force, hydraulic ratio and
 * piston travel (as given, or the default for its kind).
 */
function wheelFigures(axle: Axle, torquePerWheelNm: number, pistonAreaMm2: number, mcBoreMm: number) {
  const radius = axleRollingRadiusMm(axle)
  const perWheel = radius ? tyreForceN(torquePerWheelNm, radius.radiusMm) : null
  return {
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
  const given = axle.effectiveRadiusMm
  const rEff = given ?? workshopEffectiveRadiusMm(axle.discDiameterMm, Math.max(...axle.pistonDiametersMm))
  const wheel = wheelFigures(axle, discTorqueNm(axle.frictionCoefficient, padForce, rEff), areaPerPad, mcBoreMm)
  // A fixed caliper has the same pistons again on the other side; they move and take fluid too.
  const wheelArea = axle.caliper === 'fixed' ? 2 * areaPerPad : areaPerPad
  return {
    kind: 'disc',
    caliper: axle.caliper,
    pistonAreaMm2: areaPerPad,
    padForceN: padForce,
    shoeForceN: null,
    applyForceN: padForce,
    effectiveRadiusMm: rEff,
    effectiveRadiusSource: given === undefined ? 'workshop-rule' : 'given',
    ...wheel,
    fluidVolumeMm3: 2 * fluidVolumeMm3(wheelArea, wheel.pistonTravelMm),
  }
}

function computeDrumAxle(axle: DrumAxle, pressureKPa: number, mcBoreMm: number): AxleResult {
  const area = circleAreaMm2(axle.wheelCylinderBoreMm)
  const shoeForce = pistonForceN(pressureKPa, area)
  const wheel = wheelFigures(axle, drumTorqueNm(shoeForce, axle.brakeFactor, axle.drumDiameterMm), area, mcBoreMm)
  return {
    kind: 'drum',
    caliper: null,
    pistonAreaMm2: area,
    padForceN: null,
    shoeForceN: shoeForce,
    applyForceN: shoeForce,
    effectiveRadiusMm: axle.drumDiameterMm / 2,
    effectiveRadiusSource: 'drum-radius',
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
  masterCylinder: MasterCylinder
  split: CircuitSplit
  massKg?: number | undefined
  axles: { front: Axle; rear: Axle }
}

/** The whole chain for one brake system. */
export interface ChainResult {
  pushrodForceN: number
  masterCylinderAreaMm2: number
  linePressureKPa: number
  /** Line pressure per newton of pedal force, kPa/N: what the driver feels as pedal "gain". */
  pressurePerPedalForceKPaPerN: number
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
  /** Sum of the four tyre forces, N; null without rolling radii. */
  totalBrakingForceN: number | null
  /** Theoretical deceleration (total force / mass), m/s²; null without mass or rolling radii. */
  decelerationMps2: number | null
  decelerationG: number | null
}

/** Runs the chain pedal -> pushrod -> line pressure -> pistons -> torque -> tyre for one system. */
export function computeChain(system: BrakeSystem): ChainResult {
  const mc = system.masterCylinder
  const pushrod = pushrodForceN(system.pedalForceN, system.pedalRatio, system.boosterRatio)
  const pressure = linePressureKPa(pushrod, mc.boreMm)
  const front = computeAxle(system.axles.front, pressure, mc.boreMm)
  const rear = computeAxle(system.axles.rear, pressure, mc.boreMm)
  const byForce = front.axleTyreForceN !== null && rear.axleTyreForceN !== null
  const share = byForce
    ? frontSharePercent(front.axleTyreForceN as number, rear.axleTyreForceN as number)
    : frontSharePercent(front.torquePerAxleNm, rear.torquePerAxleNm)
  const volume = front.fluidVolumeMm3 + rear.fluidVolumeMm3
  const stroke = masterCylinderStrokeMm(volume, mc.boreMm)
  const totalForce = byForce ? (front.axleTyreForceN as number) + (rear.axleTyreForceN as number) : null
  const decel = totalForce !== null && system.massKg ? totalForce / system.massKg : null
  return {
    pushrodForceN: pushrod,
    masterCylinderAreaMm2: circleAreaMm2(mc.boreMm),
    linePressureKPa: pressure,
    pressurePerPedalForceKPaPerN: pressure / system.pedalForceN,
    axles: { front, rear },
    frontSharePercent: share,
    rearSharePercent: 100 - share,
    shareBasis: byForce ? 'tyre-force' : 'torque',
    fluidVolumeMm3: volume,
    masterCylinderStrokeMm: stroke,
    masterCylinderStrokeAvailableMm: mc.strokeMm ?? null,
    pedalTravelMm: pedalTravelMm(stroke, system.pedalRatio),
    totalBrakingForceN: totalForce,
    decelerationMps2: decel,
    decelerationG: decel === null ? null : decel / STANDARD_GRAVITY_MPS2,
  }
}
