/**
 * Input schemas for the brake calculation routes, shared by the server routes and the forms that send them:
 *   POST /api/calculations/hydraulics  -> {@link hydraulicsInputSchema}
 *   POST /api/calculations/wear        -> {@link wearInputSchema}
 *
 * Impossible input fails with a message that names the field, so nothing is computed from half an input.
 * Upper limits are plausibility ranges (common practice) meant to catch unit slips such as a bore typed in inches.
 */
import { z } from 'zod'
import { AXLES } from '../../types/axles'
import { parseTyreSize } from './units'

/** One problem with an input, for a 422 response and for showing next to the form field. */
export interface FieldIssue {
  /** Dotted path of the field, e.g. `axles.front.frictionCoefficient` or `axles.front.pistonDiametersMm[1]`. */
  field: string
  message: string
}

/** Thrown by the compute functions when their input does not pass the schema. */
export class BrakeInputError extends Error {
  readonly issues: FieldIssue[]
  constructor(issues: FieldIssue[]) {
    super(issues.map((i) => `${i.field}: ${i.message}`).join('; '))
    this.name = 'BrakeInputError'
    this.issues = issues
  }
}

/** Turns a zod error into field issues (`a.b[0].c`). */
export function fieldIssues(error: z.ZodError): FieldIssue[] {
  return error.issues.map((issue) => ({
    field:
      issue.path
        .map((p, i) => (typeof p === 'number' ? `[${p}]` : `${i === 0 ? '' : '.'}${String(p)}`))
        .join('') || '(body)',
    message: issue.message,
  }))
}

// ---------------------------------------------------------------------------------------------------------------
// Field builders: each message says which quantity is wrong and what is expected.

function requiredNumber(label: string) {
  return z.number({
    error: (iss) => (iss.input === undefined ? `${label} is required` : `${label} must be a number`),
  })
}

/** A strictly positive quantity with a plausibility ceiling. */
function positive(label: string, unit: string, max: number) {
  return requiredNumber(label)
    .gt(0, { error: `${label} must be greater than 0${unit ? ` ${unit}` : ''}` })
    .max(max, { error: `${label} must be at most ${max}${unit ? ` ${unit}` : ''} (check the unit)` })
}

/** A quantity that may be zero (a worn-out pad measures 0 mm). */
function nonNegative(label: string, unit: string, max: number) {
  return requiredNumber(label)
    .min(0, { error: `${label} can't be negative` })
    .max(max, { error: `${label} must be at most ${max} ${unit} (check the unit)` })
}

function requiredObject<T extends z.ZodRawShape>(label: string, shape: T) {
  return z.object(shape, {
    error: (iss) => (iss.input === undefined ? `${label} is required` : `${label} must be an object`),
  })
}

function enumOf<const T extends readonly [string, ...string[]]>(label: string, values: T) {
  const list = values.map((v) => `"${v}"`).join(' or ')
  return z.enum(values, {
    error: (iss) => (iss.input === undefined ? `${label} is required` : `${label} must be ${list}`),
  })
}

// ---------------------------------------------------------------------------------------------------------------
// Hydraulics

export const CALIPER_TYPES = ['fixed', 'floating'] as const
export const CIRCUIT_SPLITS = ['front-rear', 'diagonal'] as const
export type CaliperType = (typeof CALIPER_TYPES)[number]
export type CircuitSplit = (typeof CIRCUIT_SPLITS)[number]

/** Friction coefficient range accepted: below 0.05 or above 1.0 is not a brake lining (common practice). */
export const FRICTION_COEFFICIENT_RANGE = { min: 0.05, max: 1.0 } as const

const tyreFields = {
  tyreRollingRadiusMm: positive('tyre rolling radius', 'mm', 800).optional(),
  /** Optional metric size code; used for the rolling radius when `tyreRollingRadiusMm` is not given. */
  tyreSize: z
    .string({ error: 'tyre size must be text like "205/55 R16"' })
    .refine((code) => parseTyreSize(code) !== null, {
      error: 'tyre size must be a metric size code like "205/55 R16"',
    })
    .optional(),
  pistonTravelMm: positive('piston travel', 'mm', 10).optional(),
}

