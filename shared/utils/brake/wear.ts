/**
 * Wear and fluid checks: measured values in, a verdict per item out, plus the part types to suggest per axle.
 * This is the computation behind POST /api/calculations/wear ({@link computeWear}).
 *
 * Limits: the vehicle maker's data when given, otherwise the stated defaults. Lengths in mm, water content in %.
 */
import type { AxleName, DiscWear, DrumWear, FluidCheck, FluidGradeName, PadWear, WearInput, WearInputRaw, WheelPosition } from './schemas'
import { BrakeInputError, fieldIssues, wearInputSchema } from './schemas'
import { celsiusToFahrenheit } from './units'

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

/** One brake fluid grade with its FMVSS No. 116 minimum boiling points. */
export interface FluidGrade {
  grade: FluidGradeName
  base: 'glycol' | 'silicone'
  description: string
  /** Minimum equilibrium reflux boiling point, new fluid, °C. */
  minDryBoilingPointC: number
  /** Minimum wet boiling point (fluid humidified to 3.70 % water, S6.2), °C. */
  minWetBoilingPointC: number
}

/** FMVSS No. 116 (49 CFR 571.116) minimum boiling points. */
export const FMVSS_116_GRADES: Readonly<Record<FluidGradeName, FluidGrade>> = {
  'DOT 3': { grade: 'DOT 3', base: 'glycol', description: 'glycol ether', minDryBoilingPointC: 205, minWetBoilingPointC: 140 },
  'DOT 4': { grade: 'DOT 4', base: 'glycol', description: 'glycol ether / borate', minDryBoilingPointC: 230, minWetBoilingPointC: 155 },
  'DOT 5.1': { grade: 'DOT 5.1', base: 'glycol', description: 'glycol ether / borate (non-silicone)', minDryBoilingPointC: 260, minWetBoilingPointC: 180 },
  'DOT 5': { grade: 'DOT 5', base: 'silicone', description: 'silicone', minDryBoilingPointC: 260, minWetBoilingPointC: 180 },
}

/** Boiling points of a grade in °C and °F. */
export function fluidBoilingPoints(grade: FluidGradeName): { dryC: number; wetC: number; dryF: number; wetF: number } {
  const g = FMVSS_116_GRADES[grade]
  return {
    dryC: g.minDryBoilingPointC,
    wetC: g.minWetBoilingPointC,
    dryF: celsiusToFahrenheit(g.minDryBoilingPointC),
    wetF: celsiusToFahrenheit(g.minWetBoilingPointC),
  }
}

/** Rank of the glycol grades by their FMVSS No. 116 minimum boiling points. */
const GLYCOL_RANK: Partial<Record<FluidGradeName, number>> = { 'DOT 3': 0, 'DOT 4': 1, 'DOT 5.1': 2 }

/** Whether two grades may be mixed: DOT 3, 4 and 5.1 mix with one another; DOT 5 (silicone) mixes only with itself. */
export function fluidGradesMix(a: FluidGradeName, b: FluidGradeName): boolean {
  return FMVSS_116_GRADES[a].base === FMVSS_116_GRADES[b].base
}

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

const VERDICT_RANK: Record<Verdict, number> = { ok: 0, advise: 1, fail: 2 }

/** The worse of verdicts. */
export function worstVerdict(verdicts: readonly Verdict[]): Verdict {
  return verdicts.reduce<Verdict>((w, v) => (VERDICT_RANK[v] > VERDICT_RANK[w] ? v : w), 'ok')
}

