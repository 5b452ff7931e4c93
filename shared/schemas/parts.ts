/**
 * Catalogue input schemas, shared by the server routes and the forms that send them.
 *
 * - One zod schema per part type for `parts.specs` ({@link SPEC_SCHEMAS}, {@link parseSpecs}). Units are part of
 *   every field name (`diameterMm`, `boreMm`, `volumeMl`) so a number never travels without its unit.
 * - Query schemas for GET /api/vehicles/facets, /api/vehicles/:id/parts and /api/parts.
 * - Body schemas for the counter-staff upkeep routes under /api/catalogue/.
 *
 * Plausibility limits are there to catch unit slips (a bore typed in inches, a disc in cm), not to describe
 * every vehicle ever built (common practice).
 */
import { z } from 'zod'
import { AXLES, FITMENT_AXLES, type AxleName } from '../types/axles'

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

// ---------------------------------------------------------------------------------------------------------------
// Field builders with messages that name the quantity and the unit

function mm(label: string, min: number, max: number) {
  return z.number({ error: (i) => (i.input === undefined ? `${label} is required` : `${label} must be a number (mm)`) })
    .min(min, { error: `${label} must be at least ${min} mm` })
    .max(max, { error: `${label} must be at most ${max} mm (check the unit)` })
}
function int(label: string, min: number, max: number) {
  return z.number({ error: (i) => (i.input === undefined ? `${label} is required` : `${label} must be a whole number`) })
    .int({ error: `${label} must be a whole number` })
    .min(min, { error: `${label} must be at least ${min}` })
    .max(max, { error: `${label} must be at most ${max}` })
}
function bool(label: string) {
  return z.boolean({ error: `${label} must be yes or no` })
}
function oneOf<const T extends readonly [string, ...string[]]>(label: string, values: T) {
  return z.enum(values, { error: `${label} must be ${values.join(', ')}` })
}
const text = (label: string, max: number) =>
  z.string({ error: `${label} is required` }).trim().min(1, { error: `${label} is required` }).max(max, { error: `${label} is at most ${max} characters` })

/** SAE J866 edge code: normal then hot friction letter (C, D, E, F, G, H; Z unclassified), e.g. "FF". */
export const FrictionCodeSchema = z.string({ error: 'friction code is required' }).trim().toUpperCase()
  .regex(/^[CDEFGHZ]{2}$/, { error: 'friction code must be two SAE J866 letters (C-H or Z), e.g. FF' })

const axle = AxleSchema
const condition = oneOf('condition', ['new', 'remanufactured'] as const)
/** Shape code shared by a pad set, its caliper and its fitting kit: pads fit the calipers with the same code. */
const padShape = z.string({ error: 'pad shape is required' }).trim().regex(/^[A-Z0-9-]{2,16}$/, { error: 'pad shape is a code of 2-16 capitals, digits or dashes' })

// ---------------------------------------------------------------------------------------------------------------
// Specifications per type

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
  approvalMark: z.string().trim().max(60, { error: 'approval mark is at most 60 characters' }).optional(),
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
  .refine((s) => s.condition === 'new' || s.coreDepositApplies, { path: ['coreDepositApplies'], error: 'a remanufactured unit carries a core deposit' })

export const MasterCylinderSpecsSchema = z.object({
  boreMm: mm('bore', 14, 32),
  tandem: bool('tandem'),
  ports: int('ports', 1, 6),
  reservoir: oneOf('reservoir', ['integrated', 'remote', 'none'] as const),
  condition,
  coreDepositApplies: bool('core deposit'),
}).strict().refine((s) => s.condition === 'new' || s.coreDepositApplies, { path: ['coreDepositApplies'], error: 'a remanufactured unit carries a core deposit' })

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

export type DiscSpecs = z.infer<typeof DiscSpecsSchema>
export type PadSetSpecs = z.infer<typeof PadSetSpecsSchema>
export type CaliperSpecs = z.infer<typeof CaliperSpecsSchema>
export type MasterCylinderSpecs = z.infer<typeof MasterCylinderSpecsSchema>
export type WheelCylinderSpecs = z.infer<typeof WheelCylinderSpecsSchema>
export type DrumSpecs = z.infer<typeof DrumSpecsSchema>
export type ShoeSetSpecs = z.infer<typeof ShoeSetSpecsSchema>
export type HoseSpecs = z.infer<typeof HoseSpecsSchema>
export type FluidSpecs = z.infer<typeof FluidSpecsSchema>
export type FittingKitSpecs = z.infer<typeof FittingKitSpecsSchema>
export type WearSensorSpecs = z.infer<typeof WearSensorSpecsSchema>
export interface SpecsByType {
  disc: DiscSpecs; pad_set: PadSetSpecs; caliper: CaliperSpecs; drum: DrumSpecs; shoe_set: ShoeSetSpecs
  wheel_cylinder: WheelCylinderSpecs; hose: HoseSpecs; fitting_kit: FittingKitSpecs; wear_sensor: WearSensorSpecs
  master_cylinder: MasterCylinderSpecs; fluid: FluidSpecs
}

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

