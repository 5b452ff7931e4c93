/**
 * Bore-change check: the hydraulic chain for the original brake system and for the replacement (master cylinder
 * and/or calipers / wheel cylinders), side by side, with plain-language findings ordered by severity.
 *
 * This is the computation behind POST /api/calculations/hydraulics ({@link computeHydraulics}).
 */
import type { Axle, HydraulicsInput, HydraulicsInputRaw, MasterCylinder } from './schemas'
import { BrakeInputError, fieldIssues, hydraulicsInputSchema } from './schemas'
import type { BrakeSystem, ChainResult } from './hydraulics'
import { CHAIN_ASSUMPTIONS, DEFAULT_PISTON_TRAVEL_MM, computeChain } from './hydraulics'
import type { CircuitFailureResult } from './circuit'
import { FMVSS_135, circuitFailure, stoppingDistanceM } from './circuit'
import { TYRE_RADIUS_ASSUMPTION } from './units'
import type { AxleName } from '../../types/axles'

export type Severity = 'info' | 'warning' | 'danger'

/** One finding of the check. `code` is stable for the UI and tests; `message` is for the technician. */
export interface BoreCheckFinding {
  severity: Severity
  code: string
  message: string
}

/**
 * Thresholds of the findings. Front share 3 points and pedal gain 15 % are the figures issue 5 asks for
 * (common practice); the torque and travel thresholds use the same 15 % for consistency (common practice).
 */
export const BORE_CHECK_THRESHOLDS = {
  frontShareShiftPoints: 3,
  pressurePerPedalForcePercent: 15,
  axleTorquePercent: 15,
  pedalTravelPercent: 15,
} as const

/** Percent change from `before` to `after`; null when `before` is zero (no meaningful ratio). */
export function percentChange(before: number, after: number): number | null {
  return before === 0 ? null : ((after - before) / before) * 100
}

/** Per-axle pair of values. */
export interface PerAxle<T> {
  front: T
  rear: T
}

/** Replacement compared with the original, in percent (front share in percentage points). */
export interface Comparison {
  linePressurePercent: number | null
  pressurePerPedalForcePercent: number | null
  /** Pad force (disc) or shoe force (drum) per axle. */
  clampForcePercent: PerAxle<number | null>
  torquePerAxlePercent: PerAxle<number | null>
  tyreForcePercent: PerAxle<number | null>
  /** Replacement front share − original front share, percentage points (negative = toward the rear). */
  frontShareChangePoints: number
  fluidVolumePercent: number | null
  masterCylinderStrokePercent: number | null
  pedalTravelPercent: number | null
}

/** Compares two chain results (same pedal force). */
export function compareChains(original: ChainResult, replacement: ChainResult): Comparison {
  const axle = (f: (c: ChainResult, a: AxleName) => number | null): PerAxle<number | null> => {
    const pick = (a: AxleName) => {
      const before = f(original, a)
      const after = f(replacement, a)
      return before === null || after === null ? null : percentChange(before, after)
    }
    return { front: pick('front'), rear: pick('rear') }
  }
  return {
    linePressurePercent: percentChange(original.linePressureKPa, replacement.linePressureKPa),
    pressurePerPedalForcePercent: percentChange(
      original.pressurePerPedalForceKPaPerN,
      replacement.pressurePerPedalForceKPaPerN,
    ),
    clampForcePercent: axle((c, a) => c.axles[a].applyForceN),
    torquePerAxlePercent: axle((c, a) => c.axles[a].torquePerAxleNm),
    tyreForcePercent: axle((c, a) => c.axles[a].tyreForceN),
    frontShareChangePoints: replacement.frontSharePercent - original.frontSharePercent,
    fluidVolumePercent: percentChange(original.fluidVolumeMm3, replacement.fluidVolumeMm3),
    masterCylinderStrokePercent: percentChange(original.masterCylinderStrokeMm, replacement.masterCylinderStrokeMm),
    pedalTravelPercent: percentChange(original.pedalTravelMm, replacement.pedalTravelMm),
  }
}

const SEVERITY_ORDER: Record<Severity, number> = { danger: 0, warning: 1, info: 2 }

