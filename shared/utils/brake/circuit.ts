/**
 * Circuit-failure check for dual-circuit hydraulic brakes.
 *
 * Front/rear split: a failed circuit leaves one axle only. Diagonal split: each circuit holds one front wheel and
 * the opposite rear wheel, so about half the braking stays, with a side-to-side pull per circuit.
 * The intact circuit is assumed to reach the same line pressure as before (theoretical; in practice the pedal
 * first travels further while the tandem master cylinder piston takes up the failed side). The wheels still braking
 * can only use the friction of the load on them (failedCircuitGripRate).
 */
import type { CircuitSplit, VehicleData } from './schemas'
import type { WheelPosition } from './wear-schemas'
import type { ChainResult } from './hydraulics'
import { STANDARD_GRAVITY_MPS2 } from './units'
import { FMVSS_135, fmvssStoppingDistanceM, type StoppingReference } from './stopping'

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
  /** Deceleration at the given pedal force (capped by the grip of the wheels still braking), m/s²; null without mass or rolling radii. */
  decelerationMps2: number | null
  decelerationG: number | null
  /** Theoretical stop from 100 km/h at that deceleration, with FMVSS No. 135's 0.10 V build-up term, m. */
  stoppingDistanceFrom100KmhM: number | null
  reference: StoppingReference
  /** True/false when comparable (mass known and pedal force within the reference's limit); otherwise null. */
  meetsReference: boolean | null
  notes: string[]
}

/**
 * The most a failed system can decelerate before its braked wheels slide: the friction μ times the load on the
 * wheels still braking, as a share of the weight. One axle braking: z = μ ψ / (1 − μ χ) front, μ (1 − ψ) / (1 + μ χ)
 * rear, with ψ the static front share and χ = h / E (the load transfer of vehicle-load.ts solved for z); one
 * front and the opposite rear wheel: half the weight, z = μ / 2. Without vehicle data an axle is capped at μ.
 */
export function failedCircuitGripRate(failed: CircuitId, mu: number, vehicle?: VehicleData): number {
  if (failed !== 'front' && failed !== 'rear') return mu / 2
  if (!vehicle) return mu
  const psi = vehicle.frontStaticSharePercent / 100
  const chi = vehicle.cogHeightMm / vehicle.wheelbaseMm
  return failed === 'rear' ? (mu * psi) / (1 - mu * chi) : (mu * (1 - psi)) / (1 + mu * chi)
}

/**
 * Share of braking and deceleration left for each failed circuit, at the chain's pedal force.
 * @param chain result of computeChain for the system (its mass and tyre-road friction are used)
 * @param split the vehicle's circuit split
 * @param pedalForceN pedal force the chain was computed at (N), for the FMVSS comparison
 * @param vehicle vehicle data, for the grip of the wheels still braking
 */
export function circuitFailure(
  chain: ChainResult,
  split: CircuitSplit,
  pedalForceN: number,
  vehicle?: VehicleData,
): CircuitFailureResult[] {
  const front = chain.frontSharePercent
  const rear = chain.rearSharePercent
  const total = chain.totalBrakingForceN
  const massKg = chain.massKg
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
    const brakes = remainingForce !== null && massKg ? remainingForce / massKg : null
    const grip = failedCircuitGripRate(failedCircuit, chain.tyreRoadFriction, vehicle) * STANDARD_GRAVITY_MPS2
    const decel = brakes === null ? null : Math.min(brakes, grip)
    const distance = decel !== null && decel > 0 ? fmvssStoppingDistanceM(ref.speedKmh, decel) : null
    const extra = [...notes]
    if (!withinPedalLimit) {
      extra.push(`The FMVSS No. 135 comparison needs a pedal force of ${ref.maxPedalForceN} N or less.`)
    }
    if (brakes !== null && brakes > grip) {
      extra.push('The brakes still working could lock their wheels: tyre grip, not the brakes, sets this deceleration.')
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
