/**
 * Bore-change check: the hydraulic chain for the original brake system and for the replacement (master cylinder
 * and/or calipers / wheel cylinders), side by side, with plain-language findings ordered by severity.
 *
 * This is the computation behind POST /api/calculations/hydraulics ({@link computeHydraulics}).
 */
import type { HydraulicsInput, HydraulicsInputRaw } from './schemas'
import { parseHydraulicsInput, validInput } from './schemas'
import type { BrakeSystem, ChainResult } from './hydraulics'
import { CHAIN_ASSUMPTIONS, DEFAULT_PISTON_TRAVEL_MM, computeChain } from './hydraulics'
import type { CircuitFailureResult } from './circuit'
import { circuitFailure } from './circuit'
import { TYRE_RADIUS_ASSUMPTION } from './units'
import { compareChains, type Comparison } from './comparison'
import { originalSystem, resolveReplacement, type ResolvedReplacement } from './bore-check-systems'
import { comparisonFindings, sortFindings, stoppingFindings, systemFindings, type BoreCheckFinding } from './bore-check-findings'

/** Units of every figure in a hydraulics result. */
export const HYDRAULICS_UNITS = {
  pedalForceN: 'N',
  pushrodForceN: 'N',
  linePressureKPa: 'kPa',
  pressurePerPedalForceKPaPerN: 'kPa/N',
  padForceN: 'N',
  shoeForceN: 'N',
  applyForceN: 'N',
  pistonAreaMm2: 'mm²',
  masterCylinderAreaMm2: 'mm²',
  effectiveRadiusMm: 'mm',
  torquePerWheelNm: 'N·m',
  torquePerAxleNm: 'N·m',
  tyreRollingRadiusMm: 'mm',
  tyreForceN: 'N',
  axleTyreForceN: 'N',
  totalBrakingForceN: 'N',
  frontSharePercent: '%',
  rearSharePercent: '%',
  hydraulicRatio: '1',
  pistonTravelMm: 'mm',
  fluidVolumeMm3: 'mm³',
  masterCylinderStrokeMm: 'mm',
  pedalTravelMm: 'mm',
  decelerationMps2: 'm/s²',
  decelerationG: 'g',
  stoppingDistanceFrom100KmhM: 'm',
  massKg: 'kg',
  comparison: '% (front share: percentage points)',
} as const

/** Always shown with the results. */
export const HYDRAULICS_CAUTIONS: readonly string[] = [
  'These are theoretical figures to compare parts, not a substitute for the vehicle maker\'s data, local regulations or a road and brake-tester check.',
  'Any change of master cylinder, caliper or wheel cylinder size must be checked against the vehicle maker\'s specification before the vehicle is driven.',
  'Bleed the whole system after any hydraulic part change and check the pedal height and firmness before a road test.',
]

/** The answer of POST /api/calculations/hydraulics. */
export interface HydraulicsResult {
  original: ChainResult
  replacement: ChainResult | null
  comparison: Comparison | null
  circuitFailure: { original: CircuitFailureResult[]; replacement: CircuitFailureResult[] | null }
  findings: BoreCheckFinding[]
  inputs: HydraulicsInput & { resolvedReplacement: BrakeSystem | null }
  units: typeof HYDRAULICS_UNITS
  assumptions: string[]
  cautions: string[]
}

function usesTyreSize(system: BrakeSystem): boolean {
  return [system.axles.front, system.axles.rear].some((a) => a.tyreRollingRadiusMm === undefined && a.tyreSize !== undefined)
}

/** The replacement side of a check, when the input names one. */
interface ReplacementSide { resolved: ResolvedReplacement; chain: ChainResult; comparison: Comparison; failures: CircuitFailureResult[] }

