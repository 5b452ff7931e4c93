/**
 * What the brake forces do to the vehicle: the deceleration (never more than the tyre-road friction allows), each
 * axle's adhesion utilisation at that deceleration and which axle locks first (vehicle-load.ts), and the stop from
 * 100 km/h in FMVSS No. 135's terms (stopping.ts).
 */
import { STANDARD_GRAVITY_MPS2 } from './units'
import type { VehicleData } from './schemas'
import {
  dynamicAxleLoadsN, forcesAt, idealFrontSharePercent, loadStates, pressureForRate, utilisationAtRate, whichLocksFirst,
  type Distribution, type LoadState, type LocksFirst,
} from './vehicle-load'
import { fmvssStoppingDistanceM } from './stopping'

/** Peak tyre-road friction when none is given: dry asphalt (common practice; wet asphalt is about 0.5). */
export const DEFAULT_TYRE_ROAD_FRICTION = 0.8

export interface Adhesion {
  front: number
  rear: number
  locksFirst: LocksFirst
}

export interface VehicleDynamics {
  /** Mass the deceleration is worked for (the unladen state when vehicle data is given), kg; null without one. */
  massKg: number | null
  tyreRoadFriction: number
  tyreRoadFrictionSource: 'given' | 'default'
  /** What the brakes alone would give if the tyres never slid, m/s². */
  brakeDecelerationMps2: number | null
  /** The deceleration: the brakes', capped by the tyre-road friction, m/s²; null without mass or rolling radii. */
  decelerationMps2: number | null
  decelerationG: number | null
  decelerationLimitedBy: 'brakes' | 'tyre grip' | null
  /** Each axle's adhesion utilisation at that deceleration; null without vehicle data. */
  adhesion: Adhesion | null
  dynamicAxleLoadsN: { front: number; rear: number } | null
  idealFrontSharePercent: number | null
  /** Deceleration at which the first axle needs all the tyre-road friction (its wheels lock without ABS), m/s². */
  wheelLockDecelerationMps2: number | null
  /** From 100 km/h at that deceleration, with FMVSS No. 135's 0.10 V build-up term, m. */
  stoppingDistanceFrom100KmhM: number | null
}

/** The braking rate at which the first axle reaches the friction μ (scanned in steps of 0.001), or null. */
export function wheelLockRate(d: Distribution, state: LoadState, mu: number): number | null {
  for (let i = 1; i <= 1500; i++) {
    const z = i / 1000
    const f = utilisationAtRate(d, state, z)
    if (Math.max(f.front, f.rear) >= mu) return z
  }
  return null
}

const NONE = {
  brakeDecelerationMps2: null, decelerationMps2: null, decelerationG: null, decelerationLimitedBy: null, adhesion: null,
  dynamicAxleLoadsN: null, idealFrontSharePercent: null, wheelLockDecelerationMps2: null, stoppingDistanceFrom100KmhM: null,
} as const

/** The unladen load state and the system's distribution in it. */
export function unladenDistribution(vehicle: VehicleData, gain: Distribution['gain']): { state: LoadState; d: Distribution } {
  const state = loadStates(vehicle)[0]!
  return { state, d: { gain, kneeKPa: state.valveKneeKPa, slope: state.valveSlope } }
}

/**
 * The vehicle figures at the chain's line pressure.
 * @param gain axle tyre force per kPa (front per line kPa, rear per rear kPa); null without rolling radii
 */
export function vehicleDynamics(
  system: { vehicle?: VehicleData | undefined; massKg?: number | undefined; tyreRoadFriction?: number | undefined },
  pressureKPa: number,
  gain: Distribution['gain'] | null,
): VehicleDynamics {
  const mu = system.tyreRoadFriction ?? DEFAULT_TYRE_ROAD_FRICTION
  const massKg = system.vehicle?.massKg ?? system.massKg ?? null
  const head = { massKg, tyreRoadFriction: mu, tyreRoadFrictionSource: system.tyreRoadFriction === undefined ? 'default' as const : 'given' as const }
  if (massKg === null || gain === null) return { ...head, ...NONE }
  const g = STANDARD_GRAVITY_MPS2
  const force = gain.front * pressureKPa + gain.rear * pressureKPa
  if (!system.vehicle) {
    // no valve without vehicle data: the forces are linear in the one line pressure
    const zBrakes = force / (massKg * g)
    const z = Math.min(zBrakes, mu)
    return {
      ...head, ...NONE, brakeDecelerationMps2: zBrakes * g, decelerationMps2: z * g, decelerationG: z,
      decelerationLimitedBy: zBrakes > mu ? 'tyre grip' : 'brakes', stoppingDistanceFrom100KmhM: fmvssStoppingDistanceM(100, z * g),
    }
  }
  const { state, d } = unladenDistribution(system.vehicle, gain)
  const at = forcesAt(d, pressureKPa)
  const zBrakes = (at.front + at.rear) / (massKg * g)
  const z = Math.min(zBrakes, mu)
  const forces = zBrakes > mu ? forcesAt(d, pressureForRate(d, state, z)) : at
  const loads = dynamicAxleLoadsN(state, z)
  const f = { front: forces.front / loads.front, rear: forces.rear / loads.rear }
  const lock = wheelLockRate(d, state, mu)
  return {
    ...head,
    brakeDecelerationMps2: zBrakes * g,
    decelerationMps2: z * g,
    decelerationG: z,
    decelerationLimitedBy: zBrakes > mu ? 'tyre grip' : 'brakes',
    adhesion: { ...f, locksFirst: whichLocksFirst(f) },
    dynamicAxleLoadsN: loads,
    idealFrontSharePercent: idealFrontSharePercent(state, z),
    wheelLockDecelerationMps2: lock === null ? null : lock * g,
    stoppingDistanceFrom100KmhM: fmvssStoppingDistanceM(100, z * g),
  }
}
