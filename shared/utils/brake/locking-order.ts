/**
 * The order of locking as UN ECE Regulation 13-H, Annex 5 judges it for passenger cars: in every load state, the
 * front axle's adhesion utilisation must stay above the rear's for all braking rates z between 0.15 and 0.80, so
 * the front wheels lock first and the car stays straight. Where the vehicle data gives a rear valve, its knee and
 * slope shape the rear force. Annex 5 also tolerates, for category M1, an inversion between z = 0.30 and 0.45 while
 * the rear's utilisation stays within 0.05 above the line k = z (from memory; shown as tolerated, not as meeting).
 */
import type { VehicleData } from './schemas'
import { loadStates, utilisationAtRate, type Distribution, type LoadState } from './vehicle-load'

export const R13H_BAND = { fromZ: 0.15, toZ: 0.8, step: 0.005 } as const
/** Category M1 tolerance (from memory): inversion allowed for 0.30 ≤ z ≤ 0.45 if the rear stays under z + 0.05. */
export const R13H_M1_TOLERANCE = { fromZ: 0.3, toZ: 0.45, aboveLine: 0.05 } as const

/** A stretch of braking rates where the rear axle needs more friction than the front. */
export interface RearFirstStretch {
  fromZ: number
  toZ: number
  /** Within the category M1 tolerance (from memory). */
  tolerated: boolean
}

/** One load state judged against the band. */
export interface LoadStateOrder {
  loadState: LoadState['name']
  massKg: number
  rearFirst: RearFirstStretch[]
  /** True when the front stays above the rear throughout 0.15-0.80 (tolerated stretches aside). */
  meets: boolean
  /** Braking rate where the two curves cross (front and rear need the same friction), or null if not in 0.05-1.0. */
  crossoverZ: number | null
}

const round3 = (z: number) => Math.round(z * 1000) / 1000

function stretches(d: Distribution, state: LoadState): RearFirstStretch[] {
  const out: RearFirstStretch[] = []
  let open: { fromZ: number; toZ: number; tolerated: boolean } | null = null
  const n = Math.round((R13H_BAND.toZ - R13H_BAND.fromZ) / R13H_BAND.step)
  for (let i = 0; i <= n; i++) {
    const z = round3(R13H_BAND.fromZ + i * R13H_BAND.step)
    const f = utilisationAtRate(d, state, z)
    if (f.rear > f.front + 1e-9) {
      const ok = z >= R13H_M1_TOLERANCE.fromZ - 1e-9 && z <= R13H_M1_TOLERANCE.toZ + 1e-9 && f.rear <= z + R13H_M1_TOLERANCE.aboveLine
      if (open) { open.toZ = z; open.tolerated &&= ok } else open = { fromZ: z, toZ: z, tolerated: ok }
    } else if (open) { out.push(open); open = null }
  }
  if (open) out.push(open)
  return out
}

/** Where front and rear utilisation cross, by linear interpolation between steps of 0.005 in z. */
function crossover(d: Distribution, state: LoadState): number | null {
  let prevZ = 0.05
  let prev = diff(d, state, prevZ)
  for (let z = 0.055; z <= 1.0 + 1e-9; z = round3(z + 0.005)) {
    const cur = diff(d, state, z)
    if (prev === 0) return prevZ
    if (Math.sign(cur) !== Math.sign(prev)) return round3(prevZ + (0.005 * prev) / (prev - cur))
    prev = cur
    prevZ = z
  }
  return null
}

function diff(d: Distribution, state: LoadState, z: number): number {
  const f = utilisationAtRate(d, state, z)
  return f.front - f.rear
}

/**
 * The order of locking in each load state of the vehicle.
 * @param gain axle tyre force per kPa (front per line kPa, rear per rear kPa)
 */
export function lockingOrder(vehicle: VehicleData, gain: Distribution['gain']): LoadStateOrder[] {
  return loadStates(vehicle).map((state) => {
    const d: Distribution = { gain, kneeKPa: state.valveKneeKPa, slope: state.valveSlope }
    const rearFirst = stretches(d, state)
    return { loadState: state.name, massKg: state.massKg, rearFirst, meets: rearFirst.every((s) => s.tolerated), crossoverZ: crossover(d, state) }
  })
}
