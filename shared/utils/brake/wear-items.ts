/**
 * What every wear and fluid check answers: a verdict per measured item with its limit and where the limit comes
 * from, and the defaults used when the vehicle data has none.
 */
import type { AxleName } from '../../types/axles'
import type { WheelPosition } from './schemas'

export type Verdict = 'ok' | 'advise' | 'fail'

/**
 * Defaults when the vehicle data has none. Thickness variation 0.020 mm and lateral runout 0.05 mm are common
 * practice (service manuals typically give 0.009-0.030 mm and 0.03-0.08 mm). Pads: under 1.5 mm is a UK
 * roadworthiness-test failure; replace at about 3 mm (common practice). Fluid water: 2 % advise, 3 % replace
 * (common practice; a refractometer maker's guidance).
 */
export const WEAR_DEFAULTS = {
  thicknessVariationLimitMm: 0.02,
  runoutLimitMm: 0.05,
  padAdviseMm: 3,
  padFailBelowMm: 1.5,
  fluidWaterAdvisePercent: 2,
  fluidWaterReplacePercent: 3,
} as const

export type WearItemKind =
  | 'disc-thickness'
  | 'disc-thickness-variation'
  | 'disc-runout'
  | 'pad-thickness'
  | 'drum-diameter'
  | 'fluid-water'
  | 'fluid-compatibility'

/** One checked item. */
export interface WearItem {
  /** Stable id, e.g. `disc:front-left:thickness`, `pad:front:left:inner`. */
  id: string
  kind: WearItemKind
  axle: AxleName | null
  position: WheelPosition | string | null
  verdict: Verdict
  message: string
  measured: number | null
  limit: number | null
  unit: string | null
  /** Where the limit comes from. */
  limitSource: 'vehicle data' | 'default' | 'FMVSS No. 116' | null
}

const VERDICT_RANK: Record<Verdict, number> = { ok: 0, advise: 1, fail: 2 }

/** The worse of verdicts. */
export function worstVerdict(verdicts: readonly Verdict[]): Verdict {
  return verdicts.reduce<Verdict>((w, v) => (VERDICT_RANK[v] > VERDICT_RANK[w] ? v : w), 'ok')
}

/** Micrometer readings are typed as decimals: limits are compared with a margin far below any gauge's resolution. */
export const READING_MARGIN = 1e-9
/** A length as the messages write it: at most three decimals and the unit. */
export const mmText = (n: number) => `${Number(n.toFixed(3))} mm`
