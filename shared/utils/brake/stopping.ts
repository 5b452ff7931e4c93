/**
 * Stopping distances read the way FMVSS No. 135 (49 CFR 571.135) writes its limits: S ≤ 0.10 V + k V² (S in m,
 * V in km/h). The 0.10 V term is distance covered before the brakes are fully applied (0.10 V m = V / 3.6 m/s ×
 * 0.36 s); k V² is the braking itself. A theoretical constant-deceleration stop is compared like with like by
 * adding the same 0.10 V: S = 0.10 V + V² / (25.92 a) (25.92 = 2 × 3.6², km/h to m/s).
 */

/** A stopping-distance limit from FMVSS No. 135, used for comparison only. */
export interface StoppingReference {
  source: string
  speedKmh: number
  /** The limit at `speedKmh`, m. */
  distanceM: number
  maxPedalForceN: number
  /** The k of S ≤ 0.10 V + k V². */
  k: number
  /**
   * The constant deceleration that meets the limit once the 0.10 V term is taken off: 1 / (25.92 k), m/s².
   */
  meanDecelerationMps2: number
}

/** The 0.10 V term of FMVSS No. 135, m (V in km/h). */
export function fmvssBuildUpDistanceM(speedKmh: number): number {
  return 0.1 * speedKmh
}

/** A theoretical stop in FMVSS No. 135's terms: 0.10 V + V² / (25.92 a), m. */
export function fmvssStoppingDistanceM(speedKmh: number, decelerationMps2: number): number {
  return fmvssBuildUpDistanceM(speedKmh) + (speedKmh * speedKmh) / (25.92 * decelerationMps2)
}

/** Constant-deceleration distance only, s = v² / (2 a), m (no build-up term). */
export function stoppingDistanceM(speedKmh: number, decelerationMps2: number): number {
  const v = speedKmh / 3.6
  return (v * v) / (2 * decelerationMps2)
}

function reference(source: string, k: number, maxPedalForceN: number, speedKmh = 100): StoppingReference {
  return {
    source, speedKmh, k, maxPedalForceN,
    distanceM: fmvssBuildUpDistanceM(speedKmh) + k * speedKmh * speedKmh,
    meanDecelerationMps2: 1 / (25.92 * k),
  }
}

/** FMVSS No. 135 limits at 100 km/h. */
export const FMVSS_135 = {
  /**
   * S7.5 cold effectiveness: S ≤ 0.10 V + 0.0060 V², 70 m from 100 km/h at ≤ 500 N pedal force (49 CFR 571.135
   * S7.5). The test runs at the gross vehicle weight rating and again lightly loaded (from memory): both load states
   * are compared when the vehicle data has them.
   */
  service: reference('FMVSS No. 135 S7.5 (49 CFR 571.135): S ≤ 0.10 V + 0.0060 V², 70 m from 100 km/h, pedal force ≤ 500 N', 0.006, 500),
  /** S7.10 hydraulic circuit failure: S ≤ 0.10 V + 0.0158 V², 168 m from 100 km/h at ≤ 500 N (from memory). */
  partialFailure: reference('FMVSS No. 135 S7.10 (49 CFR 571.135): S ≤ 0.10 V + 0.0158 V², 168 m from 100 km/h with one circuit failed, pedal force ≤ 500 N', 0.0158, 500),
} as const