/** Orders findings danger -> warning -> info, keeping the order of equal severities. */
export function sortFindings(findings: readonly BoreCheckFinding[]): BoreCheckFinding[] {
  return findings
    .map((f, i) => ({ f, i }))
    .sort((a, b) => SEVERITY_ORDER[a.f.severity] - SEVERITY_ORDER[b.f.severity] || a.i - b.i)
    .map(({ f }) => f)
}

const fmt = (n: number, digits = 1) => n.toFixed(digits)
const signed = (n: number, digits = 1) => `${n > 0 ? '+' : ''}${n.toFixed(digits)}`

/** What the replacement system is, with the fields it took from the original. */
export interface ResolvedReplacement {
  system: BrakeSystem
  changed: { masterCylinder: boolean; front: boolean; rear: boolean }
  /** Fields not given for the replacement and taken from the original, e.g. `masterCylinder.strokeMm`. */
  inherited: string[]
}

/**
 * Builds the replacement system: replaced parts from `input.replacement`, everything else from the original.
 * Fields a replacement part leaves out that belong to the vehicle (tyres) or are likely unchanged (stroke,
 * ports, piston travel) are taken from the original and listed in `inherited`.
 */
export function resolveReplacement(input: HydraulicsInput): ResolvedReplacement | null {
  const rep = input.replacement
  if (!rep) return null
  const inherited: string[] = []

  let masterCylinder: MasterCylinder = input.masterCylinder
  if (rep.masterCylinder) {
    const given = rep.masterCylinder
    const base = input.masterCylinder
    masterCylinder = {
      boreMm: given.boreMm,
      strokeMm: given.strokeMm ?? base.strokeMm,
      tandem: given.tandem ?? base.tandem,
      ports: given.ports ?? base.ports,
      portLayout: given.portLayout ?? base.portLayout,
    }
    for (const key of ['strokeMm', 'tandem', 'ports', 'portLayout'] as const) {
      if (given[key] === undefined && base[key] !== undefined) inherited.push(`masterCylinder.${key}`)
    }
  }

  const axle = (name: AxleName): Axle => {
    const original = input.axles[name]
    const replaced = rep.axles?.[name]
    if (!replaced) return original
    const merged: Axle = { ...replaced }
    if (merged.tyreRollingRadiusMm === undefined && merged.tyreSize === undefined) {
      if (original.tyreRollingRadiusMm !== undefined) {
        merged.tyreRollingRadiusMm = original.tyreRollingRadiusMm
        inherited.push(`axles.${name}.tyreRollingRadiusMm`)
      } else if (original.tyreSize !== undefined) {
        merged.tyreSize = original.tyreSize
        inherited.push(`axles.${name}.tyreSize`)
      }
    }
    if (merged.pistonTravelMm === undefined && original.pistonTravelMm !== undefined && merged.kind === original.kind) {
      merged.pistonTravelMm = original.pistonTravelMm
      inherited.push(`axles.${name}.pistonTravelMm`)
    }
    return merged
  }

  return {
    system: {
      pedalForceN: input.pedalForceN,
      pedalRatio: input.pedalRatio,
      boosterRatio: input.boosterRatio,
      massKg: input.massKg,
      split: input.split,
      masterCylinder,
      axles: { front: axle('front'), rear: axle('rear') },
    },
    changed: {
      masterCylinder: rep.masterCylinder !== undefined,
      front: rep.axles?.front !== undefined,
      rear: rep.axles?.rear !== undefined,
    },
    inherited,
  }
}

/** Which parts of a system a check looks at: all for the original, only the replaced parts for the replacement. */
export interface CheckScope {
  masterCylinder: boolean
  front: boolean
  rear: boolean
}

/**
 * Findings about one system on its own (master cylinder stroke, circuit split, share). `who` names it in messages;
 * `scope` limits part-specific notes to the parts that changed, so the replacement does not repeat the original's.
 */
