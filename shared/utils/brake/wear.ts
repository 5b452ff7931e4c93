/**
 * Wear and fluid checks: measured values in, a verdict per item out, plus the part types to suggest per axle.
 * This is the computation behind POST /api/calculations/wear ({@link computeWear}).
 *
 * Limits: the vehicle maker's data when given, otherwise the stated defaults. Lengths in mm, water content in %.
 */
import type { AxleName } from '../../types/axles'
import type { DiscWear, DrumWear, PadWear, WearInput, WearInputRaw, WheelPosition } from './schemas'
import { parseWearInput, validInput } from './schemas'
import { checkFluid } from './fluid'
import { READING_MARGIN, WEAR_DEFAULTS, mmText, worstVerdict, type Verdict, type WearItem } from './wear-items'

export { WEAR_DEFAULTS, worstVerdict, type Verdict, type WearItem, type WearItemKind } from './wear-items'

export type PartType = 'discs' | 'pads' | 'drums' | 'shoes' | 'brake-fluid'

/** A part type the catalogue can suggest, per axle (or for the whole system: fluid). */
export interface RecommendedPart {
  axle: AxleName | 'system'
  partType: PartType
  verdict: Exclude<Verdict, 'ok'>
  reasons: string[]
}

/** The answer of POST /api/calculations/wear. */
export interface WearResult {
  items: WearItem[]
  overall: Verdict
  recommendedParts: RecommendedPart[]
  inputs: WearInput
  units: Record<string, string>
  assumptions: string[]
  cautions: string[]
}

/** The axle a wheel position belongs to. */
export function axleOf(position: WheelPosition): AxleName {
  return position.startsWith('front') ? 'front' : 'rear'
}

/** Disc thickness, thickness variation and runout for one disc. */
export function checkDisc(disc: DiscWear): WearItem[] {
  const axle = axleOf(disc.position)
  const base = { axle, position: disc.position, unit: 'mm' } as const
  const thinnest = Math.min(...disc.thicknessReadingsMm)
  const thickest = Math.max(...disc.thicknessReadingsMm)
  const items: WearItem[] = []

  const below = thinnest < disc.minThicknessMm - READING_MARGIN
  const atMin = !below && thinnest <= disc.minThicknessMm + READING_MARGIN
  items.push({
    ...base,
    id: `disc:${disc.position}:thickness`,
    kind: 'disc-thickness',
    verdict: below ? 'fail' : atMin ? 'advise' : 'ok',
    message: below
      ? `Thinnest reading ${mmText(thinnest)} is below the minimum thickness ${mmText(disc.minThicknessMm)}: replace the disc (in axle pairs); never machine it below the minimum.`
      : atMin
        ? `Thinnest reading ${mmText(thinnest)} is at the minimum thickness: no material is left for machining; replace if it needs skimming.`
        : `Thinnest reading ${mmText(thinnest)}, ${mmText(thinnest - disc.minThicknessMm)} above the minimum ${mmText(disc.minThicknessMm)}.`,
    measured: thinnest,
    limit: disc.minThicknessMm,
    limitSource: 'vehicle data',
  })

  const tvGiven = disc.thicknessVariationMm
  // Rounded to 1e-6 mm so 22.03 − 21.98 reads 0.05, not 0.05000000000000071.
  const tv = tvGiven ?? (disc.thicknessReadingsMm.length >= 2 ? Math.round((thickest - thinnest) * 1e6) / 1e6 : null)
  if (tv !== null) {
    const limit = disc.thicknessVariationLimitMm ?? WEAR_DEFAULTS.thicknessVariationLimitMm
    const over = tv > limit + READING_MARGIN
    const margin = thinnest - disc.minThicknessMm
    items.push({
      ...base,
      id: `disc:${disc.position}:thickness-variation`,
      kind: 'disc-thickness-variation',
      verdict: over ? 'fail' : 'ok',
      message: over
        ? `Thickness variation ${mmText(tv)} is over the limit ${mmText(limit)} (pedal pulsation, judder). ` +
          (margin > tv + READING_MARGIN
            ? `Machine only if the disc stays above ${mmText(disc.minThicknessMm)} afterwards (${mmText(margin)} to spare), otherwise replace.`
            : 'Too little material above the minimum to machine it out: replace the disc.')
        : `Thickness variation ${mmText(tv)} is within the limit ${mmText(limit)}.`,
      measured: tv,
      limit,
      limitSource: disc.thicknessVariationLimitMm === undefined ? 'default' : 'vehicle data',
    })
  }

  if (disc.runoutMm !== undefined) {
    const limit = disc.runoutLimitMm ?? WEAR_DEFAULTS.runoutLimitMm
    const over = disc.runoutMm > limit + READING_MARGIN
    items.push({
      ...base,
      id: `disc:${disc.position}:runout`,
      kind: 'disc-runout',
      verdict: over ? 'fail' : 'ok',
      message: over
        ? `Lateral runout ${mmText(disc.runoutMm)} is over the limit ${mmText(limit)}: clean the hub face and refit (or re-index) the disc and measure again; if it stays over, machine on the car or replace.`
        : `Lateral runout ${mmText(disc.runoutMm)} is within the limit ${mmText(limit)}.`,
      measured: disc.runoutMm,
      limit,
      limitSource: disc.runoutLimitMm === undefined ? 'default' : 'vehicle data',
    })
  }
  return items
}

