/**
 * Brake fluid: the FMVSS No. 116 grades and ISO 4925 class 6 with their minimum boiling points, which grades mix,
 * and the fluid check (water content, a boiling-point tester's reading, age, and the grade to add).
 */
import type { FluidCheck, FluidGradeName } from './wear-schemas'
import { celsiusToFahrenheit } from './units'
import { READING_MARGIN, WEAR_DEFAULTS, type WearItem } from './wear-items'

/** One brake fluid grade with its minimum boiling points. */
export interface FluidGrade {
  grade: FluidGradeName
  base: 'glycol' | 'silicone'
  description: string
  /** Minimum equilibrium reflux boiling point, new fluid, °C. */
  minDryBoilingPointC: number
  /** Minimum wet boiling point (fluid humidified to the standard's water content), °C. */
  minWetBoilingPointC: number
  /** The standard the figures come from. */
  standard: 'FMVSS No. 116' | 'ISO 4925'
}

/**
 * FMVSS No. 116 (49 CFR 571.116) minimum boiling points, and ISO 4925 class 6: 250 °C dry, 165 °C wet, a
 * low-viscosity glycol fluid (at most 750 mm²/s at −40 °C) that mixes with the DOT glycol grades (from memory).
 */
export const FLUID_GRADES: Readonly<Record<FluidGradeName, FluidGrade>> = {
  'DOT 3': { grade: 'DOT 3', base: 'glycol', description: 'glycol ether', minDryBoilingPointC: 205, minWetBoilingPointC: 140, standard: 'FMVSS No. 116' },
  'DOT 4': { grade: 'DOT 4', base: 'glycol', description: 'glycol ether / borate', minDryBoilingPointC: 230, minWetBoilingPointC: 155, standard: 'FMVSS No. 116' },
  'ISO 4925 Class 6': { grade: 'ISO 4925 Class 6', base: 'glycol', description: 'low-viscosity glycol ether / borate', minDryBoilingPointC: 250, minWetBoilingPointC: 165, standard: 'ISO 4925' },
  'DOT 5.1': { grade: 'DOT 5.1', base: 'glycol', description: 'glycol ether / borate (non-silicone)', minDryBoilingPointC: 260, minWetBoilingPointC: 180, standard: 'FMVSS No. 116' },
  'DOT 5': { grade: 'DOT 5', base: 'silicone', description: 'silicone', minDryBoilingPointC: 260, minWetBoilingPointC: 180, standard: 'FMVSS No. 116' },
}
/** The FMVSS No. 116 grades (the table above less ISO 4925 class 6). */
export const FMVSS_116_GRADES = FLUID_GRADES

/** Boiling points of a grade in °C and °F. */
export function fluidBoilingPoints(grade: FluidGradeName): { dryC: number; wetC: number; dryF: number; wetF: number } {
  const g = FLUID_GRADES[grade]
  return {
    dryC: g.minDryBoilingPointC,
    wetC: g.minWetBoilingPointC,
    dryF: celsiusToFahrenheit(g.minDryBoilingPointC),
    wetF: celsiusToFahrenheit(g.minWetBoilingPointC),
  }
}

/** Rank of the glycol grades by their minimum wet boiling points (what a mix can be counted on for). */
const GLYCOL_RANK: Partial<Record<FluidGradeName, number>> = { 'DOT 3': 0, 'DOT 4': 1, 'ISO 4925 Class 6': 2, 'DOT 5.1': 3 }

/** Whether two grades may be mixed: the glycol grades mix with one another; DOT 5 (silicone) mixes only with itself. */
export function fluidGradesMix(a: FluidGradeName, b: FluidGradeName): boolean {
  return FLUID_GRADES[a].base === FLUID_GRADES[b].base
}

function gradeText(grade: FluidGradeName): string {
  const b = fluidBoilingPoints(grade)
  return `${grade} (${FLUID_GRADES[grade].standard} minimum boiling point: ${b.dryC} °C dry, ${b.wetC} °C wet)`
}

const base = { subject: 'fluid' as const, axle: null, position: null }

function waterItem(fluid: FluidCheck, w: number): WearItem {
  const replace = w >= WEAR_DEFAULTS.fluidWaterReplacePercent - READING_MARGIN
  const advise = !replace && w >= WEAR_DEFAULTS.fluidWaterAdvisePercent - READING_MARGIN
  return {
    ...base, id: 'fluid:water', kind: 'fluid-water',
    verdict: replace ? 'fail' : advise ? 'advise' : 'ok',
    message: replace
      ? `Brake fluid water content ${w} % is ${WEAR_DEFAULTS.fluidWaterReplacePercent} % or more: replace the brake fluid (flush and bleed); its boiling point is down toward the wet figure${fluid.gradeInSystem ? ` of ${gradeText(fluid.gradeInSystem)}` : ''}.`
      : advise
        ? `Brake fluid water content ${w} % is ${WEAR_DEFAULTS.fluidWaterAdvisePercent} % or more: change the fluid soon.`
        : `Brake fluid water content ${w} % is under ${WEAR_DEFAULTS.fluidWaterAdvisePercent} %.`,
    measured: w, limit: replace ? WEAR_DEFAULTS.fluidWaterReplacePercent : WEAR_DEFAULTS.fluidWaterAdvisePercent, unit: '%', limitSource: 'default',
  }
}

