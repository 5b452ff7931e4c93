/**
 * Input of POST /api/calculations/wear ({@link wearInputSchema}), which is also the `wear` of an inspection: what
 * a technician measures and sees at each wheel (discs, pads inner and outer, drums, shoe linings, hoses, pipes,
 * calipers, wheel cylinders, leaks), the parking brake, the brake fluid and the roller brake tester's readings.
 */
import { z } from 'zod'
import { AXLES } from '../../types/axles'
import { brakeTestObject } from './brake-test'
import { enumOf, nonNegative, parserOf, ranged, requiredObject, uniqueBy, type ParseResult } from './schema-fields'

export const WHEEL_POSITIONS = ['front-left', 'front-right', 'rear-left', 'rear-right'] as const
/** The FMVSS No. 116 grades and ISO 4925 class 6 (a low-viscosity glycol fluid). */
export const FLUID_GRADE_NAMES = ['DOT 3', 'DOT 4', 'DOT 5.1', 'DOT 5', 'ISO 4925 Class 6'] as const
/** What a technician looks at besides the friction parts, per wheel (or for the whole system). */
export const CONDITION_ITEMS = ['hose', 'pipe', 'caliper', 'wheel-cylinder', 'leak', 'parking-brake'] as const
export const CONDITION_STATES = ['ok', 'advise', 'fail'] as const
export type WheelPosition = (typeof WHEEL_POSITIONS)[number]
export type FluidGradeName = (typeof FLUID_GRADE_NAMES)[number]
export type ConditionItem = (typeof CONDITION_ITEMS)[number]

/** Accepts "DOT 4", "dot4", "DOT-5.1", "class 6", "ISO 4925 class 6" and stores the canonical name. */
function fluidGrade(label: string) {
  return z.preprocess((v) => {
    if (typeof v !== 'string') return v
    const t = v.trim().toUpperCase()
    if (/^(ISO\s*4925\s*)?CLASS\s*6$/.test(t)) return 'ISO 4925 Class 6'
    return t.replace(/^DOT[\s-]*/, 'DOT ')
  }, enumOf(label, FLUID_GRADE_NAMES))
}

export const discWearSchema = z.object({
  position: enumOf('disc position', WHEEL_POSITIONS),
  /** Micrometer readings around the disc (same radius), mm. */
  thicknessReadingsMm: z
    .array(ranged('disc thickness reading', 'mm', 3, 60), { error: 'disc thickness readings must be a list of mm' })
    .min(1, { error: 'at least one disc thickness reading is required' })
    .max(16, { error: 'at most 16 disc thickness readings' }),
  /** Discard (minimum) thickness stamped on the disc or from the vehicle data, mm. */
  minThicknessMm: ranged('disc minimum thickness', 'mm', 3, 60),
  /** The thinnest a disc may be machined to (the maker's refinish limit), mm: above the discard thickness. */
  refinishMinThicknessMm: ranged('disc refinish minimum', 'mm', 3, 60).optional(),
  /** Thickness variation measured with a micrometer; worked out from the readings when not given. */
  thicknessVariationMm: nonNegative('disc thickness variation', 'mm', 5).optional(),
  thicknessVariationLimitMm: ranged('disc thickness variation limit', 'mm', 0.001, 1).optional(),
  /** Lateral runout measured with a dial indicator, mm. */
  runoutMm: nonNegative('disc runout', 'mm', 5).optional(),
  runoutLimitMm: ranged('disc runout limit', 'mm', 0.005, 1).optional(),
}).superRefine((d, ctx) => {
  if (d.refinishMinThicknessMm !== undefined && d.refinishMinThicknessMm <= d.minThicknessMm) {
    ctx.addIssue({ code: 'custom', path: ['refinishMinThicknessMm'], message: `disc refinish minimum must be more than the discard thickness (${d.minThicknessMm} mm)` })
  }
})

export const padWearSchema = z.object({
  axle: enumOf('pad axle', AXLES),
  /** The wheel: pads are judged per wheel; without a side, for the axle. */
  side: enumOf('pad side', ['left', 'right'] as const).optional(),
  /** Friction material left (backing plate excluded), mm. */
  innerMm: nonNegative('inner pad friction material', 'mm', 30),
  outerMm: nonNegative('outer pad friction material', 'mm', 30),
})