// Micrometer readings are typed as decimals; compare with a margin far below any gauge's resolution.
const EPS = 1e-9
const mm = (n: number) => `${Number(n.toFixed(3))} mm`

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

  const below = thinnest < disc.minThicknessMm - EPS
  const atMin = !below && thinnest <= disc.minThicknessMm + EPS
  items.push({
    ...base,
    id: `disc:${disc.position}:thickness`,
    kind: 'disc-thickness',
    verdict: below ? 'fail' : atMin ? 'advise' : 'ok',
    message: below
      ? `Thinnest reading ${mm(thinnest)} is below the minimum thickness ${mm(disc.minThicknessMm)}: replace the disc (in axle pairs); never machine it below the minimum.`
      : atMin
        ? `Thinnest reading ${mm(thinnest)} is at the minimum thickness: no material is left for machining; replace if it needs skimming.`
        : `Thinnest reading ${mm(thinnest)}, ${mm(thinnest - disc.minThicknessMm)} above the minimum ${mm(disc.minThicknessMm)}.`,
    measured: thinnest,
    limit: disc.minThicknessMm,
    limitSource: 'vehicle data',
  })

  const tvGiven = disc.thicknessVariationMm
  // Rounded to 1e-6 mm so 22.03 − 21.98 reads 0.05, not 0.05000000000000071.
  const tv = tvGiven ?? (disc.thicknessReadingsMm.length >= 2 ? Math.round((thickest - thinnest) * 1e6) / 1e6 : null)
  if (tv !== null) {
    const limit = disc.thicknessVariationLimitMm ?? WEAR_DEFAULTS.thicknessVariationLimitMm
    const over = tv > limit + EPS
    const margin = thinnest - disc.minThicknessMm
    items.push({
      ...base,
      id: `disc:${disc.position}:thickness-variation`,
      kind: 'disc-thickness-variation',
      verdict: over ? 'fail' : 'ok',
      message: over
        ? `Thickness variation ${mm(tv)} is over the limit ${mm(limit)} (pedal pulsation, judder). ` +
          (margin > tv + EPS
            ? `Machine only if the disc stays above ${mm(disc.minThicknessMm)} afterwards (${mm(margin)} to spare), otherwise replace.`
            : 'Too little material above the minimum to machine it out: replace the disc.')
        : `Thickness variation ${mm(tv)} is within the limit ${mm(limit)}.`,
      measured: tv,
      limit,
      limitSource: disc.thicknessVariationLimitMm === undefined ? 'default' : 'vehicle data',
    })
  }

  if (disc.runoutMm !== undefined) {
    const limit = disc.runoutLimitMm ?? WEAR_DEFAULTS.runoutLimitMm
    const over = disc.runoutMm > limit + EPS
    items.push({
      ...base,
      id: `disc:${disc.position}:runout`,
      kind: 'disc-runout',
      verdict: over ? 'fail' : 'ok',
      message: over
        ? `Lateral runout ${mm(disc.runoutMm)} is over the limit ${mm(limit)}: clean the hub face and refit (or re-index) the disc and measure again; if it stays over, machine on the car or replace.`
        : `Lateral runout ${mm(disc.runoutMm)} is within the limit ${mm(limit)}.`,
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
    const fail = value < WEAR_DEFAULTS.padFailBelowMm - EPS
    const advise = !fail && value <= WEAR_DEFAULTS.padAdviseMm + EPS
    return {
      id: `pad:${where}:${face}`,
      kind: 'pad-thickness' as const,
      axle: pads.axle,
      position: pads.side ?? null,
      verdict: fail ? ('fail' as const) : advise ? ('advise' as const) : ('ok' as const),
      message: fail
        ? `${label} ${face} pad has ${mm(value)} of friction material, under ${mm(WEAR_DEFAULTS.padFailBelowMm)}: replace the pads on both sides of the axle now.`
        : advise
          ? `${label} ${face} pad has ${mm(value)} of friction material, about ${mm(WEAR_DEFAULTS.padAdviseMm)} or less: advise replacing the axle set soon.`
          : `${label} ${face} pad has ${mm(value)} of friction material.`,
      measured: value,
      limit: fail ? WEAR_DEFAULTS.padFailBelowMm : WEAR_DEFAULTS.padAdviseMm,
      unit: 'mm',
      limitSource: 'default' as const,
    }
  })
}

/** Drum inside diameter against its maximum (discard) diameter. */
export function checkDrum(drum: DrumWear): WearItem {
  const over = drum.diameterMm > drum.maxDiameterMm + EPS
  const atMax = !over && drum.diameterMm >= drum.maxDiameterMm - EPS
  return {
    id: `drum:${drum.position}:diameter`,
    kind: 'drum-diameter',
    axle: axleOf(drum.position),
    position: drum.position,
    verdict: over ? 'fail' : atMax ? 'advise' : 'ok',
    message: over
      ? `Drum diameter ${mm(drum.diameterMm)} is over the maximum ${mm(drum.maxDiameterMm)}: replace the drum (in axle pairs); never machine it beyond the maximum.`
      : atMax
        ? `Drum diameter ${mm(drum.diameterMm)} is at the maximum: it can't be machined; replace if it needs skimming.`
        : `Drum diameter ${mm(drum.diameterMm)}, ${mm(drum.maxDiameterMm - drum.diameterMm)} under the maximum ${mm(drum.maxDiameterMm)}.`,
    measured: drum.diameterMm,
    limit: drum.maxDiameterMm,
    unit: 'mm',
    limitSource: 'vehicle data',
  }
}

function gradeText(grade: FluidGradeName): string {
  const b = fluidBoilingPoints(grade)
  return `${grade} (FMVSS No. 116 minimum boiling point: ${b.dryC} °C dry, ${b.wetC} °C wet)`
}