// ---------------------------------------------------------------------------------------------------------------
// Presentation: labels and units of each spec field, in display order (one table for the part page and the form)

export interface SpecField {
  key: string
  label: string
  unit?: 'mm' | 'ml'
  kind: 'number' | 'integer' | 'boolean' | 'choice' | 'text' | 'numbers'
  choices?: readonly string[]
  optional?: boolean
}

const f = (key: string, label: string, kind: SpecField['kind'], extra: Partial<SpecField> = {}): SpecField => ({ key, label, kind, ...extra })
const mmField = (key: string, label: string) => f(key, label, 'number', { unit: 'mm' })
const axleField = f('axle', 'Axle', 'choice', { choices: AXLES })
const conditionFields = [f('condition', 'Condition', 'choice', { choices: ['new', 'remanufactured'] }), f('coreDepositApplies', 'Core deposit charged', 'boolean')]

export const SPEC_FIELDS: Record<PartType, SpecField[]> = {
  disc: [axleField, mmField('diameterMm', 'Diameter'), mmField('thicknessMm', 'Thickness'), mmField('minThicknessMm', 'Minimum thickness'),
    mmField('heightMm', 'Height'), mmField('centreBoreMm', 'Centre bore'), f('boltHoles', 'Bolt holes', 'integer'), mmField('pcdMm', 'Bolt circle'),
    f('vented', 'Vented', 'boolean')],
  pad_set: [axleField, f('padShape', 'Pad shape', 'text'), mmField('widthMm', 'Width'), mmField('heightMm', 'Height'), mmField('thicknessMm', 'Thickness'),
    f('wearSensor', 'Wear sensor', 'choice', { choices: ['none', 'integrated', 'separate'] }), f('frictionCode', 'Friction code (SAE J866)', 'text'),
    f('approvalMark', 'Approval mark', 'text', { optional: true })],
  caliper: [f('position', 'Position', 'choice', { choices: POSITIONS }), f('caliperType', 'Type', 'choice', { choices: ['fixed', 'floating'] }),
    f('pistonCount', 'Pistons', 'integer'), f('pistonDiametersMm', 'Piston diameter', 'numbers', { unit: 'mm' }), f('padShape', 'Pad shape', 'text'),
    f('parkingBrake', 'Parking brake', 'choice', { choices: ['none', 'cable', 'electric'] }), ...conditionFields],
  drum: [axleField, mmField('diameterMm', 'Diameter'), mmField('maxDiameterMm', 'Maximum diameter'), mmField('widthMm', 'Width'), f('boltHoles', 'Bolt holes', 'integer')],
  shoe_set: [axleField, mmField('diameterMm', 'Drum diameter'), mmField('widthMm', 'Lining width'), f('frictionCode', 'Friction code (SAE J866)', 'text'),
    f('parkingLever', 'Parking lever', 'boolean')],
  wheel_cylinder: [axleField, mmField('boreMm', 'Bore'), f('side', 'Side', 'choice', { choices: SIDES })],
  hose: [f('position', 'Position', 'choice', { choices: POSITIONS }), mmField('lengthMm', 'Length'), f('threadA', 'Thread A', 'text'), f('threadB', 'Thread B', 'text')],
  fitting_kit: [axleField, f('kitFor', 'Kit for', 'choice', { choices: ['pad_set', 'shoe_set'] }), f('padShape', 'Pad shape', 'text', { optional: true }), f('pieces', 'Pieces', 'integer')],
  wear_sensor: [axleField, mmField('lengthMm', 'Length'), f('connector', 'Connector', 'text')],
  master_cylinder: [mmField('boreMm', 'Bore'), f('tandem', 'Tandem', 'boolean'), f('ports', 'Ports', 'integer'),
    f('reservoir', 'Reservoir', 'choice', { choices: ['integrated', 'remote', 'none'] }), ...conditionFields],
  fluid: [f('grade', 'Grade', 'choice', { choices: FLUID_GRADES }), f('volumeMl', 'Volume', 'integer', { unit: 'ml' })],
}