/** Findings of both systems, the replacement's compared with the original's; a note the original carries is given once. */
function findingsOf(input: HydraulicsInput, system: BrakeSystem, original: ChainResult, failures: CircuitFailureResult[], rep: ReplacementSide | null): BoreCheckFinding[] {
  const findings: BoreCheckFinding[] = [
    ...systemFindings(system, original, 'original'),
    ...stoppingFindings(original, failures, input.pedalForceN, 'original'),
  ]
  if (rep) {
    findings.push(
      ...comparisonFindings(original, rep.chain, rep.comparison, rep.resolved, system),
      ...systemFindings(rep.resolved.system, rep.chain, 'replacement', rep.resolved.changed).filter(
        (f) => !(f.severity === 'info' && findings.some((o) => o.code === f.code && o.message === f.message)),
      ),
      ...stoppingFindings(rep.chain, rep.failures, input.pedalForceN, 'replacement'),
    )
  }
  return sortFindings(findings)
}

/** What the figures rest on: the chain's own assumptions plus those this input called for. */
function assumptionsOf(system: BrakeSystem, original: ChainResult, rep: ReplacementSide | null): string[] {
  const chains = rep ? [original, rep.chain] : [original]
  const anyAxle = (test: (a: ChainResult['axles']['front']) => boolean) => chains.some((c) => test(c.axles.front) || test(c.axles.rear))
  const assumptions = [...CHAIN_ASSUMPTIONS]
  if (usesTyreSize(system) || (rep && usesTyreSize(rep.resolved.system))) assumptions.push(TYRE_RADIUS_ASSUMPTION)
  if (chains.some((c) => c.shareBasis === 'torque')) {
    assumptions.push('Front/rear share from brake torque where a rolling radius is missing (equal tyre radii front and rear).')
  }
  if (anyAxle((a) => a.effectiveRadiusSource === 'workshop-rule')) {
    assumptions.push('Effective radius from the published workshop rule r_eff = (2 D − d) / 4 (disc diameter D, largest piston diameter d) where none was given.')
  }
  if (anyAxle((a) => a.pistonTravelSource === 'default')) {
    assumptions.push(
      `Piston travel not given: ${DEFAULT_PISTON_TRAVEL_MM.disc} mm per disc piston, ${DEFAULT_PISTON_TRAVEL_MM.drum} mm per drum wheel-cylinder piston (common practice estimate).`,
    )
  }
  if (rep && rep.resolved.inherited.length > 0) {
    assumptions.push(`Replacement values not given were taken from the original: ${rep.resolved.inherited.join(', ')}.`)
  }
  assumptions.push(
    'Circuit failure: the intact circuit reaches the same line pressure as before; FMVSS No. 135 distances are compared with a constant-deceleration stop (no build-up time, tyre grip not modelled).',
  )
  return assumptions
}

/**
 * Computes the hydraulic chain for the original system and (when given) the replacement, compares them, checks
 * circuit failure and returns findings ordered by severity.
 * @throws BrakeInputError (with field issues) when the input fails the hydraulics schema: nothing is computed from
 *   half an input.
 */
export function computeHydraulics(raw: HydraulicsInputRaw): HydraulicsResult {
  const input = validInput(parseHydraulicsInput, raw)
  const system = originalSystem(input)
  const original = computeChain(system)
  const failures = circuitFailure(original, input.split, input.pedalForceN, input.massKg)
  const resolved = resolveReplacement(input)
  let rep: ReplacementSide | null = null
  if (resolved) {
    const chain = computeChain(resolved.system)
    rep = { resolved, chain, comparison: compareChains(original, chain), failures: circuitFailure(chain, input.split, input.pedalForceN, input.massKg) }
  }
  return {
    original,
    replacement: rep?.chain ?? null,
    comparison: rep?.comparison ?? null,
    circuitFailure: { original: failures, replacement: rep?.failures ?? null },
    findings: findingsOf(input, system, original, failures, rep),
    inputs: { ...input, resolvedReplacement: resolved?.system ?? null },
    units: HYDRAULICS_UNITS,
    assumptions: assumptionsOf(system, original, rep),
    cautions: [...HYDRAULICS_CAUTIONS],
  }
}
