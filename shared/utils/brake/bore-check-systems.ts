/**
 * The two brake systems a bore check compares: the original as entered, and the replacement, which takes the
 * replaced parts from the input and everything else from the original.
 */
import type { AxleName } from '../../types/axles'
import type { BrakeSystem } from './hydraulics'
import type { Axle, HydraulicsInput, MasterCylinder } from './schemas'

/** The original system of a hydraulics input. */
export function originalSystem(input: HydraulicsInput): BrakeSystem {
  return {
    pedalForceN: input.pedalForceN,
    pedalRatio: input.pedalRatio,
    boosterRatio: input.boosterRatio,
    boosterRunOutKPa: input.boosterRunOutKPa,
    tyreRoadFriction: input.tyreRoadFriction,
    massKg: input.massKg,
    vehicle: input.vehicle,
    split: input.split,
    masterCylinder: input.masterCylinder,
    axles: input.axles,
  }
}

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
 * ports, piston travel, and the pad's height and edge margin on the same disc) are taken from the original and
 * listed in `inherited`.
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
    // a new caliper on the same disc sweeps the same annulus with the same pads
    if (merged.kind === 'disc' && original.kind === 'disc' && merged.discDiameterMm === original.discDiameterMm) {
      for (const key of ['padHeightMm', 'edgeMarginMm'] as const) {
        if (merged[key] === undefined && original[key] !== undefined) {
          merged[key] = original[key]
          inherited.push(`axles.${name}.${key}`)
        }
      }
    }
    return merged
  }

  return {
    system: { ...originalSystem(input), masterCylinder, axles: { front: axle('front'), rear: axle('rear') } },
    changed: {
      masterCylinder: rep.masterCylinder !== undefined,
      front: rep.axles?.front !== undefined,
      rear: rep.axles?.rear !== undefined,
    },
    inherited,
  }
}