export function systemFindings(
  system: BrakeSystem,
  chain: ChainResult,
  who: 'original' | 'replacement',
  scope: CheckScope = { masterCylinder: true, front: true, rear: true },
): BoreCheckFinding[] {
  const findings: BoreCheckFinding[] = []
  const mc = system.masterCylinder
  const subject = who === 'original' ? 'The original system' : 'With the replacement, the system'
  const mcName = who === 'original' ? 'The master cylinder' : 'The replacement master cylinder'

  if (mc.strokeMm !== undefined) {
    if (chain.masterCylinderStrokeMm > mc.strokeMm) {
      findings.push({
        severity: 'danger',
        code: 'mc-stroke-exceeded',
        message:
          `${subject} needs ${fmt(chain.masterCylinderStrokeMm)} mm of master cylinder stroke but only ` +
          `${fmt(mc.strokeMm)} mm is available: the pedal may reach the floor before the brakes are fully applied.`,
      })
    }
  } else if (scope.masterCylinder) {
    findings.push({
      severity: 'info',
      code: 'mc-stroke-unknown',
      message: `${mcName} stroke is not known, so the stroke needed (${fmt(chain.masterCylinderStrokeMm)} mm) can't be checked against it.`,
    })
  }

  if (scope.masterCylinder && mc.tandem === false) {
    findings.push({
      severity: 'danger',
      code: 'mc-not-tandem',
      message: `${mcName} is single-circuit but the vehicle has a ${system.split} dual-circuit split: one leak would take all the brakes.`,
    })
  }
  if (scope.masterCylinder && mc.portLayout !== undefined && mc.portLayout !== system.split) {
    findings.push({
      severity: 'danger',
      code: 'mc-port-mismatch',
      message:
        `${mcName} has its ports arranged for a ${mc.portLayout} split but the vehicle is plumbed ${system.split}: ` +
        'the circuits would not be separated as designed. Use a master cylinder made for this split.',
    })
  }
  // Under half the braking on the front axle is unusual for a road vehicle (common practice).
  if (chain.frontSharePercent < 50) {
    findings.push({
      severity: 'warning',
      code: 'front-share-low',
      message:
        `${subject} puts only ${fmt(chain.frontSharePercent)} % of the braking on the front axle: ` +
        'the rear wheels could lock first. Check the figures and the vehicle maker\'s data.',
    })
  }

  if (chain.shareBasis === 'torque') {
    findings.push({
      severity: 'info',
      code: 'share-from-torque',
      message: 'No rolling radius for one or both axles: the front/rear share is from brake torque, taking equal tyre sizes front and rear.',
    })
  }
  for (const name of ['front', 'rear'] as const) {
    if (scope[name] && chain.axles[name].pistonTravelSource === 'default') {
      const d = DEFAULT_PISTON_TRAVEL_MM[chain.axles[name].kind]
      findings.push({
        severity: 'info',
        code: 'piston-travel-default',
        message: `No piston travel given for the ${name} axle (${who}): ${d} mm is assumed, so fluid volume, stroke and pedal travel are estimates.`,
      })
    }
  }
  return findings
}