// ---------------------------------------------------------------------------------------------------------------
// Compatible alternatives: the fitting dimensions that must agree, and how closely

export interface FittingRule { key: string; tolerance?: number }
/**
 * Two parts of one type are interchangeable when these agree: numbers within `tolerance` (mm), everything else
 * equal. Tolerances are our stated catalogue rule (common practice: pad plates within half a millimetre, hydraulic
 * bores and disc sizes exact).
 */
export const FITTING_RULES: Record<PartType, FittingRule[]> = {
  disc: [{ key: 'axle' }, { key: 'diameterMm', tolerance: 0 }, { key: 'thicknessMm', tolerance: 0 }, { key: 'heightMm', tolerance: 0.5 },
    { key: 'centreBoreMm', tolerance: 0.1 }, { key: 'boltHoles' }, { key: 'pcdMm', tolerance: 0 }, { key: 'vented' }],
  pad_set: [{ key: 'axle' }, { key: 'widthMm', tolerance: 0.5 }, { key: 'heightMm', tolerance: 0.5 }, { key: 'thicknessMm', tolerance: 0.5 }],
  caliper: [{ key: 'position' }, { key: 'caliperType' }, { key: 'pistonCount' }, { key: 'pistonDiametersMm', tolerance: 0 }, { key: 'padShape' }, { key: 'parkingBrake' }],
  drum: [{ key: 'axle' }, { key: 'diameterMm', tolerance: 0 }, { key: 'widthMm', tolerance: 0.5 }, { key: 'boltHoles' }],
  shoe_set: [{ key: 'axle' }, { key: 'diameterMm', tolerance: 0 }, { key: 'widthMm', tolerance: 0.5 }, { key: 'parkingLever' }],
  wheel_cylinder: [{ key: 'axle' }, { key: 'boreMm', tolerance: 0.01 }, { key: 'side' }],
  hose: [{ key: 'position' }, { key: 'lengthMm', tolerance: 5 }, { key: 'threadA' }, { key: 'threadB' }],
  fitting_kit: [{ key: 'axle' }, { key: 'kitFor' }, { key: 'padShape' }],
  wear_sensor: [{ key: 'axle' }, { key: 'lengthMm', tolerance: 10 }, { key: 'connector' }],
  master_cylinder: [{ key: 'boreMm', tolerance: 0.01 }, { key: 'tandem' }, { key: 'ports' }],
  fluid: [{ key: 'grade' }],
}

/** True when `b` fits where `a` fits by the rules above. */
export function sameFitting(type: PartType, a: Record<string, unknown>, b: Record<string, unknown>): boolean {
  for (const rule of FITTING_RULES[type]) {
    const x = a[rule.key], y = b[rule.key]
    if (rule.tolerance !== undefined) {
      const xs = Array.isArray(x) ? x : [x], ys = Array.isArray(y) ? y : [y]
      if (xs.length !== ys.length) return false
      for (let i = 0; i < xs.length; i++) {
        if (typeof xs[i] !== 'number' || typeof ys[i] !== 'number') return false
        if (Math.abs((xs[i] as number) - (ys[i] as number)) > rule.tolerance + 1e-9) return false
      }
    } else if (x !== y) return false
  }
  return true
}

// ---------------------------------------------------------------------------------------------------------------
// Query schemas

const emptyToUndefined = (v: unknown) => (v === '' || v === null ? undefined : v)
const queryNumber = (label: string, min: number, max: number) => z.preprocess(emptyToUndefined,
  z.coerce.number({ error: `${label} must be a number` }).refine(Number.isFinite, { error: `${label} must be a number` })
    .min(min, { error: `${label} must be at least ${min}` }).max(max, { error: `${label} must be at most ${max}` }).optional())
const queryInt = (label: string, min: number, max: number) => z.preprocess(emptyToUndefined,
  z.coerce.number({ error: `${label} must be a whole number` }).int({ error: `${label} must be a whole number` })
    .min(min, { error: `${label} must be at least ${min}` }).max(max, { error: `${label} must be at most ${max}` }).optional())
const queryText = (label: string, max: number) => z.preprocess(emptyToUndefined,
  z.string({ error: `${label} must be text` }).trim().max(max, { error: `${label} is at most ${max} characters` }).optional())