export const discAxleSchema = z
  .object({
    kind: z.literal('disc'),
    caliper: enumOf('caliper', CALIPER_TYPES),
    /** Fixed caliper: the pistons of one side. Floating caliper: all its pistons. */
    pistonDiametersMm: z
      .array(positive('caliper piston diameter', 'mm', 100), {
        error: (iss) =>
          iss.input === undefined
            ? 'caliper piston diameters are required'
            : 'caliper piston diameters must be a list of numbers in mm',
      })
      .min(1, { error: 'at least one caliper piston diameter is required' })
      .max(6, { error: 'at most 6 piston diameters per caliper side' }),
    discDiameterMm: positive('disc diameter', 'mm', 600),
    effectiveRadiusMm: positive('effective radius', 'mm', 300).optional(),
    frictionCoefficient: requiredNumber('friction coefficient').refine(
      (mu) => mu >= FRICTION_COEFFICIENT_RANGE.min && mu <= FRICTION_COEFFICIENT_RANGE.max,
      { error: 'friction coefficient must be between 0.05 and 1.0' },
    ),
    ...tyreFields,
  })
  .superRefine((axle, ctx) => {
    const radius = axle.discDiameterMm / 2
    if (axle.effectiveRadiusMm !== undefined && axle.effectiveRadiusMm >= radius) {
      ctx.addIssue({
        code: 'custom',
        path: ['effectiveRadiusMm'],
        message: `effective radius must be smaller than the disc radius (${radius} mm)`,
      })
    }
    axle.pistonDiametersMm.forEach((d, i) => {
      if (d >= radius) {
        ctx.addIssue({
          code: 'custom',
          path: ['pistonDiametersMm', i],
          message: `caliper piston diameter must be smaller than the disc radius (${radius} mm)`,
        })
      }
    })
  })

export const drumAxleSchema = z.object({
  kind: z.literal('drum'),
  wheelCylinderBoreMm: positive('wheel cylinder bore', 'mm', 60),
  drumDiameterMm: positive('drum diameter', 'mm', 600),
  /** Drum drag of both shoes / force of one wheel-cylinder piston (the brake factor C*). */
  brakeFactor: positive('brake factor', '', 15),
  ...tyreFields,
})

/** Builds the AXLE schema with a message naming the axle. */
function axleSchema(label: string) {
  return z.discriminatedUnion('kind', [discAxleSchema, drumAxleSchema], {
    error: (iss) => {
      if (iss.input === undefined) return `${label} is required`
      if (typeof iss.input !== 'object' || iss.input === null || Array.isArray(iss.input)) return `${label} must be an object`
      return `${label} kind must be "disc" or "drum"`
    },
  })
}

export const masterCylinderSchema = requiredObject('master cylinder', {
  boreMm: positive('master cylinder bore', 'mm', 60),
  /** Stroke available before the piston bottoms out. */
  strokeMm: positive('master cylinder stroke', 'mm', 100).optional(),
  /** Tandem (two-circuit) master cylinder. */
  tandem: z.boolean({ error: 'tandem must be true or false' }).optional(),
  /** Number of outlet ports. */
  ports: requiredNumber('ports')
    .int({ error: 'ports must be a whole number' })
    .min(1, { error: 'ports must be at least 1' })
    .max(6, { error: 'ports must be at most 6' })
    .optional(),
  /** The circuit split the outlets are arranged for, when the part data says so. */
  portLayout: enumOf('port layout', CIRCUIT_SPLITS).optional(),
}).superRefine((mc, ctx) => {
  if (mc.tandem === true && mc.ports !== undefined && mc.ports < 2) {
    ctx.addIssue({ code: 'custom', path: ['ports'], message: 'a tandem master cylinder has at least 2 ports' })
  }
})