/** Findings comparing the replacement with the original. */
export function comparisonFindings(
  original: ChainResult,
  replacement: ChainResult,
  comparison: Comparison,
  resolved: ResolvedReplacement,
  originalSystem: BrakeSystem,
): BoreCheckFinding[] {
  const t = BORE_CHECK_THRESHOLDS
  const findings: BoreCheckFinding[] = []
  const { changed } = resolved

  if (!changed.masterCylinder && !changed.front && !changed.rear) {
    findings.push({ severity: 'info', code: 'no-replacement-parts', message: 'The replacement names no parts: nothing to compare.' })
    return findings
  }

  const shift = comparison.frontShareChangePoints
  if (shift < -t.frontShareShiftPoints) {
    findings.push({
      severity: 'danger',
      code: 'front-share-rearward',
      message:
        `The front share of braking moves ${fmt(-shift)} points toward the rear ` +
        `(${fmt(original.frontSharePercent)} % -> ${fmt(replacement.frontSharePercent)} %): the rear wheels may lock first, which can spin the vehicle.`,
    })
  } else if (shift > t.frontShareShiftPoints) {
    findings.push({
      severity: 'warning',
      code: 'front-share-forward',
      message:
        `The front share of braking moves ${fmt(shift)} points toward the front ` +
        `(${fmt(original.frontSharePercent)} % -> ${fmt(replacement.frontSharePercent)} %): the rear brakes do less, stops may get longer and front pads wear faster.`,
    })
  }

  const gain = comparison.pressurePerPedalForcePercent
  if (gain !== null && Math.abs(gain) > t.pressurePerPedalForcePercent) {
    findings.push({
      severity: 'warning',
      code: 'pedal-gain-change',
      message:
        gain < 0
          ? `Line pressure per unit of pedal force falls ${fmt(-gain)} %: the pedal will feel harder and the driver must push harder for the same stop.`
          : `Line pressure per unit of pedal force rises ${fmt(gain)} %: the pedal will feel sharper, and it travels further for the same fluid.`,
    })
  }

  for (const name of ['front', 'rear'] as const) {
    const change = comparison.torquePerAxlePercent[name]
    if (changed[name] && change !== null && Math.abs(change) > t.axleTorquePercent) {
      findings.push({
        severity: 'warning',
        code: `${name}-torque-change`,
        message: `Brake torque on the ${name} axle changes ${signed(change)} % with the replacement parts: braking balance and stopping distance change with it.`,
      })
    }
    const before = originalSystem.axles[name]
    const after = resolved.system.axles[name]
    if (before.kind !== after.kind) {
      findings.push({
        severity: 'info',
        code: `${name}-brake-kind-change`,
        message: `The ${name} axle changes from ${before.kind} to ${after.kind} brakes: parking brake, hoses and valves must suit the new layout.`,
      })
    }
  }

  const travel = comparison.pedalTravelPercent
  if (travel !== null && travel > t.pedalTravelPercent) {
    findings.push({
      severity: 'warning',
      code: 'pedal-travel-longer',
      message: `Pedal travel grows ${fmt(travel)} % (${fmt(original.pedalTravelMm)} -> ${fmt(replacement.pedalTravelMm)} mm): the pedal will sit lower when braking.`,
    })
  } else if (travel !== null && travel < -t.pedalTravelPercent) {
    findings.push({
      severity: 'info',
      code: 'pedal-travel-shorter',
      message: `Pedal travel shrinks ${fmt(-travel)} % (${fmt(original.pedalTravelMm)} -> ${fmt(replacement.pedalTravelMm)} mm).`,
    })
  }

  const before = originalSystem.masterCylinder
  const after = resolved.system.masterCylinder
  if (changed.masterCylinder && before.ports !== undefined && after.ports !== undefined && before.ports !== after.ports) {
    findings.push({
      severity: 'warning',
      code: 'mc-port-count-differs',
      message:
        `The replacement master cylinder has ${after.ports} ports, the original ${before.ports}: the brake lines won't connect as before. ` +
        'Never join the two circuits together to make them fit.',
    })
  }
  return findings
}

/** Findings from the circuit-failure check and the FMVSS No. 135 service-stop comparison. */
function stoppingFindings(
  chain: ChainResult,
  failures: CircuitFailureResult[],
  pedalForceN: number,
  who: 'original' | 'replacement',
): BoreCheckFinding[] {
  const findings: BoreCheckFinding[] = []
  const service = FMVSS_135.service
  if (chain.decelerationMps2 !== null && pedalForceN <= service.maxPedalForceN) {
    const distance = stoppingDistanceM(service.speedKmh, chain.decelerationMps2)
    if (distance > service.distanceM) {
      findings.push({
        severity: 'danger',
        code: 'service-stop-short',
        message:
          `At ${fmt(pedalForceN, 0)} N pedal force the ${who} system gives ${fmt(chain.decelerationMps2, 2)} m/s², ` +
          `a theoretical stop from 100 km/h of ${fmt(distance, 0)} m: more than the ${service.distanceM} m of FMVSS No. 135 S7.5.`,
      })
    }
  }
  for (const f of failures) {
    if (f.meetsReference === false) {
      findings.push({
        severity: 'warning',
        code: 'circuit-failure-short',
        message:
          `${f.label} (${who}): ${fmt(f.remainingSharePercent)} % of the braking remains, a theoretical stop from 100 km/h of ` +
          `${fmt(f.stoppingDistanceFrom100KmhM ?? 0, 0)} m, more than the ${f.reference.distanceM} m partial-failure figure (FMVSS No. 135 S7.10, from memory).`,
      })
    }
  }
  return findings
}

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