function boilingItem(grade: FluidGradeName, c: number): WearItem {
  const wet = FLUID_GRADES[grade].minWetBoilingPointC
  const fail = c <= wet + READING_MARGIN
  const advise = !fail && c <= wet + WEAR_DEFAULTS.fluidBoilingAdviseMarginC + READING_MARGIN
  return {
    ...base, id: 'fluid:boiling-point', kind: 'fluid-boiling-point',
    verdict: fail ? 'fail' : advise ? 'advise' : 'ok',
    message: fail
      ? `Brake fluid boils at ${c} °C, at or below the wet minimum of ${gradeText(grade)}: replace the fluid (flush and bleed) before the brakes are worked hard.`
      : advise
        ? `Brake fluid boils at ${c} °C, within ${WEAR_DEFAULTS.fluidBoilingAdviseMarginC} °C of the ${grade} wet minimum ${wet} °C: change the fluid soon.`
        : `Brake fluid boils at ${c} °C, well above the ${grade} wet minimum ${wet} °C.`,
    measured: c, limit: wet, unit: '°C', limitSource: FLUID_GRADES[grade].standard,
  }
}

function ageItem(months: number): WearItem {
  const due = months >= WEAR_DEFAULTS.fluidAgeAdviseMonths
  return {
    ...base, id: 'fluid:age', kind: 'fluid-age', verdict: due ? 'advise' : 'ok',
    message: due
      ? `Brake fluid is ${months} months old: most vehicle makers ask for new fluid every ${WEAR_DEFAULTS.fluidAgeAdviseMonths / 12} years, as it takes up water from the air.`
      : `Brake fluid is ${months} months old.`,
    measured: months, limit: WEAR_DEFAULTS.fluidAgeAdviseMonths, unit: 'months', limitSource: 'default',
  }
}

function compatibilityItem(fluid: FluidCheck): WearItem | null {
  const inSystem = fluid.gradeInSystem
  const toAdd = fluid.gradeToAdd
  const item = { ...base, id: 'fluid:compatibility', kind: 'fluid-compatibility' as const, measured: null, limit: null, unit: null, limitSource: 'FMVSS No. 116' as const }
  if (inSystem && toAdd) {
    const mixes = fluidGradesMix(inSystem, toAdd)
    const rankSystem = GLYCOL_RANK[inSystem]
    const rankAdd = GLYCOL_RANK[toAdd]
    const lower = mixes && rankSystem !== undefined && rankAdd !== undefined && rankAdd < rankSystem
    const specRank = fluid.specifiedGrade === undefined ? undefined : GLYCOL_RANK[fluid.specifiedGrade]
    const belowSpec = specRank !== undefined && rankAdd !== undefined && rankAdd < specRank
    return {
      ...item,
      verdict: !mixes ? 'fail' : lower || belowSpec ? 'advise' : 'ok',
      message: !mixes
        ? `${toAdd} must not be added to ${inSystem}: DOT 5 is silicone-based and does not mix with the glycol grades (DOT 3, DOT 4, ISO 4925 class 6, DOT 5.1). ` +
          'Flush the whole system and refill with one grade. Identify fluid by the reservoir label or records, never by colour.'
        : lower
          ? `${toAdd} mixes with ${inSystem}, but the mix can only be counted on for the lower grade: ${gradeText(toAdd)}. Top up with ${inSystem} or better.`
          : belowSpec
            ? `${toAdd} mixes with ${inSystem}, but the vehicle maker specifies ${fluid.specifiedGrade}: use that grade or better.`
            : `${toAdd} can be added to ${inSystem}: ${gradeText(toAdd)}.`,
    }
  }
  if (inSystem && fluid.specifiedGrade && !fluidGradesMix(inSystem, fluid.specifiedGrade)) {
    return {
      ...item, verdict: 'fail',
      message: `The system holds ${inSystem} but the vehicle maker specifies ${fluid.specifiedGrade}: silicone (DOT 5) and glycol grades don't mix. Flush the whole system before refilling.`,
    }
  }
  return null
}

/** Water content, boiling point, age and grade compatibility of the brake fluid. */
export function checkFluid(fluid: FluidCheck): WearItem[] {
  const items: WearItem[] = []
  if (fluid.waterPercent !== undefined) items.push(waterItem(fluid, fluid.waterPercent))
  if (fluid.boilingPointC !== undefined && fluid.gradeInSystem) items.push(boilingItem(fluid.gradeInSystem, fluid.boilingPointC))
  if (fluid.ageMonths !== undefined) items.push(ageItem(fluid.ageMonths))
  const compatibility = compatibilityItem(fluid)
  if (compatibility) items.push(compatibility)
  return items
}
