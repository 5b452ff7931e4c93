/** What one part may need beside it ("also needed"), in the catalogue's part relations. */
export const PART_RELATION_KINDS = ['fitting_kit', 'wear_sensor', 'hardware', 'wheel_cylinder', 'pad_set', 'disc', 'fluid'] as const
export type PartRelationKind = (typeof PART_RELATION_KINDS)[number]

export const PART_RELATION_LABELS: Record<PartRelationKind, string> = {
  fitting_kit: 'Fitting kit',
  wear_sensor: 'Wear sensor',
  hardware: 'Hardware',
  wheel_cylinder: 'Wheel cylinders',
  pad_set: 'Pads to go with it',
  disc: 'Discs to go with it',
  fluid: 'Brake fluid',
}

/** Packs of fluid for a vehicle's capacity: whole packs, at least one (a bleed or flush uses the system's volume). */
export function fluidPacks(capacityMl: number | null | undefined, packMl: number | null | undefined, fallback: number): number {
  if (!capacityMl || !packMl || packMl <= 0) return fallback
  return Math.max(1, Math.ceil(capacityMl / packMl))
}
