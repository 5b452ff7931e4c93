/**
 * Inspection inputs and answers, shared by the routes under /api/inspections and the inspection form.
 * The measured values themselves (`wear`) are the POST /api/calculations/wear body, validated by the brake
 * library's own schema (shared/utils/brake/schemas.ts) so the two can never disagree.
 */
import { z } from 'zod'
import type { PartType, RecommendedPart, WearInput, WearResult } from '../utils/brake'
import { WHEEL_POSITIONS } from '../utils/brake/wear-schemas'
import { QualifiersSchema } from './parts'
import { PageQuerySchema } from './page'

/** Wear-check part types -> catalogue part types (parts.type). */
export const CATALOGUE_TYPE_OF: Record<PartType, string> = {
  discs: 'disc',
  pads: 'pad_set',
  drums: 'drum',
  shoes: 'shoe_set',
  'brake-fluid': 'fluid',
  hoses: 'hose',
  calipers: 'caliper',
  'wheel-cylinders': 'wheel_cylinder',
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

/** What a photo can show: the part of the wheel (or of the system) a finding is about (WearSubject). */
export const PHOTO_SUBJECTS = ['disc', 'pads', 'drum', 'shoes', 'hose', 'pipe', 'caliper', 'wheel-cylinder', 'leak', 'parking-brake', 'fluid'] as const
export const PHOTO_POSITIONS = [...WHEEL_POSITIONS, 'system'] as const
export type PhotoSubject = (typeof PHOTO_SUBJECTS)[number]
export type PhotoPosition = (typeof PHOTO_POSITIONS)[number]

/** Photos are resized in the browser to at most `maxEdgePx` before upload; the server refuses more than `maxBytes`. */
export const PHOTO_LIMITS = { maxBytes: 4 * 1024 * 1024, maxEdgePx: 1600, perInspection: 24 } as const

/** The text fields beside the file of POST /api/inspections/:id/photos (multipart). */
export const InspectionPhotoFieldsSchema = z.object({
  position: z.enum(PHOTO_POSITIONS, { error: 'Choose the wheel the photo shows.' }),
  subject: z.enum(PHOTO_SUBJECTS, { error: 'Choose what the photo shows.' }),
  caption: z.string({ error: 'Caption must be text.' }).trim().max(140, 'Caption is at most 140 characters.').default(''),
}).strict()

/** GET / DELETE /api/inspections/:id/photos/:photoId */
export const InspectionPhotoParamsSchema = z.object({ id: z.coerce.number().int().positive(), photoId: z.coerce.number().int().positive() })

export interface InspectionPhotoView {
  id: number
  position: PhotoPosition
  subject: PhotoSubject
  caption: string
  bytes: number
  createdAt: string
  /** Where the garage reads it. */
  url: string
}

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
  photos: InspectionPhotoView[]
}
