/**
 * Wear, condition and fluid checks: measured values in, a verdict per item out (each named by its wheel), plus the
 * part types to suggest. This is the computation behind POST /api/calculations/wear ({@link computeWear}).
 *
 * Limits: the vehicle maker's data when given, otherwise the stated defaults (wear-items.ts). Lengths in mm.
 */
import { parseWearInput, type WearInput, type WearInputRaw } from './wear-schemas'
import { validInput } from './schema-fields'
import { checkFluid } from './fluid'
import { checkDisc, checkPadSides, checkPads } from './wear-discs'
import { checkDrum, checkShoes } from './wear-drums'
import { brakeTestItems, checkCondition } from './wear-conditions'
import { computeBrakeTest, type BrakeTestResult } from './brake-test'
import { recommendParts, type RecommendedPart } from './wear-parts'
import { WEAR_DEFAULTS, worstVerdict, type Verdict, type WearItem } from './wear-items'

export { checkDisc, checkPads, checkPadSides } from './wear-discs'
export { checkDrum, checkShoes } from './wear-drums'
export { checkCondition, CONDITION_NAMES } from './wear-conditions'
export { recommendParts, type PartType, type RecommendedPart } from './wear-parts'
export { WEAR_DEFAULTS, axleOf, wheelName, worstVerdict, type Verdict, type WearItem, type WearItemKind, type WearSubject } from './wear-items'

/** The answer of POST /api/calculations/wear. */
export interface WearResult {
  items: WearItem[]
  overall: Verdict
  recommendedParts: RecommendedPart[]
  /** The brake tester's figures when readings were given. */
  brakeTest: BrakeTestResult | null
  inputs: WearInput
  units: Record<string, string>
  assumptions: string[]
  cautions: string[]
}

/** Units of the measured values. */
export const WEAR_UNITS = {
  thicknessReadingsMm: 'mm',
  minThicknessMm: 'mm',
  refinishMinThicknessMm: 'mm',
  thicknessVariationMm: 'mm',
  runoutMm: 'mm',
  padMm: 'mm',
  drumDiameterMm: 'mm',
  liningMm: 'mm',
  waterPercent: '%',
  boilingPointC: '°C',
  ageMonths: 'months',
  brakeForceN: 'N',
  efficiencyPercent: '%',
} as const

export const WEAR_CAUTIONS: readonly string[] = [
  'The vehicle maker\'s limits stamped on the part or in its service data come first; the defaults here apply only when there are none.',
  'Replace discs, drums and pads in axle sets; bleed and test the brakes before the vehicle leaves the workshop.',
]

function assumptionsOf(input: WearInput): string[] {
  const out: string[] = []
  if (input.discs.some((d) => d.thicknessVariationMm === undefined && d.thicknessReadingsMm.length >= 2)) {
    out.push('Thickness variation taken as thickest minus thinnest reading (readings around the disc at the same radius) where no micrometer figure was given.')
  }
  if (input.discs.some((d) => d.thicknessVariationLimitMm === undefined || (d.runoutMm !== undefined && d.runoutLimitMm === undefined))) {
    out.push(`Default limits where the vehicle data has none: thickness variation ${WEAR_DEFAULTS.thicknessVariationLimitMm} mm, lateral runout ${WEAR_DEFAULTS.runoutLimitMm} mm (common practice). Over the limit is advised: clean the hub face and re-check.`)
  }
  if (input.discs.length > 0) {
    out.push(`A disc within ${WEAR_DEFAULTS.discMarginWithPadsMm} mm of its discard thickness is advised with the pads when they are due (a set of pads wears a disc about 0.5-1 mm; common practice).`)
  }
  if (input.pads.length > 0) {
    out.push(`Pads: under ${WEAR_DEFAULTS.padFailBelowMm} mm fails (UK roadworthiness test); about ${WEAR_DEFAULTS.padAdviseMm} mm or less is advised; inner and outer, or left and right, more than ${WEAR_DEFAULTS.unevenPadWearMm} mm apart point to a sticking slide or piston (common practice).`)
  }
  if (input.drums.some((d) => d.machiningAllowanceMm === undefined)) {
    out.push(`A drum within ${WEAR_DEFAULTS.drumMachiningAllowanceMm} mm of its maximum diameter can't be machined (common practice) where the vehicle data gives no allowance.`)
  }
  if (input.shoes.length > 0) {
    out.push(`Shoe linings: under ${WEAR_DEFAULTS.shoeFailBelowMm} mm fails (a usual roadworthiness limit), ${WEAR_DEFAULTS.shoeAdviseMm} mm or less is advised (common practice).`)
  }
  const fluid = input.fluid
  if (fluid?.waterPercent !== undefined) {
    out.push(`Fluid water content: ${WEAR_DEFAULTS.fluidWaterAdvisePercent} % advise, ${WEAR_DEFAULTS.fluidWaterReplacePercent} % replace (common practice).`)
  }
  if (fluid?.boilingPointC !== undefined) {
    out.push(`Fluid boiling point: at or below the grade's wet minimum replace, within ${WEAR_DEFAULTS.fluidBoilingAdviseMarginC} °C of it advise (common practice).`)
  }
  return out
}

/**
 * Runs the wear, condition, fluid and brake tester checks.
 * @throws BrakeInputError (with field issues) when the input fails the wear schema.
 */
export function computeWear(raw: WearInputRaw): WearResult {
  const input = validInput(parseWearInput, raw)
  const padItems = [...input.pads.flatMap(checkPads), ...checkPadSides(input.pads)]
  const padsDue = (axle: string) => padItems.some((i) => i.kind === 'pad-thickness' && i.axle === axle && i.verdict !== 'ok')
  const brakeTest = input.brakeTest ? computeBrakeTest(input.brakeTest) : null
  const items: WearItem[] = [
    ...input.discs.flatMap((d) => checkDisc(d, { padsDue: padsDue(d.position.startsWith('front') ? 'front' : 'rear') })),
    ...padItems,
    ...input.drums.map(checkDrum),
    ...input.shoes.map(checkShoes),
    ...input.conditions.map(checkCondition),
    ...(input.fluid ? checkFluid(input.fluid) : []),
    ...(brakeTest ? brakeTestItems(brakeTest) : []),
  ]
  return {
    items,
    overall: worstVerdict(items.map((i) => i.verdict)),
    recommendedParts: recommendParts(items),
    brakeTest,
    inputs: input,
    units: { ...WEAR_UNITS },
    assumptions: [...assumptionsOf(input), ...(brakeTest?.assumptions ?? [])],
    cautions: [...WEAR_CAUTIONS],
  }
}