export const VehicleFacetsQuerySchema = z.object({
  make: queryText('make', 60),
  model: queryText('model', 80),
  year: queryInt('year', 1950, 2100),
}).refine((q) => !q.model || q.make, { path: ['make'], error: 'choose a make before a model' })
  .refine((q) => !q.year || q.model, { path: ['model'], error: 'choose a model before a year' })
export type VehicleFacetsQuery = z.infer<typeof VehicleFacetsQuerySchema>

export const VehicleIdParamsSchema = z.object({
  id: z.coerce.number({ error: 'vehicle id must be a number' }).int({ error: 'vehicle id must be a whole number' }).positive({ error: 'vehicle id must be positive' }),
})

export const SkuSchema = z.string({ error: 'SKU is required' }).trim().toUpperCase()
  .regex(/^[A-Z0-9][A-Z0-9-]{1,38}$/, { error: 'SKU is 2-39 capitals, digits and dashes' })
export const SkuParamsSchema = z.object({ sku: SkuSchema })

/** Option answers come as `opt.<key>=<value>` query parameters, e.g. `?opt.front_disc_diameter_mm=300`. */
export const OPTION_PREFIX = 'opt.'
export function answersFromQuery(query: Record<string, unknown>): Record<string, string> {
  const answers: Record<string, string> = {}
  for (const [k, v] of Object.entries(query)) {
    if (!k.startsWith(OPTION_PREFIX)) continue
    const value = Array.isArray(v) ? v[v.length - 1] : v
    if (value === undefined || value === null || value === '') continue
    answers[k.slice(OPTION_PREFIX.length)] = String(value)
  }
  return answers
}

/** Spec dimensions the part list can filter on; each takes `<dim>Mm` (exact), `<dim>Min` and `<dim>Max`. */
export const DIMENSIONS = ['diameter', 'bore', 'piston', 'thickness', 'width', 'length'] as const
export type Dimension = (typeof DIMENSIONS)[number]
export const DIMENSION_LABELS: Record<Dimension, string> = {
  diameter: 'diameter', bore: 'bore', piston: 'piston diameter', thickness: 'thickness', width: 'width', length: 'length',
}

const dimShape: Record<string, z.ZodType> = {}
for (const d of DIMENSIONS) {
  dimShape[`${d}Mm`] = queryNumber(`${d}Mm`, 0, 2000)
  dimShape[`${d}Min`] = queryNumber(`${d}Min`, 0, 2000)
  dimShape[`${d}Max`] = queryNumber(`${d}Max`, 0, 2000)
}

export const PAGE_SIZE_MAX = 100

export const PartListQuerySchema = z.object({
  q: queryText('q', 200),
  type: z.preprocess(emptyToUndefined, PartTypeSchema.optional()),
  axle: z.preprocess(emptyToUndefined, AxleSchema.optional()),
  page: z.preprocess(emptyToUndefined, z.coerce.number({ error: 'page must be a whole number' }).int({ error: 'page must be a whole number' }).min(1, { error: 'page must be at least 1' }).max(100_000, { error: 'page is too large' }).default(1)),
  pageSize: z.preprocess(emptyToUndefined, z.coerce.number({ error: 'pageSize must be a whole number' }).int({ error: 'pageSize must be a whole number' }).min(1, { error: 'pageSize must be at least 1' }).max(PAGE_SIZE_MAX, { error: `pageSize must be at most ${PAGE_SIZE_MAX}` }).default(20)),
  ...dimShape,
}).superRefine((q, ctx) => {
  const v = q as unknown as Record<string, number | undefined>
  for (const d of DIMENSIONS) {
    const lo = v[`${d}Min`], hi = v[`${d}Max`]
    if (lo !== undefined && hi !== undefined && lo > hi) ctx.addIssue({ code: 'custom', path: [`${d}Max`], message: `${d}Max must not be less than ${d}Min` })
  }
})

export type DimensionRange = { min?: number; max?: number }
export interface PartListQuery {
  q?: string
  type?: PartType
  axle?: AxleName
  page: number
  pageSize: number
  ranges: Partial<Record<Dimension, DimensionRange>>
}

/** Exact `<dim>Mm` filters match within this (the catalogue states 22.22 for a 7/8 in bore of 22.225 mm). */
export const EXACT_DIMENSION_TOLERANCE_MM = 0.01

