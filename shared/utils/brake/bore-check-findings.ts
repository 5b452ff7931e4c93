/**
 * The findings of a bore check in plain words, ordered by severity: about one system on its own (stroke, circuit
 * split, share, booster knee, pad data) and about the replacement against the original (balance, pedal feel,
 * torque, travel, ports). Grip, the order of locking and stopping are in bore-check-balance.ts.
 */
import type { Comparison } from './comparison'
import type { BrakeSystem, ChainResult } from './hydraulics'
import { DEFAULT_PISTON_TRAVEL_MM } from './hydraulics'
import type { ResolvedReplacement } from './bore-check-systems'

export type Severity = 'info' | 'warning' | 'danger'

/** One finding of the check. `code` is stable for the UI and tests; `message` is for the technician. */
export interface BoreCheckFinding {
  severity: Severity
  code: string
  message: string
}

/**
 * Thresholds of the findings: a front share moving more than 3 points and pedal gain changing more than 15 %
 * (common practice); the torque and travel thresholds use the same 15 % for consistency (common practice).
 */
export const BORE_CHECK_THRESHOLDS = {
  frontShareShiftPoints: 3,
  pressurePerPedalForcePercent: 15,
  axleTorquePercent: 15,
  pedalTravelPercent: 15,
} as const

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
  // Under half the braking on the front axle is unusual for a road vehicle (common practice). With vehicle data
  // the order of locking says it better (bore-check-balance.ts).
  if (chain.frontSharePercent < 50 && chain.adhesion === null) {
    findings.push({
      severity: 'warning',
      code: 'front-share-low',
      message:
        `${subject} puts only ${fmt(chain.frontSharePercent)} % of the braking on the front axle: ` +
        'the rear wheels could lock first. Check the figures and the vehicle maker\'s data.',
    })
  }

  if (scope.masterCylinder && chain.boosterRunOutKPa === null && system.boosterRatio > 1) {
    findings.push({
      severity: 'info',
      code: 'booster-run-out-unknown',
      message: 'The booster\'s run-out pressure is not known, so it is taken as a fixed ratio at any pedal force: pressures past its knee are overstated.',
    })
  }
  if (scope.masterCylinder && chain.pastKnee && chain.kneePedalForceN !== null) {
    findings.push({
      severity: 'info',
      code: 'booster-past-knee',
      message: `${subject} is past the booster's knee (${fmt(chain.kneePedalForceN, 0)} N pedal force): extra pedal force adds pressure through the pedal ratio alone, so the pedal feels much harder from there.`,
    })
  }
  for (const name of ['front', 'rear'] as const) {
    const sweep = chain.axles[name].padSweep
    if (scope[name] && chain.axles[name].effectiveRadiusSource === 'pad-uniform-wear' && sweep?.padHeightSource === 'estimated') {
      findings.push({
        severity: 'info',
        code: 'pad-height-estimated',
        message: `No pad height for the ${name} axle (${who}): a fifth of the disc diameter (${fmt(sweep.padHeightMm)} mm) is assumed, so its effective radius (${fmt(chain.axles[name].effectiveRadiusMm)} mm) and torque are estimates.`,
      })
    }
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
