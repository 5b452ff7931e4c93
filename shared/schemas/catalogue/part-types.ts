/** The part types of the catalogue with their names for people, and the fixed choices specs and fitment use. */
import { z } from 'zod'
import { AXLES, FITMENT_AXLES } from '../../types/axles'

export const PART_TYPES = [
  'disc', 'pad_set', 'caliper', 'drum', 'shoe_set', 'wheel_cylinder', 'hose', 'fitting_kit', 'wear_sensor',
  'master_cylinder', 'fluid',
] as const
export const PartTypeSchema = z.enum(PART_TYPES, { error: `type must be one of ${PART_TYPES.join(', ')}` })
export type PartType = z.infer<typeof PartTypeSchema>

export const PART_TYPE_LABELS: Record<PartType, { one: string; many: string }> = {
  disc: { one: 'Brake disc', many: 'Brake discs' },
  pad_set: { one: 'Pad set', many: 'Pad sets' },
  caliper: { one: 'Caliper', many: 'Calipers' },
  drum: { one: 'Brake drum', many: 'Brake drums' },
  shoe_set: { one: 'Shoe set', many: 'Shoe sets' },
  wheel_cylinder: { one: 'Wheel cylinder', many: 'Wheel cylinders' },
  hose: { one: 'Brake hose', many: 'Brake hoses' },
  fitting_kit: { one: 'Fitting kit', many: 'Fitting kits' },
  wear_sensor: { one: 'Wear sensor', many: 'Wear sensors' },
  master_cylinder: { one: 'Master cylinder', many: 'Master cylinders' },
  fluid: { one: 'Brake fluid', many: 'Brake fluid' },
}

export const AxleSchema = z.enum(AXLES, { error: 'axle must be front or rear' })
export const FitmentAxleSchema = z.enum(FITMENT_AXLES, { error: 'axle must be front, rear or all' })
export const SIDES = ['left', 'right', 'pair'] as const
export const POSITIONS = ['front-left', 'front-right', 'rear-left', 'rear-right'] as const
export const FLUID_GRADES = ['DOT 3', 'DOT 4', 'DOT 5', 'DOT 5.1'] as const
export const CONDITIONS = ['new', 'remanufactured'] as const