export const hydraulicsInputSchema = requiredObject('request body', {
  pedalForceN: positive('pedal force', 'N', 2000),
  pedalRatio: positive('pedal ratio', '', 15),
  boosterRatio: requiredNumber('booster ratio')
    .min(1, { error: 'booster ratio must be at least 1 (1 means no booster)' })
    .max(15, { error: 'booster ratio must be at most 15' }),
  masterCylinder: masterCylinderSchema,
  split: enumOf('split', CIRCUIT_SPLITS),
  massKg: positive('vehicle mass', 'kg', 50000).optional(),
  axles: requiredObject('axles', {
    front: axleSchema('front axle'),
    rear: axleSchema('rear axle'),
  }),
  replacement: z
    .object(
      {
        masterCylinder: masterCylinderSchema.optional(),
        axles: z
          .object(
            {
              front: axleSchema('replacement front axle').optional(),
              rear: axleSchema('replacement rear axle').optional(),
            },
            { error: 'replacement axles must be an object' },
          )
          .optional(),
      },
      { error: 'replacement must be an object' },
    )
    .optional(),
})

export type DiscAxle = z.infer<typeof discAxleSchema>
export type DrumAxle = z.infer<typeof drumAxleSchema>
export type Axle = DiscAxle | DrumAxle
export type MasterCylinder = z.infer<typeof masterCylinderSchema>
/** Parsed (validated) hydraulics input. */
export type HydraulicsInput = z.infer<typeof hydraulicsInputSchema>
/** What a caller may send before validation. */
export type HydraulicsInputRaw = z.input<typeof hydraulicsInputSchema>

// ---------------------------------------------------------------------------------------------------------------
// Wear and fluid

export const WHEEL_POSITIONS = ['front-left', 'front-right', 'rear-left', 'rear-right'] as const
export const FLUID_GRADE_NAMES = ['DOT 3', 'DOT 4', 'DOT 5.1', 'DOT 5'] as const
export type WheelPosition = (typeof WHEEL_POSITIONS)[number]
export type FluidGradeName = (typeof FLUID_GRADE_NAMES)[number]

/** Accepts "DOT 4", "dot4", "DOT-5.1" and stores the canonical "DOT 4" / "DOT 5.1". */
function fluidGrade(label: string) {
  return z.preprocess(
    (v) => (typeof v === 'string' ? v.trim().toUpperCase().replace(/^DOT[\s-]*/, 'DOT ') : v),
    enumOf(label, FLUID_GRADE_NAMES),
  )
}

function uniqueBy<T>(label: string, key: (item: T) => string) {
  return (items: T[], ctx: z.RefinementCtx) => {
    const seen = new Set<string>()
    items.forEach((item, i) => {
      const k = key(item)
      if (seen.has(k)) ctx.addIssue({ code: 'custom', path: [i], message: `${label} ${k} is listed twice` })
      seen.add(k)
    })
  }
}

export const discWearSchema = z.object({
  position: enumOf('disc position', WHEEL_POSITIONS),
  /** Micrometer readings around the disc (same radius), mm. */
  thicknessReadingsMm: z
    .array(positive('disc thickness reading', 'mm', 80), { error: 'disc thickness readings must be a list of mm' })
    .min(1, { error: 'at least one disc thickness reading is required' })
    .max(16, { error: 'at most 16 disc thickness readings' }),
  /** Minimum (discard) thickness stamped on the disc or from the vehicle data, mm. */
  minThicknessMm: positive('disc minimum thickness', 'mm', 80),
  /** Measured thickness variation; computed from the readings when not given. */
  thicknessVariationMm: nonNegative('disc thickness variation', 'mm', 5).optional(),
  thicknessVariationLimitMm: positive('disc thickness variation limit', 'mm', 1).optional(),
  /** Lateral runout measured with a dial indicator, mm. */
  runoutMm: nonNegative('disc runout', 'mm', 5).optional(),
  runoutLimitMm: positive('disc runout limit', 'mm', 1).optional(),
})