/** Water content and grade compatibility of the brake fluid. */
export function checkFluid(fluid: FluidCheck): WearItem[] {
  const items: WearItem[] = []
  const base = { axle: null, position: null } as const

  if (fluid.waterPercent !== undefined) {
    const w = fluid.waterPercent
    const replace = w >= WEAR_DEFAULTS.fluidWaterReplacePercent - EPS
    const advise = !replace && w >= WEAR_DEFAULTS.fluidWaterAdvisePercent - EPS
    items.push({
      ...base,
      id: 'fluid:water',
      kind: 'fluid-water',
      verdict: replace ? 'fail' : advise ? 'advise' : 'ok',
      message: replace
        ? `Water content ${w} % is ${WEAR_DEFAULTS.fluidWaterReplacePercent} % or more: replace the brake fluid (flush and bleed); its boiling point is down toward the wet figure${fluid.gradeInSystem ? ` of ${gradeText(fluid.gradeInSystem)}` : ''}.`
        : advise
          ? `Water content ${w} % is ${WEAR_DEFAULTS.fluidWaterAdvisePercent} % or more: advise a fluid change soon.`
          : `Water content ${w} % is under ${WEAR_DEFAULTS.fluidWaterAdvisePercent} %.`,
      measured: w,
      limit: replace ? WEAR_DEFAULTS.fluidWaterReplacePercent : WEAR_DEFAULTS.fluidWaterAdvisePercent,
      unit: '%',
      limitSource: 'default',
    })
  }

  const inSystem = fluid.gradeInSystem
  const toAdd = fluid.gradeToAdd
  if (inSystem && toAdd) {
    const mixes = fluidGradesMix(inSystem, toAdd)
    const rankSystem = GLYCOL_RANK[inSystem]
    const rankAdd = GLYCOL_RANK[toAdd]
    const lower = mixes && rankSystem !== undefined && rankAdd !== undefined && rankAdd < rankSystem
    const belowSpec =
      fluid.specifiedGrade !== undefined &&
      GLYCOL_RANK[fluid.specifiedGrade] !== undefined &&
      rankAdd !== undefined &&
      rankAdd < (GLYCOL_RANK[fluid.specifiedGrade] as number)
    items.push({
      ...base,
      id: 'fluid:compatibility',
      kind: 'fluid-compatibility',
      verdict: !mixes ? 'fail' : lower || belowSpec ? 'advise' : 'ok',
      message: !mixes
        ? `${toAdd} must not be added to ${inSystem}: DOT 5 is silicone-based and does not mix with the glycol grades (DOT 3, 4, 5.1). ` +
          'Flush the whole system and refill with one grade. Identify fluid by the reservoir label or records, never by colour.'
        : lower
          ? `${toAdd} mixes with ${inSystem}, but the mix can only be counted on for the lower grade: ${gradeText(toAdd)}. Top up with ${inSystem} or better.`
          : belowSpec
            ? `${toAdd} mixes with ${inSystem}, but the vehicle maker specifies ${fluid.specifiedGrade}: use that grade or better.`
            : `${toAdd} can be added to ${inSystem}: ${gradeText(toAdd)}.`,
      measured: null,
      limit: null,
      unit: null,
      limitSource: 'FMVSS No. 116',
    })
  } else if (inSystem && fluid.specifiedGrade && !fluidGradesMix(inSystem, fluid.specifiedGrade)) {
    items.push({
      ...base,
      id: 'fluid:compatibility',
      kind: 'fluid-compatibility',
      verdict: 'fail',
      message: `The system holds ${inSystem} but the vehicle maker specifies ${fluid.specifiedGrade}: silicone (DOT 5) and glycol grades don't mix. Flush the whole system before refilling.`,
      measured: null,
      limit: null,
      unit: null,
      limitSource: 'FMVSS No. 116',
    })
  }
  return items
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
  for (const item of items) {
    if (item.verdict === 'ok') continue
    const v = item.verdict
    switch (item.kind) {
      case 'disc-thickness':
      case 'disc-thickness-variation':
      case 'disc-runout':
        if (!item.axle) break
        // Discs go in axle pairs and new discs get new pads (common practice).
        add(item.axle, 'discs', v, item.message)
        add(item.axle, 'pads', v, `New discs on the ${item.axle} axle take new pads.`)
        break
      case 'pad-thickness':
        if (item.axle) add(item.axle, 'pads', v, item.message)
        break
      case 'drum-diameter':
        if (!item.axle) break
        // Drums go in axle pairs and new drums get new shoes (common practice).
        add(item.axle, 'drums', v, item.message)
        add(item.axle, 'shoes', v, `New drums on the ${item.axle} axle take new shoes.`)
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
 * @throws BrakeInputError (with field issues) when the input fails {@link wearInputSchema}.
 */
export function computeWear(raw: WearInputRaw): WearResult {
  const parsed = wearInputSchema.safeParse(raw)
  if (!parsed.success) throw new BrakeInputError(fieldIssues(parsed.error))
  const input = parsed.data

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
