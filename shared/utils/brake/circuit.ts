/**
 * Circuit-failure check for dual-circuit hydraulic brakes.
 *
 * Front/rear split: a failed circuit leaves one axle only. Diagonal split: each circuit holds one front wheel and
 * the opposite rear wheel, so about half the braking stays, with a side-to-side pull per circuit.
 * The intact circuit is assumed to reach the same line pressure as before (theoretical; in practice the pedal
 * first travels further while the tandem master cylinder piston takes up the failed side).
 */
import type { CircuitSplit, WheelPosition } from './schemas'
import type { ChainResult } from './hydraulics'
import { STANDARD_GRAVITY_MPS2 } from './units'

/** A stopping-distance figure from FMVSS No. 135 (49 CFR 571.135), used for comparison only. */
export interface StoppingReference {
  source: string
  speedKmh: number
  distanceM: number
  maxPedalForceN: number
  /**
   * v² / (2 s): the mean deceleration if the whole distance were spent braking at a constant rate. The regulation's
   * distance also covers brake build-up, so a real vehicle needs a little more than this.
   */
  meanDecelerationMps2: number
}

function reference(source: string, speedKmh: number, distanceM: number, maxPedalForceN: number): StoppingReference {
  const v = speedKmh / 3.6
  return { source, speedKmh, distanceM, maxPedalForceN, meanDecelerationMps2: (v * v) / (2 * distanceM) }
}

/** FMVSS No. 135 figures at 100 km/h. */
export const FMVSS_135 = {
  /** S7.5 cold effectiveness: stop from 100 km/h within 70 m at ≤ 500 N pedal force (49 CFR 571.135 S7.5). */
  service: reference('FMVSS No. 135 S7.5 (49 CFR 571.135): 70 m from 100 km/h, pedal force ≤ 500 N', 100, 70, 500),
  /**
   * S7.10 hydraulic circuit failure: 168 m from 100 km/h at ≤ 500 N pedal force (0.10 V + 0.0158 V²).
   * from memory: not confirmed against the regulation text at hand.
   */
  partialFailure: reference(
    'FMVSS No. 135 S7.10 (49 CFR 571.135), from memory: 168 m from 100 km/h with one circuit failed, pedal force ≤ 500 N',
    100,
    168,
    500,
  ),
} as const

export type CircuitId = 'front' | 'rear' | 'front-left-rear-right' | 'front-right-rear-left'

/** What is left when one circuit fails. */
export interface CircuitFailureResult {
  /** The circuit that has failed. */
  failedCircuit: CircuitId
  label: string
  /** Wheels still braking. */
  wheelsBraking: WheelPosition[]
  /** Share of the intact system's braking that remains, %. */
  remainingSharePercent: number
  remainingBrakingForceN: number | null
  /** Theoretical deceleration at the given pedal force, m/s²; null without mass or rolling radii. */
  decelerationMps2: number | null
  decelerationG: number | null
  /** Theoretical stop from 100 km/h at that constant deceleration (no build-up time), m. */
  stoppingDistanceFrom100KmhM: number | null
  reference: StoppingReference
  /** True/false when comparable (mass known and pedal force within the reference's limit); otherwise null. */
  meetsReference: boolean | null
  notes: string[]
}

/** Theoretical stopping distance (m) from `speedKmh` at a constant deceleration (m/s²): s = v² / (2 a). */
export function stoppingDistanceM(speedKmh: number, decelerationMps2: number): number {
  const v = speedKmh / 3.6
  return (v * v) / (2 * decelerationMps2)
}

/**
 * Share of braking and deceleration left for each failed circuit, at the chain's pedal force.
 * @param chain result of computeChain for the system
 * @param split the vehicle's circuit split
 * @param pedalForceN pedal force the chain was computed at (N), for the FMVSS comparison
 * @param massKg vehicle mass (kg), optional
 */
export function circuitFailure(
  chain: ChainResult,
  split: CircuitSplit,
  pedalForceN: number,
  massKg?: number,
): CircuitFailureResult[] {
  const front = chain.frontSharePercent
  const rear = chain.rearSharePercent
  const total = chain.totalBrakingForceN
  const ref = FMVSS_135.partialFailure
  const withinPedalLimit = pedalForceN <= ref.maxPedalForceN

  const make = (
    failedCircuit: CircuitId,
    label: string,
    wheelsBraking: WheelPosition[],
    remainingSharePercent: number,
    notes: string[],
  ): CircuitFailureResult => {
    const remainingForce = total === null ? null : (total * remainingSharePercent) / 100
    const decel = remainingForce !== null && massKg ? remainingForce / massKg : null
    const distance = decel !== null && decel > 0 ? stoppingDistanceM(ref.speedKmh, decel) : null
    const extra = [...notes]
    if (!withinPedalLimit) {
      extra.push(`The FMVSS No. 135 comparison needs a pedal force of ${ref.maxPedalForceN} N or less.`)
    }
    if (decel !== null && decel > STANDARD_GRAVITY_MPS2) {
      extra.push('The theoretical deceleration exceeds 1 g: tyre grip, not the brakes, would set the limit.')
    }
    return {
      failedCircuit,
      label,
      wheelsBraking,
      remainingSharePercent,
      remainingBrakingForceN: remainingForce,
      decelerationMps2: decel,
      decelerationG: decel === null ? null : decel / STANDARD_GRAVITY_MPS2,
      stoppingDistanceFrom100KmhM: distance,
      reference: ref,
      meetsReference:
        decel === null || !withinPedalLimit ? null : distance !== null && distance <= ref.distanceM,
      notes: extra,
    }
  }

  if (split === 'front-rear') {
    return [
      make('front', 'Front circuit failed: rear brakes only', ['rear-left', 'rear-right'], rear, [
        'Rear brakes alone: the rear wheels lock early because load moves forward under braking; tyre grip is not modelled here.',
      ]),
      make('rear', 'Rear circuit failed: front brakes only', ['front-left', 'front-right'], front, []),
    ]
  }
  // Diagonal: each circuit has half of each axle, so exactly half remains whatever the front/rear share.
  const pull = 'One front and the opposite rear wheel brake: expect a pull to the braking front wheel side (the steering geometry is meant to limit it).'
  return [
    make('front-left-rear-right', 'Front-left / rear-right circuit failed', ['front-right', 'rear-left'], (front + rear) / 2, [pull]),
    make('front-right-rear-left', 'Front-right / rear-left circuit failed', ['front-left', 'rear-right'], (front + rear) / 2, [pull]),
  ]
}