/** Validates a raw query into {@link PartListQuery}; throws a ZodError naming the field. */
export function parsePartListQuery(raw: Record<string, unknown>): PartListQuery {
  const q = PartListQuerySchema.parse(raw) as Record<string, unknown> & { page: number; pageSize: number }
  const ranges: PartListQuery['ranges'] = {}
  for (const d of DIMENSIONS) {
    const exact = q[`${d}Mm`] as number | undefined
    const lo = q[`${d}Min`] as number | undefined
    const hi = q[`${d}Max`] as number | undefined
    if (exact !== undefined) ranges[d] = { min: exact - EXACT_DIMENSION_TOLERANCE_MM, max: exact + EXACT_DIMENSION_TOLERANCE_MM }
    else if (lo !== undefined || hi !== undefined) ranges[d] = { min: lo, max: hi }
  }
  return {
    q: q.q as string | undefined, type: q.type as PartType | undefined, axle: q.axle as AxleName | undefined,
    page: q.page, pageSize: q.pageSize, ranges,
  }
}

// ---------------------------------------------------------------------------------------------------------------
// Upkeep bodies (counter staff)

export const OeNumberInputSchema = z.object({
  oeNumber: z.string({ error: 'OE number is required' }).trim().min(2, { error: 'OE number is too short' }).max(40, { error: 'OE number is at most 40 characters' })
    .regex(/^[A-Za-z0-9 .\-/]+$/, { error: 'OE number may hold letters, digits, spaces, dots, dashes and slashes' }),
  maker: z.string().trim().max(60, { error: 'maker is at most 60 characters' }).default(''),
})

/** Upper case without spaces, dashes, dots or slashes: how OE numbers and SKUs are compared. */
export function normaliseIdentifier(s: string): string {
  return s.toUpperCase().replace(/[^A-Z0-9]/g, '')
}

const description = text('description', 300)
const productLine = z.string({ error: 'product line must be text' }).trim().max(60, { error: 'product line is at most 60 characters' })

export const PartCreateSchema = z.object({
  sku: SkuSchema,
  type: PartTypeSchema,
  productLine: productLine.default(''),
  description,
  specs: z.record(z.string(), z.unknown(), { error: 'specs must be an object' }),
  oeNumbers: z.array(OeNumberInputSchema).max(40, { error: 'at most 40 OE numbers' }).default([]),
})
export type PartCreateInput = z.infer<typeof PartCreateSchema>

export const PartPatchSchema = z.object({
  productLine: productLine.optional(),
  description: description.optional(),
  status: oneOf('status', ['active', 'discontinued'] as const).optional(),
  specs: z.record(z.string(), z.unknown(), { error: 'specs must be an object' }).optional(),
  oeNumbers: z.array(OeNumberInputSchema).max(40, { error: 'at most 40 OE numbers' }).optional(),
}).strict().refine((b) => Object.keys(b).length > 0, { error: 'nothing to change' })
export type PartPatchInput = z.infer<typeof PartPatchSchema>

const qualifierKey = z.string().regex(/^[a-z][a-z0-9_]{0,59}$/, { error: 'option keys are lower case words joined by _' })
export const QualifiersSchema = z.record(qualifierKey, z.string().trim().min(1, { error: 'option value is required' }).max(60), { error: 'qualifiers must be an object of option values' })

export const FitmentInputSchema = z.object({
  vehicleId: z.number({ error: 'vehicle is required' }).int().positive({ error: 'vehicle is required' }),
  axle: FitmentAxleSchema,
  side: oneOf('side', SIDES).default('pair'),
  quantity: int('quantity', 1, 8).default(1),
  qualifiers: QualifiersSchema.default({}),
  note: z.string().trim().max(240, { error: 'note is at most 240 characters' }).default(''),
})
export type FitmentInput = z.infer<typeof FitmentInputSchema>

export const FitmentPatchSchema = z.object({
  axle: FitmentAxleSchema.optional(),
  side: oneOf('side', SIDES).optional(),
  quantity: int('quantity', 1, 8).optional(),
  qualifiers: QualifiersSchema.optional(),
  note: z.string().trim().max(240, { error: 'note is at most 240 characters' }).optional(),
}).strict().refine((b) => Object.keys(b).length > 0, { error: 'nothing to change' })

export const FitmentIdParamsSchema = z.object({
  id: z.coerce.number({ error: 'fitment id must be a number' }).int().positive({ error: 'fitment id must be positive' }),
})

export const SupersedeSchema = z.object({
  newSku: SkuSchema,
  note: z.string().trim().max(240, { error: 'note is at most 240 characters' }).default(''),
})
