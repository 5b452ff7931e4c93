/**
 * What every wear and fluid check answers: a verdict per measured item with its limit and where the limit comes
 * from, named by the wheel it is about, and the defaults used when the vehicle data has none.
 */
import type { AxleName } from '../../types/axles'
import type { ConditionItem, WheelPosition } from './wear-schemas'

export type Verdict = 'ok' | 'advise' | 'fail'

/**
 * Defaults when the vehicle data has none.
 * - Thickness variation 0.020 mm and lateral runout 0.05 mm (common practice; service manuals typically give
 *   0.009-0.030 mm and 0.03-0.08 mm).
 * - Pads: under 1.5 mm is a UK roadworthiness-test failure; replace at about 3 mm (common practice). Shoe linings:
 *   the same 1.5 mm failure (from memory), advised at 2 mm (common practice).
 * - A disc within 1 mm of its discard thickness when the pads are renewed goes with them: a set of pads wears a disc
 *   about 0.5-1 mm (common practice).
 * - A drum within 0.8 mm of its maximum diameter can't be machined (common practice: the refinish limit sits about
 *   0.030 in under the discard diameter; from memory).
 * - Inner and outer pad, or left and right wheel, more than 2 mm apart: a sticking slide or piston (common practice).
 * - Fluid water: 2 % advise, 3 % replace (common practice; a refractometer maker's guidance). Boiling point within
 *   20 °C of the grade's wet minimum: advise (common practice). Fluid over 2 years old: advise (common practice;
 *   most makers' service schedules).
 */
export const WEAR_DEFAULTS = {
  thicknessVariationLimitMm: 0.02,
  runoutLimitMm: 0.05,
  padAdviseMm: 3,
  padFailBelowMm: 1.5,
  shoeAdviseMm: 2,
  shoeFailBelowMm: 1.5,
  discMarginWithPadsMm: 1,
  drumMachiningAllowanceMm: 0.8,
  unevenPadWearMm: 2,
  fluidWaterAdvisePercent: 2,
  fluidWaterReplacePercent: 3,
  fluidBoilingAdviseMarginC: 20,
  fluidAgeAdviseMonths: 24,
} as const

export type WearItemKind =
  | 'disc-thickness'
  | 'disc-thickness-variation'
  | 'disc-runout'
  | 'pad-thickness'
  | 'pad-wear-uneven'
  | 'pad-wear-sides'
  | 'drum-diameter'
  | 'shoe-lining'
  | 'condition'
  | 'fluid-water'
  | 'fluid-boiling-point'
  | 'fluid-age'
  | 'fluid-compatibility'
  | 'brake-test'

/** The part of a wheel (or of the system) an item is about: photos of a wheel's finding are filed under it. */
export type WearSubject = 'disc' | 'pads' | 'drum' | 'shoes' | ConditionItem | 'fluid' | 'brake-test'

/** One checked item. */
export interface WearItem {
  /** Stable id, e.g. `disc:front-left:thickness`, `pad:front:left:inner`, `condition:rear-left:hose`. */
  id: string
  kind: WearItemKind
  subject: WearSubject
  axle: AxleName | null
  /** The wheel (`front-left`), or null for the axle or the whole system. */
  position: WheelPosition | string | null
  verdict: Verdict
  message: string
  measured: number | null
  limit: number | null
  unit: string | null
  /** Where the limit comes from. */
  limitSource: 'vehicle data' | 'default' | 'FMVSS No. 116' | 'ISO 4925' | 'technician' | 'brake tester' | null
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

/** The axle a wheel position belongs to. */
export function axleOf(position: WheelPosition): AxleName {
  return position.startsWith('front') ? 'front' : 'rear'
}

/** "front left" for `front-left`. */
export function wheelName(position: WheelPosition): string {
  return position.replace('-', ' ')
}

/** "Front left" for `front-left`, "Front" for an axle. */
export function capitalised(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1)
}
