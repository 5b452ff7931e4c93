/**
 * The friction radius of a disc brake, from the annulus the pad sweeps on the disc.
 *
 * Outer radius = disc radius − edge margin (the pad's outer edge sits a little inside the disc's edge); inner
 * radius = outer radius − the pad's radial height. For bedded pads the wear is uniform across the pad, and the
 * friction force acts at the mean radius (Ro + Ri) / 2; a new, unbedded pad presses evenly and acts at the
 * uniform-pressure radius 2/3 (Ro³ − Ri³) / (Ro² − Ri²), a little further out. Both are the annular-contact results
 * of Budynas & Nisbett, Shigley's Mechanical Engineering Design, §16-5 "Frictional-contact axial clutches"
 * (uniform wear T = F f (D + d) / 4, uniform pressure T = F f (D³ − d³) / (3 (D² − d²)); equation numbers from
 * memory) and its Example 16-3 (annular-pad caliper brake) for a disc brake.
 */

/** Edge margin when neither the vehicle nor the part data gives one, mm (common practice: 1-3 mm). */
export const DEFAULT_EDGE_MARGIN_MM = 2
/**
 * Pad radial height when no pad data is known: a fifth of the disc diameter (common practice estimate; the demo
 * catalogue's pads are 0.17-0.21 of their disc's diameter).
 */
export const ESTIMATED_PAD_HEIGHT_SHARE = 0.2

/** Uniform-wear (bedded pad) friction radius: the mean of the swept annulus' radii. */
export function uniformWearRadiusMm(outerRadiusMm: number, innerRadiusMm: number): number {
  return (outerRadiusMm + innerRadiusMm) / 2
}

/** Uniform-pressure (new pad) friction radius: 2/3 (Ro³ − Ri³) / (Ro² − Ri²). */
export function uniformPressureRadiusMm(outerRadiusMm: number, innerRadiusMm: number): number {
  const ro = outerRadiusMm
  const ri = innerRadiusMm
  return ((2 / 3) * (ro ** 3 - ri ** 3)) / (ro ** 2 - ri ** 2)
}

/** The swept annulus of a pad and how each figure was obtained. */
export interface PadSweep {
  outerRadiusMm: number
  innerRadiusMm: number
  padHeightMm: number
  padHeightSource: 'given' | 'estimated'
  edgeMarginMm: number
  edgeMarginSource: 'given' | 'default'
  /** The friction radius a new (unbedded) pad would act at, for comparison. */
  uniformPressureRadiusMm: number
}

/** The annulus a pad sweeps on a disc, from the disc diameter and (when known) pad height and edge margin. */
export function padSweep(discDiameterMm: number, padHeightMm?: number, edgeMarginMm?: number): PadSweep {
  const margin = edgeMarginMm ?? DEFAULT_EDGE_MARGIN_MM
  const height = padHeightMm ?? ESTIMATED_PAD_HEIGHT_SHARE * discDiameterMm
  const outer = discDiameterMm / 2 - margin
  const inner = outer - height
  return {
    outerRadiusMm: outer,
    innerRadiusMm: inner,
    padHeightMm: height,
    padHeightSource: padHeightMm === undefined ? 'estimated' : 'given',
    edgeMarginMm: margin,
    edgeMarginSource: edgeMarginMm === undefined ? 'default' : 'given',
    uniformPressureRadiusMm: uniformPressureRadiusMm(outer, inner),
  }
}
