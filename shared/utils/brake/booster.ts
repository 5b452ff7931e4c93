/**
 * From pedal to line pressure with a vacuum booster that runs out.
 *
 * The input rod force is F_in = pedal force × pedal ratio. Below the booster's run-out (knee) pressure P_ro the
 * booster multiplies it: P = F_in × boost / A (Pascal's law on the master cylinder piston area A). At the knee the
 * booster has given all it can; beyond it only the driver's extra force adds pressure, unboosted:
 *   P = P_ro + (F_in − P_ro × A / boost) / A.
 * Without a run-out pressure the booster is taken as a fixed ratio (said in the assumptions).
 */
import { circleAreaMm2, pressureKPa } from './hydraulics-basics'

/** The pressure a pedal force makes, and where the knee is. */
export interface BoostedPressure {
  /** Pedal force × pedal ratio, N. */
  inputRodForceN: number
  /** Force on the master cylinder piston (pressure × its area), N. */
  pushrodForceN: number
  linePressureKPa: number
  runOutKPa: number | null
  /** Pedal force at which the booster runs out, N; null without a run-out pressure or without a booster. */
  kneePedalForceN: number | null
  /** True when the pedal force is past the knee (extra force adds pressure unboosted). */
  pastKnee: boolean
}

/**
 * Line pressure from pedal force, with the booster's run-out.
 * @param runOutKPa the booster's run-out (knee) pressure; undefined = no run-out modelled
 */
export function boostedPressure(
  pedalForceN: number, pedalRatio: number, boosterRatio: number, masterCylinderBoreMm: number, runOutKPa?: number,
): BoostedPressure {
  const area = circleAreaMm2(masterCylinderBoreMm)
  const inputRod = pedalForceN * pedalRatio
  const boosted = pressureKPa(inputRod * boosterRatio, area)
  const hasKnee = runOutKPa !== undefined && boosterRatio > 1
  const knee = hasKnee ? ((runOutKPa / 1000) * area) / boosterRatio / pedalRatio : null
  const past = hasKnee && boosted > runOutKPa
  // beyond the knee: the rod force the booster needed to reach P_ro, and the rest acting on the piston alone
  const pressure = past ? runOutKPa + pressureKPa(inputRod - ((runOutKPa / 1000) * area) / boosterRatio, area) : boosted
  return {
    inputRodForceN: inputRod,
    pushrodForceN: (pressure / 1000) * area,
    linePressureKPa: pressure,
    runOutKPa: runOutKPa ?? null,
    kneePedalForceN: knee,
    pastKnee: past,
  }
}
