/**
 * One zod schema per part type for `parts.specs` ({@link SPEC_SCHEMAS}, {@link parseSpecs}). Units are part of
 * every field name (`diameterMm`, `boreMm`, `volumeMl`) so a number never travels without its unit.
 *
 * Plausibility limits are there to catch unit slips (a bore typed in inches, a disc in cm), not to describe
 * every vehicle ever built (common practice).
 */
import { z } from 'zod'
import type { AxleName } from '../../types/axles'
import { bool, int, mm, note, oneOf, text } from './fields'
import { AxleSchema, CONDITIONS, FLUID_GRADES, POSITIONS, SIDES, type PartType } from './part-types'

/** SAE J866 edge code: normal then hot friction letter (C, D, E, F, G, H; Z unclassified), e.g. "FF". */
export const FrictionCodeSchema = z.string({ error: 'friction code is required' }).trim().toUpperCase()
  .regex(/^[CDEFGHZ]{2}$/, { error: 'friction code must be two SAE J866 letters (C-H or Z), e.g. FF' })

const axle = AxleSchema
const condition = oneOf('condition', CONDITIONS)
/** Shape code shared by a pad set, its caliper and its fitting kit: pads fit the calipers with the same code. */
const padShape = z.string({ error: 'pad shape is required' }).trim().regex(/^[A-Z0-9-]{2,16}$/, { error: 'pad shape is a code of 2-16 capitals, digits or dashes' })
const carriesCoreDeposit = (s: { condition: string; coreDepositApplies: boolean }) => s.condition === 'new' || s.coreDepositApplies
const coreDepositMissing = { path: ['coreDepositApplies'], error: 'a remanufactured unit carries a core deposit' }

export const DiscSpecsSchema = z.object({
  axle,
  diameterMm: mm('diameter', 200, 420),
  thicknessMm: mm('thickness', 6, 40),
  minThicknessMm: mm('minimum thickness', 4, 38),
  heightMm: mm('height', 20, 90),
  centreBoreMm: mm('centre bore', 40, 110),
  boltHoles: int('bolt holes', 3, 8),
  pcdMm: mm('bolt circle', 90, 170),
  vented: bool('vented'),
}).strict().refine((s) => s.minThicknessMm < s.thicknessMm, { path: ['minThicknessMm'], error: 'minimum thickness must be less than the thickness' })
  .refine((s) => s.thicknessMm - s.minThicknessMm <= 4, { path: ['minThicknessMm'], error: 'minimum thickness is more than 4 mm under the thickness (check the figures)' })

export const PadSetSpecsSchema = z.object({
  axle,
  padShape,
  widthMm: mm('width', 40, 220),
  heightMm: mm('height', 25, 100),
  thicknessMm: mm('thickness', 8, 25),
  wearSensor: oneOf('wear sensor', ['none', 'integrated', 'separate'] as const),
  frictionCode: FrictionCodeSchema,
  approvalMark: note('approval mark', 60).optional(),
}).strict()

export const CaliperSpecsSchema = z.object({
  position: oneOf('position', POSITIONS),
  caliperType: oneOf('caliper type', ['fixed', 'floating'] as const),
  pistonCount: int('piston count', 1, 8),
  /** one side for a fixed caliper, every piston for a floating one (as in vehicle_brakes) */
  pistonDiametersMm: z.array(mm('piston diameter', 20, 75), { error: 'piston diameters must be a list of numbers (mm)' }).min(1, { error: 'give at least one piston diameter' }).max(8),
  padShape,
  parkingBrake: oneOf('parking brake', ['none', 'cable', 'electric'] as const),
  condition,
  /** whether a core deposit is charged; the amount comes from the active price version */
  coreDepositApplies: bool('core deposit'),
}).strict()
  .refine((s) => s.pistonDiametersMm.length === (s.caliperType === 'fixed' ? s.pistonCount / 2 : s.pistonCount), {
    path: ['pistonDiametersMm'], error: 'give one diameter per piston (floating) or per piston of one side (fixed)',
  })
  .refine((s) => s.caliperType !== 'fixed' || s.pistonCount % 2 === 0, { path: ['pistonCount'], error: 'a fixed caliper has an even number of pistons' })
  .refine(carriesCoreDeposit, coreDepositMissing)

