/** Route parameters of the catalogue (`:sku`, vehicle and fitment ids) and how identifiers are compared. */
import { z } from 'zod'

export const SkuSchema = z.string({ error: 'SKU is required' }).trim().toUpperCase()
  .regex(/^[A-Z0-9][A-Z0-9-]{1,38}$/, { error: 'SKU is 2-39 capitals, digits and dashes' })
export const SkuParamsSchema = z.object({ sku: SkuSchema })

export const VehicleIdParamsSchema = z.object({
  id: z.coerce.number({ error: 'vehicle id must be a number' }).int({ error: 'vehicle id must be a whole number' }).positive({ error: 'vehicle id must be positive' }),
})

export const FitmentIdParamsSchema = z.object({
  id: z.coerce.number({ error: 'fitment id must be a number' }).int().positive({ error: 'fitment id must be positive' }),
})

/** Upper case without spaces, dashes, dots or slashes: how OE numbers and SKUs are compared. */
export function normaliseIdentifier(s: string): string {
  return s.toUpperCase().replace(/[^A-Z0-9]/g, '')
}
