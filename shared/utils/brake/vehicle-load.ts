/**
 * The vehicle under braking: its load states, the axle loads as load moves forward, each axle's adhesion
 * utilisation and the rear pressure-limiting valve.
 *
 * Symbols as UN ECE Regulation 13-H, Annex 5 writes them: P the vehicle's weight, P1 / P2 the static front / rear
 * axle loads, h the centre of gravity height, E the wheelbase, z the braking rate (deceleration / g). The dynamic
 * axle loads are N1 = P1 + z P h / E and N2 = P2 − z P h / E (the load transfer z × h / E of the weight), and the
 * adhesion utilisation of an axle is f = its braking force T / its dynamic load N: the tyre-road friction the axle
 * needs. The axle that needs more locks first; the ideal front share of the braking is N1 / P at that z.
 */
import { STANDARD_GRAVITY_MPS2 } from './units'
import type { RearValve, VehicleData } from './schemas'

/** One load state of the vehicle (the wheelbase is the same in every state). */
export interface LoadState {
  name: 'unladen' | 'laden'
  massKg: number
  cogHeightMm: number
  frontStaticSharePercent: number
  wheelbaseMm: number
  /** The rear valve's knee in this state (a load-sensing valve opens later laden); null without a valve. */
  valveKneeKPa: number | null
  valveSlope: number | null
}

/** The load states the vehicle data gives: unladen, and laden when it is given. */
export function loadStates(v: VehicleData): LoadState[] {
  const valve = v.rearValve
  const states: LoadState[] = [{
    name: 'unladen', massKg: v.massKg, cogHeightMm: v.cogHeightMm, frontStaticSharePercent: v.frontStaticSharePercent,
    wheelbaseMm: v.wheelbaseMm, valveKneeKPa: valve?.kneeKPa ?? null, valveSlope: valve?.slope ?? null,
  }]
  if (v.laden) {
    states.push({
      name: 'laden', ...v.laden, wheelbaseMm: v.wheelbaseMm,
      valveKneeKPa: valve ? valve.ladenKneeKPa ?? valve.kneeKPa : null, valveSlope: valve?.slope ?? null,
    })
  }
  return states
}

/** Rear line pressure after a pressure-limiting valve: as the master cylinder up to the knee, then slope × the rise. */
export function rearPressureKPa(pressureKPa: number, valve?: Pick<RearValve, 'kneeKPa' | 'slope'> | { kneeKPa: number | null; slope: number | null }): number {
  if (!valve || valve.kneeKPa === null || valve.slope === null || pressureKPa <= valve.kneeKPa) return pressureKPa
  return valve.kneeKPa + valve.slope * (pressureKPa - valve.kneeKPa)
}

/** The vehicle's weight P = m g, N. */
export function weightN(state: Pick<LoadState, 'massKg'>): number {
  return state.massKg * STANDARD_GRAVITY_MPS2
}

/** Dynamic axle loads at braking rate z: N1 = P1 + z P h / E, N2 = P2 − z P h / E (N). */
export function dynamicAxleLoadsN(state: LoadState, z: number): { front: number; rear: number } {
  const weight = weightN(state)
  const transfer = (z * weight * state.cogHeightMm) / state.wheelbaseMm
  const front = (weight * state.frontStaticSharePercent) / 100 + transfer
  return { front, rear: weight - front }
}

/** Adhesion utilisation of each axle, f = braking force / dynamic axle load, at braking rate z. */
export function adhesionUtilisation(forcesN: { front: number; rear: number }, state: LoadState, z: number): { front: number; rear: number } {
  const loads = dynamicAxleLoadsN(state, z)
  return { front: forcesN.front / loads.front, rear: forcesN.rear / loads.rear }
}

/** Ideal front share of the braking at z: both axles then need the same friction (N1 / P), %. */
export function idealFrontSharePercent(state: LoadState, z: number): number {
  return (dynamicAxleLoadsN(state, z).front / weightN(state)) * 100
}

/** Adhesion utilisations closer than this count as locking together (common practice: 0.01 of friction). */
export const LOCKING_TOLERANCE = 0.01

export type LocksFirst = 'front' | 'rear' | 'together'

/** Which axle locks first: the one that needs more friction. */
export function whichLocksFirst(f: { front: number; rear: number }): LocksFirst {
  if (Math.abs(f.front - f.rear) <= LOCKING_TOLERANCE) return 'together'
  return f.front > f.rear ? 'front' : 'rear'
}

/** How the braking force grows with line pressure: tyre force per kPa on each axle, and the rear valve. */
export interface Distribution {
  /** Front axle tyre force per kPa of line pressure; rear axle tyre force per kPa of rear pressure, N/kPa. */
  gain: { front: number; rear: number }
  kneeKPa: number | null
  slope: number | null
}

/** Axle tyre forces at a line pressure, N. */
export function forcesAt(d: Distribution, pressureKPa: number): { front: number; rear: number } {
  return { front: d.gain.front * pressureKPa, rear: d.gain.rear * rearPressureKPa(pressureKPa, { kneeKPa: d.kneeKPa, slope: d.slope }) }
}

/** The line pressure at which the brakes give braking rate z (total force = z P), kPa. */
export function pressureForRate(d: Distribution, state: LoadState, z: number): number {
  const demand = z * weightN(state)
  const below = demand / (d.gain.front + d.gain.rear)
  if (d.kneeKPa === null || d.slope === null || below <= d.kneeKPa) return below
  return (demand - d.gain.rear * d.kneeKPa * (1 - d.slope)) / (d.gain.front + d.gain.rear * d.slope)
}

/** Adhesion utilisation of each axle at braking rate z, with the distribution and valve of this system. */
export function utilisationAtRate(d: Distribution, state: LoadState, z: number): { front: number; rear: number } {
  return adhesionUtilisation(forcesAt(d, pressureForRate(d, state, z)), state, z)
}
