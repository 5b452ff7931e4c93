/**
 * The formulas of the hydraulic chain, one line each (Pascal's law, P = F / A).
 * Units: forces N, lengths mm, areas mm², volumes mm³, torque N·m, pressure kPa (1 N/mm² = 1000 kPa).
 */

/** Area of a circle from its diameter: A = π d² / 4 (mm², for d in mm). */
export function circleAreaMm2(diameterMm: number): number {
  return (Math.PI * diameterMm * diameterMm) / 4
}

/** Sum of piston areas for a list of piston diameters (mm²). */
export function totalPistonAreaMm2(diametersMm: readonly number[]): number {
  return diametersMm.reduce((sum, d) => sum + circleAreaMm2(d), 0)
}

/** Pressure (kPa) of a force (N) on an area (mm²): P = F / A. */
export function pressureKPa(forceN: number, areaMm2: number): number {
  return (forceN / areaMm2) * 1000
}

/** Force a piston (or set of pistons) of total area `areaMm2` exerts at `pressureKPa` (N) = P × A. */
export function pistonForceN(pressureKPa: number, areaMm2: number): number {
  return (pressureKPa / 1000) * areaMm2
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

/** Hydraulic ratio: piston area on one pad (or one wheel-cylinder piston) / master cylinder area. */
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