export const MasterCylinderSpecsSchema = z.object({
  boreMm: mm('bore', 14, 32),
  tandem: bool('tandem'),
  ports: int('ports', 1, 6),
  reservoir: oneOf('reservoir', ['integrated', 'remote', 'none'] as const),
  condition,
  coreDepositApplies: bool('core deposit'),
}).strict().refine(carriesCoreDeposit, coreDepositMissing)

export const WheelCylinderSpecsSchema = z.object({
  axle,
  boreMm: mm('bore', 12, 32),
  side: oneOf('side', SIDES),
}).strict()

export const DrumSpecsSchema = z.object({
  axle,
  diameterMm: mm('diameter', 150, 400),
  maxDiameterMm: mm('maximum diameter', 150, 404),
  widthMm: mm('width', 25, 90),
  boltHoles: int('bolt holes', 3, 8),
}).strict().refine((s) => s.maxDiameterMm > s.diameterMm, { path: ['maxDiameterMm'], error: 'maximum diameter must be more than the diameter' })
  .refine((s) => s.maxDiameterMm - s.diameterMm <= 4, { path: ['maxDiameterMm'], error: 'maximum diameter is more than 4 mm over the diameter (check the figures)' })

export const ShoeSetSpecsSchema = z.object({
  axle,
  diameterMm: mm('drum diameter', 150, 400),
  widthMm: mm('lining width', 25, 90),
  frictionCode: FrictionCodeSchema,
  parkingLever: bool('parking lever'),
}).strict()

export const HoseSpecsSchema = z.object({
  position: oneOf('position', POSITIONS),
  lengthMm: mm('length', 80, 1000),
  threadA: text('thread A', 24),
  threadB: text('thread B', 24),
}).strict()

export const FluidSpecsSchema = z.object({
  grade: oneOf('grade', FLUID_GRADES),
  volumeMl: int('volume', 100, 25_000),
}).strict()

export const FittingKitSpecsSchema = z.object({
  axle,
  kitFor: oneOf('kit for', ['pad_set', 'shoe_set'] as const),
  padShape: padShape.optional(),
  pieces: int('pieces', 1, 80),
}).strict()

export const WearSensorSpecsSchema = z.object({
  axle,
  lengthMm: mm('length', 80, 1600),
  connector: text('connector', 40),
}).strict()

export const SPEC_SCHEMAS = {
  disc: DiscSpecsSchema,
  pad_set: PadSetSpecsSchema,
  caliper: CaliperSpecsSchema,
  drum: DrumSpecsSchema,
  shoe_set: ShoeSetSpecsSchema,
  wheel_cylinder: WheelCylinderSpecsSchema,
  hose: HoseSpecsSchema,
  fitting_kit: FittingKitSpecsSchema,
  wear_sensor: WearSensorSpecsSchema,
  master_cylinder: MasterCylinderSpecsSchema,
  fluid: FluidSpecsSchema,
} as const satisfies Record<PartType, z.ZodType>

/** The parsed specifications of each part type. */
export type SpecsByType = { [T in PartType]: z.infer<(typeof SPEC_SCHEMAS)[T]> }
export type CaliperSpecs = SpecsByType['caliper']
export type MasterCylinderSpecs = SpecsByType['master_cylinder']
export type WheelCylinderSpecs = SpecsByType['wheel_cylinder']

/** Validates `specs` for a part type; throws a ZodError whose paths start at the spec field. */
export function parseSpecs<T extends PartType>(type: T, specs: unknown): SpecsByType[T] {
  return (SPEC_SCHEMAS[type] as z.ZodType).parse(specs) as SpecsByType[T]
}

/** The axle a part is made for (from its specs), or null for parts that serve the whole vehicle. */
export function axleOfSpecs(type: PartType, specs: Record<string, unknown>): AxleName | null {
  if (typeof specs.axle === 'string') return specs.axle as AxleName
  if (typeof specs.position === 'string') return (specs.position as string).startsWith('front') ? 'front' : 'rear'
  return null
}
