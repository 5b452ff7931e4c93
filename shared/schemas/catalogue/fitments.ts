/** Fitment bodies (POST /api/parts/:sku/fitments, PATCH /api/fitments/:id) and the option qualifiers they carry. */
import { z } from 'zod'
import { int, note, oneOf } from './fields'
import { FitmentAxleSchema, SIDES } from './part-types'

const qualifierKey = z.string().regex(/^[a-z][a-z0-9_]{0,59}$/, { error: 'option keys are lower case words joined by _' })
/** `{ option key: value }`: the vehicle options a fitment (or an inspection's answers) depends on. */
export const QualifiersSchema = z.record(qualifierKey, z.string().trim().min(1, { error: 'option value is required' }).max(60), { error: 'qualifiers must be an object of option values' })

export const FitmentInputSchema = z.object({
  vehicleId: z.number({ error: 'vehicle is required' }).int().positive({ error: 'vehicle is required' }),
  axle: FitmentAxleSchema,
  side: oneOf('side', SIDES).default('pair'),
  quantity: int('quantity', 1, 8).default(1),
  qualifiers: QualifiersSchema.default({}),
  note: note('note', 240).default(''),
})
export type FitmentInput = z.infer<typeof FitmentInputSchema>

export const FitmentPatchSchema = z.object({
  axle: FitmentAxleSchema.optional(),
  side: oneOf('side', SIDES).optional(),
  quantity: int('quantity', 1, 8).optional(),
  qualifiers: QualifiersSchema.optional(),
  note: note('note', 240).optional(),
}).strict().refine((b) => Object.keys(b).length > 0, { error: 'nothing to change' })
