/**
 * Replacement against original: each figure of the hydraulic chain as a percent change (front share in points).
 */
import type { AxleName } from '../../types/axles'
import type { ChainResult } from './hydraulics'

/** Percent change from `before` to `after`; null when `before` is zero (no meaningful ratio). */
export function percentChange(before: number, after: number): number | null {
  return before === 0 ? null : ((after - before) / before) * 100
}

/** Per-axle pair of values. */
export interface PerAxle<T> {
  front: T
  rear: T
}

/** Replacement compared with the original, in percent (front share in percentage points). */
export interface Comparison {
  linePressurePercent: number | null
  pressurePerPedalForcePercent: number | null
  /** Pad force (disc) or shoe force (drum) per axle. */
  clampForcePercent: PerAxle<number | null>
  torquePerAxlePercent: PerAxle<number | null>
  tyreForcePercent: PerAxle<number | null>
  /** Replacement front share − original front share, percentage points (negative = toward the rear). */
  frontShareChangePoints: number
  fluidVolumePercent: number | null
  masterCylinderStrokePercent: number | null
  pedalTravelPercent: number | null
}

/** Compares two chain results (same pedal force). */
export function compareChains(original: ChainResult, replacement: ChainResult): Comparison {
  const axle = (f: (c: ChainResult, a: AxleName) => number | null): PerAxle<number | null> => {
    const pick = (a: AxleName) => {
      const before = f(original, a)
      const after = f(replacement, a)
      return before === null || after === null ? null : percentChange(before, after)
    }
    return { front: pick('front'), rear: pick('rear') }
  }
  return {
    linePressurePercent: percentChange(original.linePressureKPa, replacement.linePressureKPa),
    pressurePerPedalForcePercent: percentChange(
      original.pressurePerPedalForceKPaPerN,
      replacement.pressurePerPedalForceKPaPerN,
    ),
    clampForcePercent: axle((c, a) => c.axles[a].applyForceN),
    torquePerAxlePercent: axle((c, a) => c.axles[a].torquePerAxleNm),
    tyreForcePercent: axle((c, a) => c.axles[a].tyreForceN),
    frontShareChangePoints: replacement.frontSharePercent - original.frontSharePercent,
    fluidVolumePercent: percentChange(original.fluidVolumeMm3, replacement.fluidVolumeMm3),
    masterCylinderStrokePercent: percentChange(original.masterCylinderStrokeMm, replacement.masterCylinderStrokeMm),
    pedalTravelPercent: percentChange(original.pedalTravelMm, replacement.pedalTravelMm),
  }
}
