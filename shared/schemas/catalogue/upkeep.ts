/** Bodies of the counter staff's part upkeep: POST /api/parts, PATCH /api/parts/:sku, POST /api/parts/:sku/supersede. */
import { z } from 'zod'
import { note, oneOf, text } from './fields'
import { SkuSchema } from './params'
import { PartTypeSchema } from './part-types'

export const OeNumberInputSchema = z.object({
  oeNumber: z.string({ error: 'OE number is required' }).trim().min(2, { error: 'OE number is too short' }).max(40, { error: 'OE number is at most 40 characters' })
    .regex(/^[A-Za-z0-9 .\-/]+$/, { error: 'OE number may hold letters, digits, spaces, dots, dashes and slashes' }),
  maker: note('maker', 60).default(''),
})

const description = text('description', 300)
const productLine = z.string({ error: 'product line must be text' }).trim().max(60, { error: 'product line is at most 60 characters' })
/** The whole specification; checked against the part type's schema by the service, which knows the type. */
const specs = z.record(z.string(), z.unknown(), { error: 'specs must be an object' })
const oeNumbers = z.array(OeNumberInputSchema).max(40, { error: 'at most 40 OE numbers' })

export const PartCreateSchema = z.object({
  sku: SkuSchema,
  type: PartTypeSchema,
  productLine: productLine.default(''),
  description,
  specs,
  oeNumbers: oeNumbers.default([]),
})
export type PartCreateInput = z.infer<typeof PartCreateSchema>

export const PartPatchSchema = z.object({
  productLine: productLine.optional(),
  description: description.optional(),
  status: oneOf('status', ['active', 'discontinued'] as const).optional(),
  specs: specs.optional(),
  oeNumbers: oeNumbers.optional(),
}).strict().refine((b) => Object.keys(b).length > 0, { error: 'nothing to change' })
export type PartPatchInput = z.infer<typeof PartPatchSchema>

export const SupersedeSchema = z.object({
  newSku: SkuSchema,
  note: note('note', 240).default(''),
})

/** PATCH /api/vehicles/:id: what counter staff record about a catalogued vehicle (null: not known). */
export const VehiclePatchSchema = z.object({
  steeringSide: z.enum(['left', 'right'], { error: 'steering side is left, right or not recorded' }).nullable(),
}, { error: 'send the vehicle\'s steering side' })
export type VehiclePatchInput = z.infer<typeof VehiclePatchSchema>
