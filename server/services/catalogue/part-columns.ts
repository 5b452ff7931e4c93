/**
 * Part search: what the index keeps of each part besides its words and identifiers, read from the part's specs:
 * the axle, attribute bits ("vented", "reman"), the dimensions numbers and range filters compare with, and the
 * fitting key that finds candidates for compatible alternatives. Pure.
 */
import type { Dimension } from '../../../shared/schemas/catalogue/list-query'
import type { PartType } from '../../../shared/schemas/catalogue/part-types'
import type { FittingRule } from '../../../shared/utils/catalogue/fitting-rules'
import type { Attribute } from './search-plan'

export const ATTR_BITS: Record<Attribute, number> = { vented: 1, solid: 2, remanufactured: 4, new: 8, electric: 16, cable: 32, tandem: 64 }
export const AXLE_CODE = { front: 1, rear: 2 } as const

/** The dimensions of a part that numbers and range filters compare with (at most two values each). */
export function dimensionsOf(type: PartType, s: Record<string, unknown>): Partial<Record<Dimension, number[]>> {
  const n = (k: string) => (typeof s[k] === 'number' ? [s[k] as number] : undefined)
  switch (type) {
    case 'disc': return { diameter: n('diameterMm'), thickness: n('thicknessMm') }
    case 'drum': return { diameter: n('diameterMm'), width: n('widthMm') }
    case 'shoe_set': return { diameter: n('diameterMm'), width: n('widthMm') }
    case 'pad_set': return { width: n('widthMm'), thickness: n('thicknessMm') }
    case 'caliper': return { piston: Array.isArray(s.pistonDiametersMm) ? [...new Set(s.pistonDiametersMm as number[])].slice(0, 2) : undefined }
    case 'master_cylinder':
    case 'wheel_cylinder': return { bore: n('boreMm') }
    case 'hose':
    case 'wear_sensor': return { length: n('lengthMm') }
    default: return {}
  }
}

/** Which part types carry a dimension (a `boreMm` filter searches master and wheel cylinders only). */
export const TYPES_WITH_DIMENSION: Record<Dimension, PartType[]> = {
  diameter: ['disc', 'drum', 'shoe_set'], thickness: ['disc', 'pad_set'], width: ['pad_set', 'drum', 'shoe_set'],
  piston: ['caliper'], bore: ['master_cylinder', 'wheel_cylinder'], length: ['hose', 'wear_sensor'],
}

/** The attribute words a part answers to, as bits of {@link ATTR_BITS}. */
export function attributesOf(s: Record<string, unknown>): number {
  let a = 0
  if (s.vented === true) a |= ATTR_BITS.vented
  if (s.vented === false) a |= ATTR_BITS.solid
  if (s.condition === 'remanufactured') a |= ATTR_BITS.remanufactured
  if (s.condition === 'new') a |= ATTR_BITS.new
  if (s.parkingBrake === 'electric') a |= ATTR_BITS.electric
  if (s.parkingBrake === 'cable') a |= ATTR_BITS.cable
  if (s.tandem === true) a |= ATTR_BITS.tandem
  return a
}

/**
 * The exact-equality part of a type's fitting rule as one string (shared/utils/catalogue/fitting-rules.ts): parts
 * with the same key are candidates for "compatible alternatives"; toleranced dimensions are checked afterwards.
 */
export function fittingKey(type: PartType, s: Record<string, unknown>, rules: FittingRule[]): string {
  return rules.filter((r) => !r.tolerance).map((r) => JSON.stringify(s[r.key] ?? null)).join('|')
}
