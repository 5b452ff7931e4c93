/**
 * Bore-change check: the hydraulic chain for the original brake system and for the replacement (master cylinder
 * and/or calipers / wheel cylinders), side by side, with the vehicle's grip and balance, the order of locking in
 * every load state, the FMVSS No. 135 stop and plain-language findings ordered by severity.
 *
 * This is the computation behind POST /api/calculations/hydraulics ({@link computeHydraulics}).
 */
import type { HydraulicsInput, HydraulicsInputRaw } from './schemas'
import { parseHydraulicsInput, validInput } from './schemas'
import type { BrakeSystem, ChainResult } from './hydraulics'
import { CHAIN_ASSUMPTIONS, computeChain } from './hydraulics'
import type { CircuitFailureResult } from './circuit'
import { circuitFailure } from './circuit'
import { compareChains, type Comparison } from './comparison'
import { originalSystem, resolveReplacement, type ResolvedReplacement } from './bore-check-systems'
import { comparisonFindings, sortFindings, systemFindings, type BoreCheckFinding } from './bore-check-findings'
import { gripFindings, lockingOrderChange, lockingOrderFindings, stoppingFindings } from './bore-check-balance'
import { lockingOrder, type LoadStateOrder } from './locking-order'
import { serviceStops, type ServiceStop } from './service-stop'
import type { Adhesion } from './vehicle-dynamics'
import { hydraulicsAssumptions } from './bore-check-assumptions'

/** Units of every figure in a hydraulics result. */
export const HYDRAULICS_UNITS = {
  pedalForceN: 'N',
  inputRodForceN: 'N',
  pushrodForceN: 'N',
  kneePedalForceN: 'N',
  linePressureKPa: 'kPa',
  rearLinePressureKPa: 'kPa',
  boosterRunOutKPa: 'kPa',
  pressurePerPedalForceKPaPerN: 'kPa/N',
  padForceN: 'N',
  shoeForceN: 'N',
  applyForceN: 'N',
  pistonAreaMm2: 'mm²',
  masterCylinderAreaMm2: 'mm²',
  effectiveRadiusMm: 'mm',
  padHeightMm: 'mm',
  edgeMarginMm: 'mm',
  torquePerWheelNm: 'N·m',
  torquePerAxleNm: 'N·m',
  tyreRollingRadiusMm: 'mm',
  tyreForceN: 'N',
  axleTyreForceN: 'N',
  totalBrakingForceN: 'N',
  dynamicAxleLoadsN: 'N',
  frontSharePercent: '%',
  rearSharePercent: '%',
  idealFrontSharePercent: '%',
  hydraulicRatio: '1',
  adhesion: '1 (friction needed)',
  tyreRoadFriction: '1',
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
  /** The original's deceleration at the pedal force (capped by tyre grip), m/s²; the replacement's is in `replacement`. */
  decelerationMps2: number | null
  /** The original's adhesion utilisation at that deceleration and the axle that locks first. */
  adhesion: Adhesion | null
  comparison: Comparison | null
  circuitFailure: { original: CircuitFailureResult[]; replacement: CircuitFailureResult[] | null }
  /** The order of locking in each load state against UN ECE R13-H Annex 5; null without vehicle data. */
  lockingOrder: { original: LoadStateOrder[] | null; replacement: LoadStateOrder[] | null }
  /** The FMVSS No. 135 S7.5 service stop at 500 N in each load state. */
  serviceStop: { original: ServiceStop[]; replacement: ServiceStop[] | null }
  findings: BoreCheckFinding[]
  inputs: HydraulicsInput & { resolvedReplacement: BrakeSystem | null }
  units: typeof HYDRAULICS_UNITS
  assumptions: string[]
  cautions: string[]
}

/** One side of the check: a system and everything worked out for it. */
export interface CheckedSystem {
  system: BrakeSystem
  chain: ChainResult
  failures: CircuitFailureResult[]
  order: LoadStateOrder[] | null
  stops: ServiceStop[]
}

function check(system: BrakeSystem): CheckedSystem {
  const chain = computeChain(system)
  const gain = chain.totalBrakingForceN === null ? null : {
    front: chain.axles.front.axleTyreForceN! / chain.linePressureKPa,
    rear: chain.axles.rear.axleTyreForceN! / chain.rearLinePressureKPa,
  }
  return {
    system,
    chain,
    failures: circuitFailure(chain, system.split, system.pedalForceN, system.vehicle),
    order: system.vehicle && gain ? lockingOrder(system.vehicle, gain) : null,
    stops: serviceStops(system),
  }
}

/** The replacement side of a check, when the input names one. */
interface ReplacementSide extends CheckedSystem { resolved: ResolvedReplacement; comparison: Comparison }

/** Findings of both systems, the replacement's compared with the original's; a note the original carries is given once. */
function findingsOf(input: HydraulicsInput, o: CheckedSystem, rep: ReplacementSide | null): BoreCheckFinding[] {
  const findings: BoreCheckFinding[] = [
    ...systemFindings(o.system, o.chain, 'original'),
    ...gripFindings(o.chain, input.pedalForceN, 'original', input.vehicle),
    ...lockingOrderFindings(o.order, input.vehicle),
    ...stoppingFindings(o.stops, o.failures, 'original'),
  ]
  if (rep) {
    const repeated = (f: BoreCheckFinding) => f.severity === 'info' && findings.some((x) => x.code === f.code && x.message === f.message)
    findings.push(
      ...comparisonFindings(o.chain, rep.chain, rep.comparison, rep.resolved, o.system),
      ...lockingOrderChange(o.order, rep.order, input.vehicle),
      ...systemFindings(rep.system, rep.chain, 'replacement', rep.resolved.changed).filter((f) => !repeated(f)),
      ...gripFindings(rep.chain, input.pedalForceN, 'replacement', input.vehicle, o.chain),
      ...stoppingFindings(rep.stops, rep.failures, 'replacement'),
    )
  }
  return sortFindings(findings)
}

/**
 * Computes the hydraulic chain for the original system and (when given) the replacement, compares them, checks
 * grip, balance, the order of locking, the service stop and circuit failure, and returns findings by severity.
 * @throws BrakeInputError (with field issues) when the input fails the hydraulics schema: nothing is computed from
 *   half an input.
 */
export function computeHydraulics(raw: HydraulicsInputRaw): HydraulicsResult {
  const input = validInput(parseHydraulicsInput, raw)
  const original = check(originalSystem(input))
  const resolved = resolveReplacement(input)
  let rep: ReplacementSide | null = null
  if (resolved) {
    const side = check(resolved.system)
    rep = { ...side, resolved, comparison: compareChains(original.chain, side.chain) }
  }
  return {
    original: original.chain,
    replacement: rep?.chain ?? null,
    decelerationMps2: original.chain.decelerationMps2,
    adhesion: original.chain.adhesion,
    comparison: rep?.comparison ?? null,
    circuitFailure: { original: original.failures, replacement: rep?.failures ?? null },
    lockingOrder: { original: original.order, replacement: rep?.order ?? null },
    serviceStop: { original: original.stops, replacement: rep?.stops ?? null },
    findings: findingsOf(input, original, rep),
    inputs: { ...input, resolvedReplacement: resolved?.system ?? null },
    units: HYDRAULICS_UNITS,
    assumptions: [...CHAIN_ASSUMPTIONS, ...hydraulicsAssumptions(input, original, rep)],
    cautions: [...HYDRAULICS_CAUTIONS],
  }
}