export const padWearSchema = z.object({
  axle: enumOf('pad axle', AXLES),
  side: enumOf('pad side', ['left', 'right'] as const).optional(),
  /** Friction material left (backing plate excluded), mm. */
  innerMm: nonNegative('inner pad friction material', 'mm', 30),
  outerMm: nonNegative('outer pad friction material', 'mm', 30),
})

export const drumWearSchema = z.object({
  position: enumOf('drum position', WHEEL_POSITIONS),
  diameterMm: positive('drum diameter', 'mm', 600),
  /** Maximum (discard) diameter cast into the drum or from the vehicle data, mm. */
  maxDiameterMm: positive('drum maximum diameter', 'mm', 600),
})

export const fluidCheckSchema = z
  .object(
    {
      gradeInSystem: fluidGrade('grade in system').optional(),
      gradeToAdd: fluidGrade('grade to add').optional(),
      /** Grade the vehicle maker specifies, if known. */
      specifiedGrade: fluidGrade('specified grade').optional(),
      /** Water content from a tester, % by volume or weight as the tester reports. */
      waterPercent: nonNegative('fluid water content', '%', 100).optional(),
    },
    { error: 'fluid must be an object' },
  )
  .refine((f) => f.gradeInSystem !== undefined || f.waterPercent !== undefined, {
    error: 'fluid needs the grade in the system or the water content',
  })

export const wearInputSchema = requiredObject('request body', {
  discs: z
    .array(discWearSchema, { error: 'discs must be a list' })
    .max(4, { error: 'at most 4 discs' })
    .superRefine(uniqueBy('disc', (d) => d.position))
    .default([]),
  pads: z
    .array(padWearSchema, { error: 'pads must be a list' })
    .max(4, { error: 'at most 4 pad entries (one per axle, or per axle side)' })
    .superRefine(uniqueBy('pad', (p) => `${p.axle}${p.side ? ` ${p.side}` : ''}`))
    .default([]),
  drums: z
    .array(drumWearSchema, { error: 'drums must be a list' })
    .max(4, { error: 'at most 4 drums' })
    .superRefine(uniqueBy('drum', (d) => d.position))
    .default([]),
  fluid: fluidCheckSchema.optional(),
}).refine((w) => w.discs.length + w.pads.length + w.drums.length > 0 || w.fluid !== undefined, {
  error: 'nothing to check: give discs, pads, drums or fluid',
})

export type DiscWear = z.infer<typeof discWearSchema>
export type PadWear = z.infer<typeof padWearSchema>
export type DrumWear = z.infer<typeof drumWearSchema>
export type FluidCheck = z.infer<typeof fluidCheckSchema>
export type WearInput = z.infer<typeof wearInputSchema>
export type WearInputRaw = z.input<typeof wearInputSchema>

/** Result of a parse: the data, or the field issues for a 422. */
export type ParseResult<T> = { ok: true; data: T } | { ok: false; issues: FieldIssue[] }

function parserOf<T>(schema: z.ZodType<T>): (body: unknown) => ParseResult<T> {
  return (body) => {
    const r = schema.safeParse(body)
    return r.success ? { ok: true, data: r.data } : { ok: false, issues: fieldIssues(r.error) }
  }
}

/** Validates a hydraulics request body. */
export const parseHydraulicsInput: (body: unknown) => ParseResult<HydraulicsInput> = parserOf(hydraulicsInputSchema)

/** Validates a wear-check request body. */
export const parseWearInput: (body: unknown) => ParseResult<WearInput> = parserOf(wearInputSchema)

/**
 * The validated input of a computation.
 * @throws BrakeInputError (with field issues) when it does not pass: nothing is computed from half an input.
 */
export function validInput<T>(parse: (body: unknown) => ParseResult<T>, raw: unknown): T {
  const parsed = parse(raw)
  if (!parsed.ok) throw new BrakeInputError(parsed.issues)
  return parsed.data
}