/** Friction material left on the inner and outer pad of one axle (or one wheel). */
export function checkPads(pads: PadWear): WearItem[] {
  const where = pads.side ? `${pads.axle}:${pads.side}` : pads.axle
  const where2 = pads.side ? `${pads.axle} ${pads.side}` : pads.axle
  const label = where2.charAt(0).toUpperCase() + where2.slice(1)
  return (['inner', 'outer'] as const).map((face) => {
    const value = face === 'inner' ? pads.innerMm : pads.outerMm
    const fail = value < WEAR_DEFAULTS.padFailBelowMm - READING_MARGIN
    const advise = !fail && value <= WEAR_DEFAULTS.padAdviseMm + READING_MARGIN
    return {
      id: `pad:${where}:${face}`,
      kind: 'pad-thickness' as const,
      axle: pads.axle,
      position: pads.side ?? null,
      verdict: fail ? ('fail' as const) : advise ? ('advise' as const) : ('ok' as const),
      message: fail
        ? `${label} ${face} pad has ${mmText(value)} of friction material, under ${mmText(WEAR_DEFAULTS.padFailBelowMm)}: replace the pads on both sides of the axle now.`
        : advise
          ? `${label} ${face} pad has ${mmText(value)} of friction material, about ${mmText(WEAR_DEFAULTS.padAdviseMm)} or less: advise replacing the axle set soon.`
          : `${label} ${face} pad has ${mmText(value)} of friction material.`,
      measured: value,
      limit: fail ? WEAR_DEFAULTS.padFailBelowMm : WEAR_DEFAULTS.padAdviseMm,
      unit: 'mm',
      limitSource: 'default' as const,
    }
  })
}

/** Drum inside diameter against its maximum (discard) diameter. */
export function checkDrum(drum: DrumWear): WearItem {
  const over = drum.diameterMm > drum.maxDiameterMm + READING_MARGIN
  const atMax = !over && drum.diameterMm >= drum.maxDiameterMm - READING_MARGIN
  return {
    id: `drum:${drum.position}:diameter`,
    kind: 'drum-diameter',
    axle: axleOf(drum.position),
    position: drum.position,
    verdict: over ? 'fail' : atMax ? 'advise' : 'ok',
    message: over
      ? `Drum diameter ${mmText(drum.diameterMm)} is over the maximum ${mmText(drum.maxDiameterMm)}: replace the drum (in axle pairs); never machine it beyond the maximum.`
      : atMax
        ? `Drum diameter ${mmText(drum.diameterMm)} is at the maximum: it can't be machined; replace if it needs skimming.`
        : `Drum diameter ${mmText(drum.diameterMm)}, ${mmText(drum.maxDiameterMm - drum.diameterMm)} under the maximum ${mmText(drum.maxDiameterMm)}.`,
    measured: drum.diameterMm,
    limit: drum.maxDiameterMm,
    unit: 'mm',
    limitSource: 'vehicle data',
  }
}

