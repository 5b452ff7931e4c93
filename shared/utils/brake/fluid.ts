/**
 * Brake fluid: the FMVSS No. 116 grades with their minimum boiling points, which grades mix, and the fluid check
 * (water content and the grade to add).
 */
import type { FluidCheck, FluidGradeName } from './schemas'
import { celsiusToFahrenheit } from './units'
import { READING_MARGIN, WEAR_DEFAULTS, type WearItem } from './wear-items'

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
    const replace = w >= WEAR_DEFAULTS.fluidWaterReplacePercent - READING_MARGIN
    const advise = !replace && w >= WEAR_DEFAULTS.fluidWaterAdvisePercent - READING_MARGIN
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
