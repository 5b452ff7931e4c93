/** Inputs of the job card, labour guide, part relation and owner invoice routes. */
import { z } from 'zod'
import { JOB_CHECK_KEYS } from '../utils/jobs/checks'
import { LABOUR_OPERATIONS } from '../utils/jobs/labour'
import { PART_RELATION_KINDS } from '../utils/jobs/relations'
import { PageQuerySchema } from './page'

/** POST /api/quotes/:id/job-card/complete */
export const JobCompleteSchema = z.strictObject({
  odometer: z.number({ error: 'Enter the odometer reading (a whole number).' }).int('The odometer reading is a whole number.')
    .min(0, 'The odometer reading cannot be negative.').max(2_000_000, 'That odometer reading is too large.'),
  checks: z.array(z.enum(JOB_CHECK_KEYS, { error: 'Unknown check.' }), { error: 'Tick the checks.' }).max(20),
})
export type JobCompleteInput = z.output<typeof JobCompleteSchema>

const operation = z.enum(LABOUR_OPERATIONS, { error: `Operation is one of ${LABOUR_OPERATIONS.join(', ')}.` })

/** GET /api/labour-times?vehicleId=&operation= */
export const LabourTimesQuerySchema = PageQuerySchema.extend({
  vehicleId: z.coerce.number({ error: 'Choose the vehicle.' }).int({ error: 'Choose the vehicle.' }).positive({ error: 'Choose the vehicle.' }),
  operation: z.preprocess((v) => (v === '' ? undefined : v), operation.optional()),
})

/** PUT /api/labour-times: the guide's hours (distributor) or the garage's own (garage manager; null: back to the guide) */
export const LabourTimeSetSchema = z.strictObject({
  vehicleId: z.number({ error: 'Choose the vehicle.' }).int().positive({ error: 'Choose the vehicle.' }),
  operation,
  hours: z.number({ error: 'Hours must be a number.' }).positive('Hours must be more than 0.').max(40, 'At most 40 hours for one operation.')
    .refine((h) => Number.isInteger(Math.round(h * 100)) && Math.abs(h * 100 - Math.round(h * 100)) < 1e-6, { error: 'Hours take at most two decimals.' }).nullable(),
})
export type LabourTimeSetInput = z.output<typeof LabourTimeSetSchema>

/** PUT /api/parts/:sku/relations */
export const PartRelationsSchema = z.strictObject({
  relations: z.array(z.strictObject({
    sku: z.string({ error: 'Enter the SKU.' }).trim().min(1, 'Enter the SKU.').max(40, 'A SKU is at most 40 characters.'),
    relation: z.enum(PART_RELATION_KINDS, { error: `Relation is one of ${PART_RELATION_KINDS.join(', ')}.` }),
    quantity: z.number({ error: 'Quantity must be a number.' }).int('Quantity is a whole number.').min(1, 'Quantity is at least 1.').max(20, 'Quantity is at most 20.'),
    byFluidVolume: z.boolean().optional(),
    reason: z.string({ error: 'Say why it is needed.' }).trim().min(3, 'Say why it is needed.').max(300, 'At most 300 characters.'),
  })).max(20, 'At most 20 related parts.'),
})
export type PartRelationsInput = z.output<typeof PartRelationsSchema>

/** POST /api/garage/invoices/:invoice/payments */
export const OwnerPaymentSchema = z.strictObject({
  method: z.enum(['cash', 'card', 'transfer'], { error: 'Paid by cash, card or transfer.' }),
  amountMinor: z.number({ error: 'Enter the amount.' }).int('Enter the amount in minor units.').positive('The amount is more than 0.').max(100_000_000, 'That amount is too large.'),
  reference: z.string().trim().max(80, 'At most 80 characters.').default(''),
})
export type OwnerPaymentInput = z.output<typeof OwnerPaymentSchema>

export const OwnerInvoiceParamsSchema = z.object({
  invoice: z.string().regex(/^[0-9]{1,12}(\.pdf)?$/, 'Not an invoice number.'),
})

/** GET /api/parts/:sku?vehicleId= (also needed: quantities for that vehicle) */
export const AlsoNeededQuerySchema = z.object({
  vehicleId: z.preprocess((v) => (v === '' ? undefined : v), z.coerce.number({ error: 'Not a vehicle number.' }).int().positive().optional()),
})
