/**
 * A garage's markup rules: how much it adds to its net (trade) price when a part goes on a quote.
 * Either a percentage per part type (with one for any type not listed), or bands by the part's net unit price
 * (cheap parts usually carry a larger percentage than expensive ones). Percentages are basis points.
 */

export interface MarkupByType {
  mode: 'by_type'
  /** for part types not listed */
  defaultBp: number
  /** catalogue part type (parts.type) -> basis points */
  byType: Record<string, number>
}

export interface MarkupBand {
  /** inclusive upper bound of the net unit price in minor units; null for the last, open-ended band */
  upToMinor: number | null
  bp: number
}

export interface MarkupByCost {
  mode: 'by_cost'
  /** ascending by `upToMinor`, the last one open-ended */
  bands: MarkupBand[]
}

export type MarkupRules = MarkupByType | MarkupByCost

/** What a garage starts with until its manager sets its own (common practice in independent workshops). */
export const DEFAULT_MARKUP_RULES: MarkupRules = {
  mode: 'by_type',
  defaultBp: 3000,
  byType: { pad_set: 3500, disc: 3000, drum: 3000, shoe_set: 3500, caliper: 2500, master_cylinder: 2500, wheel_cylinder: 3000, hose: 4000, fluid: 4000 },
}

/**
 * The markup for one part under the rules. By cost: the first band whose upper bound the net unit price does
 * not exceed (bounds are inclusive), else the open-ended band.
 */
export function markupBpFor(rules: MarkupRules, part: { type: string; unitNetMinor: number }): number {
  if (rules.mode === 'by_type') return rules.byType[part.type] ?? rules.defaultBp
  const bands = [...rules.bands].sort((a, b) => (a.upToMinor ?? Infinity) - (b.upToMinor ?? Infinity))
  for (const band of bands) {
    if (band.upToMinor === null || part.unitNetMinor <= band.upToMinor) return band.bp
  }
  return bands.at(-1)?.bp ?? 0
}

/** People's words for part types, for the settings form and the quote. */
export const QUOTE_PART_TYPE_LABELS: Record<string, string> = {
  pad_set: 'Pad sets',
  disc: 'Discs',
  drum: 'Drums',
  shoe_set: 'Shoe sets',
  caliper: 'Calipers',
  wheel_cylinder: 'Wheel cylinders',
  master_cylinder: 'Master cylinders',
  hose: 'Hoses',
  fluid: 'Brake fluid',
  fitting_kit: 'Fitting kits',
  wear_sensor: 'Wear sensors',
}