/** Part types to suggest from the verdicts, merged per axle and part type. */
export function recommendParts(items: readonly WearItem[]): RecommendedPart[] {
  const out: RecommendedPart[] = []
  const add = (axle: RecommendedPart['axle'], partType: PartType, verdict: Exclude<Verdict, 'ok'>, reason: string) => {
    const existing = out.find((r) => r.axle === axle && r.partType === partType)
    if (!existing) {
      out.push({ axle, partType, verdict, reasons: [reason] })
      return
    }
    existing.verdict = worstVerdict([existing.verdict, verdict]) as Exclude<Verdict, 'ok'>
    if (!existing.reasons.includes(reason)) existing.reasons.push(reason)
  }
  // Discs and drums go in axle pairs; new discs get new pads and new drums new shoes (common practice).
  const withPartner = (axle: AxleName, worn: 'discs' | 'drums', v: Exclude<Verdict, 'ok'>, reason: string) => {
    const partner = worn === 'discs' ? 'pads' : 'shoes'
    add(axle, worn, v, reason)
    add(axle, partner, v, `New ${worn} on the ${axle} axle take new ${partner}.`)
  }
  for (const item of items) {
    if (item.verdict === 'ok') continue
    const v = item.verdict
    switch (item.kind) {
      case 'disc-thickness':
      case 'disc-thickness-variation':
      case 'disc-runout':
        if (item.axle) withPartner(item.axle, 'discs', v, item.message)
        break
      case 'pad-thickness':
        if (item.axle) add(item.axle, 'pads', v, item.message)
        break
      case 'drum-diameter':
        if (item.axle) withPartner(item.axle, 'drums', v, item.message)
        break
      case 'fluid-water':
      case 'fluid-compatibility':
        add('system', 'brake-fluid', v, item.message)
        break
    }
  }
  return out
}

/** Units of the measured values. */
export const WEAR_UNITS = {
  thicknessReadingsMm: 'mm',
  minThicknessMm: 'mm',
  thicknessVariationMm: 'mm',
  runoutMm: 'mm',
  padMm: 'mm',
  drumDiameterMm: 'mm',
  waterPercent: '%',
  boilingPoint: '°C',
} as const

export const WEAR_CAUTIONS: readonly string[] = [
  'The vehicle maker\'s limits stamped on the part or in its service data come first; the defaults here apply only when there are none.',
  'Replace discs, drums and pads in axle sets; bleed and test the brakes before the vehicle leaves the workshop.',
]

/**
 * Runs the wear and fluid checks.
 * @throws BrakeInputError (with field issues) when the input fails the wear schema.
 */
export function computeWear(raw: WearInputRaw): WearResult {
  const input = validInput(parseWearInput, raw)

  const items: WearItem[] = [
    ...input.discs.flatMap(checkDisc),
    ...input.pads.flatMap(checkPads),
    ...input.drums.map(checkDrum),
    ...(input.fluid ? checkFluid(input.fluid) : []),
  ]

  const assumptions: string[] = []
  if (input.discs.some((d) => d.thicknessVariationMm === undefined && d.thicknessReadingsMm.length >= 2)) {
    assumptions.push('Thickness variation taken as thickest minus thinnest reading (readings around the disc at the same radius).')
  }
  if (input.discs.some((d) => d.thicknessVariationLimitMm === undefined || (d.runoutMm !== undefined && d.runoutLimitMm === undefined))) {
    assumptions.push(
      `Default limits where the vehicle data has none: thickness variation ${WEAR_DEFAULTS.thicknessVariationLimitMm} mm, lateral runout ${WEAR_DEFAULTS.runoutLimitMm} mm (common practice).`,
    )
  }
  if (input.pads.length > 0) {
    assumptions.push(
      `Pads: under ${WEAR_DEFAULTS.padFailBelowMm} mm fails (UK roadworthiness test); about ${WEAR_DEFAULTS.padAdviseMm} mm or less is advised for replacement (common practice).`,
    )
  }
  if (input.fluid?.waterPercent !== undefined) {
    assumptions.push(
      `Fluid water content: ${WEAR_DEFAULTS.fluidWaterAdvisePercent} % advise, ${WEAR_DEFAULTS.fluidWaterReplacePercent} % replace (common practice).`,
    )
  }

  return {
    items,
    overall: worstVerdict(items.map((i) => i.verdict)),
    recommendedParts: recommendParts(items),
    inputs: input,
    units: { ...WEAR_UNITS },
    assumptions,
    cautions: [...WEAR_CAUTIONS],
  }
}