export const drumWearSchema = z.object({
  position: enumOf('drum position', WHEEL_POSITIONS),
  diameterMm: ranged('drum diameter', 'mm', 150, 420),
  /** Maximum (discard) diameter cast into the drum or from the vehicle data, mm. */
  maxDiameterMm: ranged('drum maximum diameter', 'mm', 150, 420),
  /** How far under its maximum a drum must stay to be machined, mm. */
  machiningAllowanceMm: ranged('drum machining allowance', 'mm', 0.1, 3).optional(),
})

export const shoeWearSchema = z.object({
  position: enumOf('shoe position', WHEEL_POSITIONS),
  /** Lining left on the thinnest shoe (above the shoe table or rivet heads), mm. */
  liningMm: nonNegative('shoe lining', 'mm', 15),
})

export const conditionSchema = z.object({
  position: enumOf('position', [...WHEEL_POSITIONS, 'system'] as const),
  item: enumOf('item', CONDITION_ITEMS),
  state: enumOf('state', CONDITION_STATES),
  note: z.string({ error: 'note must be text' }).trim().max(200, { error: 'note is at most 200 characters' }).optional(),
})

export const fluidCheckSchema = z
  .object(
    {
      gradeInSystem: fluidGrade('grade in system').optional(),
      gradeToAdd: fluidGrade('grade to add').optional(),
      /** Grade the vehicle maker specifies, if known. */
      specifiedGrade: fluidGrade('specified grade').optional(),
      /** Water content from a tester, % as the tester reports. */
      waterPercent: nonNegative('fluid water content', '%', 100).optional(),
      /** Boiling point read by a boiling-point tester, °C. */
      boilingPointC: ranged('fluid boiling point', '°C', 80, 330).optional(),
      /** Time since the fluid was last changed, months. */
      ageMonths: nonNegative('fluid age', 'months', 360).int({ error: 'fluid age must be whole months' }).optional(),
    },
    { error: 'fluid must be an object' },
  )
  .refine((f) => f.gradeInSystem !== undefined || f.waterPercent !== undefined || f.boilingPointC !== undefined || f.ageMonths !== undefined, {
    error: 'fluid needs the grade in the system, the water content, the boiling point or its age',
  })
  .refine((f) => f.boilingPointC === undefined || f.gradeInSystem !== undefined, {
    path: ['gradeInSystem'], error: 'a boiling point is judged against the grade in the system: give the grade',
  })

export const wearInputSchema = requiredObject('request body', {
  discs: z
    .array(discWearSchema, { error: 'discs must be a list' })
    .max(4, { error: 'at most 4 discs' })
    .superRefine(uniqueBy('disc', (d) => d.position))
    .default([]),
  pads: z
    .array(padWearSchema, { error: 'pads must be a list' })
    .max(4, { error: 'at most 4 pad entries (one per wheel, or per axle)' })
    .superRefine(uniqueBy('pad', (p) => `${p.axle}${p.side ? ` ${p.side}` : ''}`))
    .default([]),
  drums: z
    .array(drumWearSchema, { error: 'drums must be a list' })
    .max(4, { error: 'at most 4 drums' })
    .superRefine(uniqueBy('drum', (d) => d.position))
    .default([]),
  shoes: z
    .array(shoeWearSchema, { error: 'shoes must be a list' })
    .max(4, { error: 'at most 4 shoe entries' })
    .superRefine(uniqueBy('shoes', (s) => s.position))
    .default([]),
  conditions: z
    .array(conditionSchema, { error: 'conditions must be a list' })
    .max(40, { error: 'at most 40 condition entries' })
    .superRefine(uniqueBy('condition', (c) => `${c.position} ${c.item}`))
    .default([]),
  fluid: fluidCheckSchema.optional(),
  brakeTest: brakeTestObject('brake test').optional(),
}).refine((w) => w.discs.length + w.pads.length + w.drums.length + w.shoes.length + w.conditions.length > 0 || w.fluid !== undefined || w.brakeTest !== undefined, {
  error: 'nothing to check: give discs, pads, drums, shoes, conditions, fluid or brake tester readings',
})

export type DiscWear = z.infer<typeof discWearSchema>
export type PadWear = z.infer<typeof padWearSchema>
export type DrumWear = z.infer<typeof drumWearSchema>
export type ShoeWear = z.infer<typeof shoeWearSchema>
export type ConditionCheck = z.infer<typeof conditionSchema>
export type FluidCheck = z.infer<typeof fluidCheckSchema>
export type WearInput = z.infer<typeof wearInputSchema>
export type WearInputRaw = z.input<typeof wearInputSchema>

/** Validates a wear-check request body. */
export const parseWearInput: (body: unknown) => ParseResult<WearInput> = parserOf(wearInputSchema)