function originalSystem(input: HydraulicsInput): BrakeSystem {
  return {
    pedalForceN: input.pedalForceN,
    pedalRatio: input.pedalRatio,
    boosterRatio: input.boosterRatio,
    massKg: input.massKg,
    split: input.split,
    masterCylinder: input.masterCylinder,
    axles: input.axles,
  }
}

function usesTyreSize(system: BrakeSystem): boolean {
  return [system.axles.front, system.axles.rear].some((a) => a.tyreRollingRadiusMm === undefined && a.tyreSize !== undefined)
}

/**
 * Computes the hydraulic chain for the original system and (when given) the replacement, compares them, checks
 * circuit failure and returns findings ordered by severity.
 * @throws BrakeInputError (with field issues) when the input fails {@link hydraulicsInputSchema}: nothing is
 *   computed from half an input.
 */
export function computeHydraulics(raw: HydraulicsInputRaw): HydraulicsResult {
  const parsed = hydraulicsInputSchema.safeParse(raw)
  if (!parsed.success) throw new BrakeInputError(fieldIssues(parsed.error))
  const input = parsed.data

  const origSystem = originalSystem(input)
  const original = computeChain(origSystem)
  const resolved = resolveReplacement(input)
  const replacement = resolved ? computeChain(resolved.system) : null
  const comparison = replacement ? compareChains(original, replacement) : null

  const failOriginal = circuitFailure(original, input.split, input.pedalForceN, input.massKg)
  const failReplacement = replacement ? circuitFailure(replacement, input.split, input.pedalForceN, input.massKg) : null

  const findings: BoreCheckFinding[] = [
    ...systemFindings(origSystem, original, 'original'),
    ...stoppingFindings(original, failOriginal, input.pedalForceN, 'original'),
  ]
  if (resolved && replacement && comparison && failReplacement) {
    findings.push(
      ...comparisonFindings(original, replacement, comparison, resolved, origSystem),
      ...systemFindings(resolved.system, replacement, 'replacement', resolved.changed).filter(
        // A note the original already carries is given once.
        (f) => !(f.severity === 'info' && findings.some((o) => o.code === f.code && o.message === f.message)),
      ),
      ...stoppingFindings(replacement, failReplacement, input.pedalForceN, 'replacement'),
    )
  }

  const assumptions = [...CHAIN_ASSUMPTIONS]
  if (usesTyreSize(origSystem) || (resolved && usesTyreSize(resolved.system))) assumptions.push(TYRE_RADIUS_ASSUMPTION)
  if ([original, replacement].some((c) => c && c.shareBasis === 'torque')) {
    assumptions.push('Front/rear share from brake torque where a rolling radius is missing (equal tyre radii front and rear).')
  }
  if ([original, replacement].some((c) => c && (c.axles.front.effectiveRadiusSource === 'workshop-rule' || c.axles.rear.effectiveRadiusSource === 'workshop-rule'))) {
    assumptions.push('Effective radius from the published workshop rule r_eff = (2 D − d) / 4 (disc diameter D, largest piston diameter d) where none was given.')
  }
  if ([original, replacement].some((c) => c && (c.axles.front.pistonTravelSource === 'default' || c.axles.rear.pistonTravelSource === 'default'))) {
    assumptions.push(
      `Piston travel not given: ${DEFAULT_PISTON_TRAVEL_MM.disc} mm per disc piston, ${DEFAULT_PISTON_TRAVEL_MM.drum} mm per drum wheel-cylinder piston (common practice estimate).`,
    )
  }
  if (resolved && resolved.inherited.length > 0) {
    assumptions.push(`Replacement values not given were taken from the original: ${resolved.inherited.join(', ')}.`)
  }
  assumptions.push(
    'Circuit failure: the intact circuit reaches the same line pressure as before; FMVSS No. 135 distances are compared with a constant-deceleration stop (no build-up time, tyre grip not modelled).',
  )

  return {
    original,
    replacement,
    comparison,
    circuitFailure: { original: failOriginal, replacement: failReplacement },
    findings: sortFindings(findings),
    inputs: { ...input, resolvedReplacement: resolved?.system ?? null },
    units: HYDRAULICS_UNITS,
    assumptions,
    cautions: [...HYDRAULICS_CAUTIONS],
  }
}
