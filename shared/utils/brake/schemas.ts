/**
 * Input of POST /api/calculations/hydraulics ({@link hydraulicsInputSchema}), shared by the route and the bore-check
 * form. The wear check's input is in wear-schemas.ts, the brake tester's in brake-test.ts.
 *
 * Impossible input fails with a message that names the field; input far outside what cars have is refused with the
 * range named (schema-fields.ts), so nothing is computed from half an input or from a unit slip.
 */
import { z } from 'zod'
import { parseTyreSize } from './units'
import {
  enumOf, nonNegative, parserOf, ranged, requiredNumber, requiredObject,
  type ParseResult,
} from './schema-fields'

export {
  BrakeInputError, fieldIssues, validInput,
  type FieldIssue, type ParseResult,
} from './schema-fields'

export const CALIPER_TYPES = ['fixed', 'floating'] as const
export const CIRCUIT_SPLITS = ['front-rear', 'diagonal'] as const
/** Drum shoe layouts, each with its own brake factor (shoe-layouts.ts). */
export const SHOE_LAYOUTS = ['leading-trailing', 'two-leading', 'duo-servo'] as const
export type CaliperType = (typeof CALIPER_TYPES)[number]
export type CircuitSplit = (typeof CIRCUIT_SPLITS)[number]
export type ShoeLayout = (typeof SHOE_LAYOUTS)[number]

/** Friction coefficient range accepted: brake linings are about 0.25-0.55; outside 0.1-0.8 is not a lining (common practice). */
export const FRICTION_COEFFICIENT_RANGE = { min: 0.1, max: 0.8 } as const

const tyreFields = {
  tyreRollingRadiusMm: ranged('tyre rolling radius', 'mm', 150, 550).optional(),
  /** Optional metric size code; used for the rolling radius when `tyreRollingRadiusMm` is not given. */
  tyreSize: z
    .string({ error: 'tyre size must be text like "205/55 R16"' })
    .refine((code) => parseTyreSize(code) !== null, {
      error: 'tyre size must be a metric size code like "205/55 R16"',
    })
    .optional(),
  pistonTravelMm: ranged('piston travel', 'mm', 0.05, 5).optional(),
}

export const discAxleSchema = z
  .object({
    kind: z.literal('disc'),
    caliper: enumOf('caliper', CALIPER_TYPES),
    /** Fixed caliper: the pistons of one side. Floating caliper: all its pistons. */
    pistonDiametersMm: z
      .array(ranged('caliper piston diameter', 'mm', 15, 80), {
        error: (iss) =>
          iss.input === undefined
            ? 'caliper piston diameters are required'
            : 'caliper piston diameters must be a list of numbers in mm',
      })
      .min(1, { error: 'at least one caliper piston diameter is required' })
      .max(6, { error: 'at most 6 piston diameters per caliper side' }),
    discDiameterMm: ranged('disc diameter', 'mm', 150, 480),
    /** Typed in from the maker's data: wins over the radius worked out from the pad. */
    effectiveRadiusMm: ranged('effective radius', 'mm', 40, 240).optional(),
    /** Radial height of the pad's friction material (catalogue pad data). */
    padHeightMm: ranged('pad height', 'mm', 20, 110).optional(),
    /** Distance from the disc's outer edge to the pad's outer edge. */
    edgeMarginMm: nonNegative('edge margin', 'mm', 20).optional(),
    frictionCoefficient: requiredNumber('friction coefficient').refine(
      (mu) => mu >= FRICTION_COEFFICIENT_RANGE.min && mu <= FRICTION_COEFFICIENT_RANGE.max,
      { error: `friction coefficient must be between ${FRICTION_COEFFICIENT_RANGE.min} and ${FRICTION_COEFFICIENT_RANGE.max} (brake linings are about 0.25-0.55)` },
    ),
    ...tyreFields,
  })
  .superRefine((axle, ctx) => {
    const radius = axle.discDiameterMm / 2
    if (axle.effectiveRadiusMm !== undefined && axle.effectiveRadiusMm >= radius) {
      ctx.addIssue({ code: 'custom', path: ['effectiveRadiusMm'], message: `effective radius must be smaller than the disc radius (${radius} mm)` })
    }
    axle.pistonDiametersMm.forEach((d, i) => {
      if (d >= radius) {
        ctx.addIssue({ code: 'custom', path: ['pistonDiametersMm', i], message: `caliper piston diameter must be smaller than the disc radius (${radius} mm)` })
      }
    })
    if (axle.padHeightMm !== undefined) {
      // a pad whose inner edge reaches the hub is not a pad on this disc (the hat and bolt circle sit there)
      const inner = radius - (axle.edgeMarginMm ?? 0) - axle.padHeightMm
      if (inner < 0.3 * radius) {
        ctx.addIssue({
          code: 'custom', path: ['padHeightMm'],
          message: `pad height leaves the pad's inner edge ${Math.round(inner)} mm from the centre of a ${axle.discDiameterMm} mm disc: check the pad height and the disc diameter`,
        })
      }
    }
  })

