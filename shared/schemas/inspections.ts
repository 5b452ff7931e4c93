/**
 * Inspection inputs and answers, shared by the routes under /api/inspections and the inspection form.
 * The measured values themselves (`wear`) are the POST /api/calculations/wear body, validated by the brake
 * library's own schema (shared/utils/brake/schemas.ts) so the two can never disagree.
 */
import { z } from 'zod'
import type { PartType, RecommendedPart, WearInput, WearResult } from '../utils/brake'
import { QualifiersSchema } from './parts'
import { PageQuerySchema } from './page'

/** Wear-check part types -> catalogue part types (parts.type). */
export const CATALOGUE_TYPE_OF: Record<PartType, string> = {
  discs: 'disc',
  pads: 'pad_set',
  drums: 'drum',
  shoes: 'shoe_set',
  'brake-fluid': 'fluid',
}

/** POST /api/inspections */
export const InspectionCreateSchema = z
  .object({
    vehicleId: z.number({ error: 'Choose the vehicle.' }).int().positive({ error: 'Choose the vehicle.' }),
    registration: z.string({ error: 'Registration must be text.' }).trim().max(20, 'Registration is at most 20 characters.').default(''),
    odometer: z.string({ error: 'Odometer must be text.' }).trim().max(20, 'Odometer is at most 20 characters.').default(''),
    /** Answers to the vehicle's option questions (`{ front_disc_diameter_mm: "300" }`). */
    answers: QualifiersSchema.default({}),
    /** The garage's own record of the car (GET /api/garage/vehicles/:id), when the inspection is of one. */
    garageVehicleId: z.number({ error: 'Choose the vehicle record.' }).int().positive({ error: 'Choose the vehicle record.' }).nullish(),
    /** The wear-check body; validated by parseWearInput, errors keyed `wear.<path>`. */
    wear: z.unknown(),
  })
  .strict()
export type InspectionCreateInput = z.input<typeof InspectionCreateSchema>

/** GET /api/inspections: one page of the garage's inspections, optionally of one vehicle. */
export const InspectionListQuerySchema = PageQuerySchema.extend({
  vehicleId: z.coerce.number().int().positive().optional(),
})
export type InspectionListQuery = z.infer<typeof InspectionListQuerySchema>

/** GET /api/inspections/:id */
export const InspectionParamsSchema = z.object({ id: z.coerce.number().int().positive() })

/** One catalogue part that fits the vehicle for a recommendation. */
export interface RecommendedCataloguePart {
  partId: number
  sku: string
  description: string
  type: string
  productLine: string
  axle: string
  side: string
  quantity: number
  note: string
  /** Set when the fitment depends on an option the inspection did not answer, e.g. "if Front disc is 300 mm". */
  condition: string | null
}

/** A recommended part type (from the wear verdicts) with the catalogue parts that fit this vehicle. */
export interface InspectionRecommendation extends RecommendedPart {
  catalogueType: string
  parts: RecommendedCataloguePart[]
}

export interface InspectionSummary {
  id: number
  vehicleId: number
  vehicle: string
  registration: string
  odometer: string
  overall: 'ok' | 'advise' | 'fail'
  author: string
  createdAt: string
  recommendedCount: number
}

export interface InspectionDetail extends InspectionSummary {
  answers: Record<string, string>
  wearInput: WearInput
  result: WearResult
  recommendedParts: InspectionRecommendation[]
}
