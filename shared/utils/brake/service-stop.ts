/**
 * The FMVSS No. 135 S7.5 service stop compared like with like: at the most pedal force the rule allows (500 N), in
 * each load state the vehicle data gives (the rule runs it at the gross vehicle weight rating and lightly loaded;
 * from memory), the deceleration capped by tyre grip, and the distance with the rule's 0.10 V build-up term.
 */
import type { BrakeSystem } from './hydraulics'
import { computeChain } from './hydraulics'
import type { VehicleData } from './schemas'
import { FMVSS_135 } from './stopping'

/** One load state's service stop. */
export interface ServiceStop {
  loadState: 'unladen' | 'laden' | 'as entered'
  massKg: number
  pedalForceN: number
  decelerationMps2: number
  limitedBy: 'brakes' | 'tyre grip'
  distanceM: number
  limitM: number
  meets: boolean
}

/** The vehicle data with its laden state as the one in use (and the load-sensing valve's laden knee). */
export function ladenVehicle(v: VehicleData): VehicleData | null {
  if (!v.laden) return null
  const valve = v.rearValve ? { kneeKPa: v.rearValve.ladenKneeKPa ?? v.rearValve.kneeKPa, slope: v.rearValve.slope } : undefined
  return { ...v, ...v.laden, laden: undefined, rearValve: valve }
}

function stopOf(system: BrakeSystem, loadState: ServiceStop['loadState']): ServiceStop | null {
  const ref = FMVSS_135.service
  const chain = computeChain({ ...system, pedalForceN: ref.maxPedalForceN })
  if (chain.decelerationMps2 === null || chain.massKg === null || chain.stoppingDistanceFrom100KmhM === null) return null
  return {
    loadState, massKg: chain.massKg, pedalForceN: ref.maxPedalForceN, decelerationMps2: chain.decelerationMps2,
    limitedBy: chain.decelerationLimitedBy ?? 'brakes', distanceM: chain.stoppingDistanceFrom100KmhM,
    limitM: ref.distanceM, meets: chain.stoppingDistanceFrom100KmhM <= ref.distanceM,
  }
}

/** The service stop in every load state the system's data allows (none without a mass and rolling radii). */
export function serviceStops(system: BrakeSystem): ServiceStop[] {
  if (!system.vehicle) {
    const one = stopOf(system, 'as entered')
    return one ? [one] : []
  }
  const laden = ladenVehicle(system.vehicle)
  return [stopOf(system, 'unladen'), laden ? stopOf({ ...system, vehicle: laden }, 'laden') : null].filter((s): s is ServiceStop => s !== null)
}