export const drumAxleSchema = z.object({
  kind: z.literal('drum'),
  wheelCylinderBoreMm: ranged('wheel cylinder bore', 'mm', 10, 40),
  drumDiameterMm: ranged('drum diameter', 'mm', 150, 420),
  /** Shoe layout; its typical brake factor is used when none is typed in. */
  shoeLayout: enumOf('shoe layout', SHOE_LAYOUTS).optional(),
  /** Drum drag of both shoes / force of one wheel-cylinder piston (the brake factor C*); wins over the layout's. */
  brakeFactor: ranged('brake factor', '', 0.5, 10).optional(),
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
  boreMm: ranged('master cylinder bore', 'mm', 14, 38),
  /** Stroke available before the piston bottoms out. */
  strokeMm: ranged('master cylinder stroke', 'mm', 10, 60).optional(),
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

/** Mass, centre of gravity and static front share: one load state of the vehicle. */
const loadStateFields = {
  massKg: ranged('vehicle mass', 'kg', 400, 4500),
  cogHeightMm: ranged('centre of gravity height', 'mm', 250, 1300),
  frontStaticSharePercent: ranged('static front axle share', '%', 30, 75),
}

/**
 * A rear pressure-limiting valve: rear line pressure follows the master cylinder up to the knee, then rises by
 * `slope` per unit of master cylinder pressure. A load-sensing valve has a higher knee laden.
 */
export const rearValveSchema = requiredObject('rear valve', {
  kneeKPa: ranged('valve knee pressure', 'kPa', 500, 15000),
  slope: ranged('valve slope', '', 0.05, 1),
  ladenKneeKPa: ranged('laden valve knee pressure', 'kPa', 500, 15000).optional(),
})

export const vehicleSchema = requiredObject('vehicle', {
  ...loadStateFields,
  wheelbaseMm: ranged('wheelbase', 'mm', 1700, 4500),
  /** The vehicle at its gross (laden) mass; the wheelbase is the same. */
  laden: requiredObject('laden state', loadStateFields).optional(),
  rearValve: rearValveSchema.optional(),
  /** ABS with electronic brake-force distribution: it holds the rear below locking while it works. */
  electronicDistribution: z.boolean({ error: 'electronic distribution must be true or false' }).optional(),
}).superRefine((v, ctx) => {
  if (v.cogHeightMm >= 0.5 * v.wheelbaseMm) {
    ctx.addIssue({ code: 'custom', path: ['cogHeightMm'], message: 'centre of gravity height must be under half the wheelbase (check the figures)' })
  }
  if (v.laden && v.laden.massKg < v.massKg) {
    ctx.addIssue({ code: 'custom', path: ['laden', 'massKg'], message: `laden mass must be at least the unladen mass (${v.massKg} kg)` })
  }
})

export const hydraulicsInputSchema = requiredObject('request body', {
  pedalForceN: ranged('pedal force', 'N', 10, 1000),
  pedalRatio: ranged('pedal ratio', '', 1.5, 10),
  boosterRatio: requiredNumber('booster ratio')
    .min(1, { error: 'booster ratio must be at least 1 (1 means no booster)' })
    .max(12, { error: 'booster ratio must be between 1 and 12' }),
  /** Line pressure at which the vacuum booster runs out of assistance (its knee). */
  boosterRunOutKPa: ranged('booster run-out pressure', 'kPa', 2000, 20000).optional(),
  /** Peak tyre-road friction coefficient the deceleration is capped by. */
  tyreRoadFriction: ranged('tyre-road friction', '', 0.1, 1.2).optional(),
  masterCylinder: masterCylinderSchema,
  split: enumOf('split', CIRCUIT_SPLITS),
  /** Vehicle mass when no `vehicle` is given (deceleration only, no balance figures). */
  massKg: ranged('vehicle mass', 'kg', 400, 4500).optional(),
  vehicle: vehicleSchema.optional(),
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
}).superRefine((input, ctx) => {
  if (input.massKg !== undefined && input.vehicle && input.massKg !== input.vehicle.massKg) {
    ctx.addIssue({ code: 'custom', path: ['massKg'], message: `vehicle mass is given twice (${input.massKg} kg and vehicle ${input.vehicle.massKg} kg): give it once` })
  }
})

export type DiscAxle = z.infer<typeof discAxleSchema>
export type DrumAxle = z.infer<typeof drumAxleSchema>
export type Axle = DiscAxle | DrumAxle
export type MasterCylinder = z.infer<typeof masterCylinderSchema>
export type VehicleData = z.infer<typeof vehicleSchema>
export type RearValve = z.infer<typeof rearValveSchema>
/** Parsed (validated) hydraulics input. */
export type HydraulicsInput = z.infer<typeof hydraulicsInputSchema>
/** What a caller may send before validation. */
export type HydraulicsInputRaw = z.input<typeof hydraulicsInputSchema>

/** Validates a hydraulics request body. */
export const parseHydraulicsInput: (body: unknown) => ParseResult<HydraulicsInput> = parserOf(hydraulicsInputSchema)
