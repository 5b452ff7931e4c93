/** Inputs of the return routes, shared by the routes and the return forms. Strict: unknown fields are refused by name. */
import { z } from 'zod'
import { RETURN_REASONS, RETURN_STATUSES } from '../types/returns'
import { PageQuerySchema } from './page'

const day = (what: string) => z.string({ error: `Enter ${what} as YYYY-MM-DD.` }).regex(/^\d{4}-\d{2}-\d{2}$/, `Enter ${what} as YYYY-MM-DD.`)
  .refine((d) => !Number.isNaN(Date.parse(`${d}T00:00:00Z`)) && new Date(`${d}T00:00:00Z`).toISOString().slice(0, 10) === d, 'That date does not exist.')

/** POST /api/returns */
export const ReturnRequestSchema = z.object({
  orderLineId: z.number({ error: 'Choose the order line.' }).int().positive({ error: 'Choose the order line.' }),
  quantity: z.number({ error: 'Enter how many go back.' }).int('Enter a whole number.').min(1, 'Return at least 1.').max(999),
  reason: z.enum(RETURN_REASONS, { error: 'Choose why the part goes back.' }),
  note: z.string({ error: 'The note must be text.' }).trim().max(500, 'The note is at most 500 characters.').default(''),
  /** faulty parts: when it was fitted, the mileage then, and what is wrong */
  fittedOn: day('the date it was fitted').optional(),
  mileage: z.number({ error: 'Enter the mileage in miles.' }).int('Enter the mileage in whole miles.').min(0, 'The mileage cannot be negative.').max(2_000_000, 'That mileage is too high.').optional(),
  fault: z.string({ error: 'Describe the fault.' }).trim().max(1000, 'At most 1000 characters.').optional(),
}).strict().superRefine((v, ctx) => {
  if (v.reason !== 'faulty') return
  if (!v.fittedOn) ctx.addIssue({ code: 'custom', path: ['fittedOn'], message: 'Enter the date the part was fitted.' })
  if (v.mileage === undefined) ctx.addIssue({ code: 'custom', path: ['mileage'], message: 'Enter the mileage when it was fitted, in miles.' })
  if (!v.fault || v.fault.length < 10) ctx.addIssue({ code: 'custom', path: ['fault'], message: 'Describe the fault (at least 10 characters).' })
})
export type ReturnRequestInput = z.infer<typeof ReturnRequestSchema>

export const ReturnParamsSchema = z.object({ id: z.coerce.number().int().positive() })
export const ReturnPhotoParamsSchema = z.object({ id: z.coerce.number().int().positive(), photoId: z.coerce.number().int().positive() })

/** GET /api/returns and GET /api/counter/returns: ?status=&page=&pageSize= */
export const ReturnListQuerySchema = PageQuerySchema.extend({
  status: z.enum(RETURN_STATUSES, { error: `status must be one of: ${RETURN_STATUSES.join(', ')}` }).optional(),
})
export type ReturnListQuery = z.infer<typeof ReturnListQuerySchema>

/**
 * PATCH /api/counter/returns/:id: the counter received the goods. `quantity` is how many are accepted (all when
 * left out); accepting fewer than were sent, or none, needs the reason the garage reads.
 */
export const ReturnDecisionSchema = z.object({
  status: z.enum(['accepted', 'rejected'], { error: 'status must be accepted or rejected.' }),
  quantity: z.number({ error: 'Enter how many are accepted.' }).int('Enter a whole number.').min(1, 'Accept at least 1, or turn the return down.').optional(),
  reason: z.string({ error: 'The reason must be text.' }).trim().max(300, 'The reason is at most 300 characters.').default(''),
}).strict().refine((v) => v.status !== 'rejected' || v.reason.length >= 3, { path: ['reason'], message: 'Say why the return is not accepted.' })
export type ReturnDecisionInput = z.infer<typeof ReturnDecisionSchema>

export const RETURN_PHOTO_FIELD = 'photo'
export const RETURN_PHOTO_MAX_BYTES = 8 * 1024 * 1024
export const RETURN_PHOTOS_MAX = 4
