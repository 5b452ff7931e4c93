/**
 * Inputs of the order, payment, core-return and statement routes, shared by the routes and the forms that
 * send them. Strict objects: an unknown field is refused by name (no mass assignment of prices or states).
 */
import { z } from 'zod'
import { CORE_RETURN_STATUSES, FULFILMENTS, ORDER_STATUSES } from '../types/orders'
import { PageQuerySchema } from './page'

const reason = z.string({ error: 'The reason must be text.' }).trim().max(300, 'The reason is at most 300 characters.').default('')
const note = z.string({ error: 'The note must be text.' }).trim().max(300, 'The note is at most 300 characters.').default('')
const id = (what: string) => z.number({ error: `Choose the ${what}.` }).int().positive({ error: `Choose the ${what}.` })

export const MAX_ORDER_LINES = 100
export const MAX_LINE_QUANTITY = 999

const fulfilment = z.enum(FULFILMENTS, { error: 'Choose to send what is here now, or to wait and send everything together.' })

/** A quantity of one part: a whole number from 1 to 999 (the basket says why beside the field otherwise). */
export const LineQuantitySchema = z.number({ error: 'Quantity must be a whole number.' }).int('Quantity must be a whole number.')
  .min(1, 'Order at least 1.').max(MAX_LINE_QUANTITY, `At most ${MAX_LINE_QUANTITY} of one part per order.`)

const sku = z.string({ error: 'Enter the part number.' }).trim().min(1, 'Enter the part number.').max(40, 'Part numbers are at most 40 characters.')

export const OrderLineInputSchema = z.object({
  sku,
  quantity: LineQuantitySchema,
  /** for a line that cannot all go at once (default: the order's choice) */
  fulfilment: fulfilment.optional(),
}).strict()

const orderBase = z.object({
  quoteId: id('quote').optional(),
  lines: z.array(OrderLineInputSchema, { error: 'lines must be a list of { sku, quantity }.' })
    .max(MAX_ORDER_LINES, `At most ${MAX_ORDER_LINES} lines per order.`).optional(),
  /** the branch that supplies the order; the garage's home branch when left out */
  branchId: id('branch').optional(),
  /** what to do with lines that cannot all go at once: send what is here (default), or wait for everything */
  fulfilment: fulfilment.default('ship_available'),
  /** collect from the branch's counter instead of waiting for a delivery run */
  collect: z.boolean({ error: 'Say whether the order is collected.' }).default(false),
  payment: z.enum(['card', 'account'], { error: 'Choose card or trade account.' }),
  garageReference: z.string({ error: 'Your reference must be text.' }).trim().max(60, 'Your reference is at most 60 characters.').default(''),
}).strict()

function oneSource(v: { quoteId?: number; lines?: unknown[] }, ctx: z.RefinementCtx) {
  if (v.quoteId !== undefined && v.lines !== undefined) {
    ctx.addIssue({ code: 'custom', path: ['lines'], message: 'Order either a quote\'s approved lines or a basket, not both.' })
  } else if (v.quoteId === undefined && (!v.lines || v.lines.length === 0)) {
    ctx.addIssue({ code: 'custom', path: ['lines'], message: 'Add at least one part, or order from a quote.' })
  }
}

/** POST /api/orders */
export const OrderCreateSchema = orderBase.superRefine(oneSource)
export type OrderCreateInput = z.input<typeof OrderCreateSchema>

/** POST /api/orders/preview: the same body; `payment` may be left open while the garage decides. */
export const OrderPreviewSchema = orderBase.extend({ payment: orderBase.shape.payment.optional() }).superRefine(oneSource)

/** The optional `Idempotency-Key` header of POST /api/orders. */
export const IdempotencyKeySchema = z.string().trim().min(8, 'Idempotency-Key must be 8 to 80 characters.')
  .max(80, 'Idempotency-Key must be 8 to 80 characters.').regex(/^[A-Za-z0-9_:.-]+$/, 'Idempotency-Key may use letters, digits and _ : . -')

export const OrderParamsSchema = z.object({ id: z.coerce.number().int().positive() })

const status = z.enum(ORDER_STATUSES, { error: `status must be one of: ${ORDER_STATUSES.join(', ')}` })

/** GET /api/orders?status=&page=&pageSize= */
export const OrderListQuerySchema = PageQuerySchema.extend({ status: status.optional() })
export type OrderListQuery = z.infer<typeof OrderListQuerySchema>

/** GET /api/counter/orders?branchId=&status=&page=&pageSize= ; `open` = everything still to be worked */
export const CounterOrderListQuerySchema = PageQuerySchema.extend({
  branchId: z.coerce.number().int().positive().optional(),
  status: z.union([status, z.literal('open')]).default('open'),
})
export type CounterOrderListQuery = z.infer<typeof CounterOrderListQuerySchema>

/** POST /api/orders/:id/cancel */
export const OrderCancelSchema = z.object({ reason }).strict()

/** PATCH /api/counter/orders/:id */
export const CounterOrderPatchSchema = z.object({
  status: z.enum(['picking', 'dispatched', 'delivered', 'cancelled'], { error: 'status must be picking, dispatched, delivered or cancelled.' }),
  reason,
}).strict()

/**
 * POST /api/counter/orders/:id/picks: what the counter found on the shelf, per line. A short pick says where the
 * rest comes from: a back-order from the supplier or a transfer from another branch.
 */
export const CounterPickSchema = z.object({
  lines: z.array(z.object({
    lineId: id('line'),
    picked: z.number({ error: 'Enter how many were picked.' }).int('Enter a whole number.').min(0, 'Picked cannot be negative.'),
    shortfall: z.enum(['back_order', 'transfer'], { error: 'Choose back-order or transfer for the rest.' }).optional(),
  }).strict(), { error: 'lines must be a list of { lineId, picked, shortfall? }.' }).min(1, 'Record at least one line.').max(MAX_ORDER_LINES),
}).strict()
export type CounterPickInput = z.infer<typeof CounterPickSchema>

/** POST /api/counter/stock-receipts: goods in from the supplier at a branch (back-orders there are filled first). */
export const StockReceiptSchema = z.object({
  sku,
  branchId: id('branch'),
  quantity: z.number({ error: 'Enter how many arrived.' }).int('Enter a whole number.').min(1, 'At least 1 arrived.').max(9_999, 'At most 9,999 at a time.'),
  note,
}).strict()
export type StockReceiptInput = z.infer<typeof StockReceiptSchema>

/** PUT /api/basket: the garage's basket, kept with its account. */
export const BasketSchema = z.object({
  items: z.array(z.object({
    sku,
    description: z.string({ error: 'The description must be text.' }).trim().max(300).default(''),
    quantity: LineQuantitySchema,
  }).strict(), { error: 'items must be a list of { sku, description, quantity }.' }).max(MAX_ORDER_LINES, `At most ${MAX_ORDER_LINES} lines in the basket.`),
}).strict()
export type BasketInput = z.infer<typeof BasketSchema>

/** PATCH /api/admin/trade-accounts/:id/home-branch */
export const HomeBranchSchema = z.object({ homeBranchId: id('home branch') }).strict()

/** POST /api/core-returns: book an expected return (by its id, or by the order line it belongs to). */
export const CoreReturnBookSchema = z.object({
  coreReturnId: id('core return').optional(),
  orderLineId: id('order line').optional(),
  quantity: z.number({ error: 'Quantity must be a whole number.' }).int('Quantity must be a whole number.').min(1, 'Return at least 1.').optional(),
  note,
}).strict().refine((v) => v.coreReturnId !== undefined || v.orderLineId !== undefined, {
  path: ['coreReturnId'], message: 'Choose the old unit you are sending back.',
})

export const CoreReturnParamsSchema = z.object({ id: z.coerce.number().int().positive() })

/** GET /api/core-returns?status=&page=&pageSize= and GET /api/counter/core-returns?status=&page=&pageSize= */
export const CoreReturnListQuerySchema = PageQuerySchema.extend({
  status: z.enum(CORE_RETURN_STATUSES, { error: `status must be one of: ${CORE_RETURN_STATUSES.join(', ')}` }).optional(),
})
export type CoreReturnListQuery = z.infer<typeof CoreReturnListQuerySchema>

/** PATCH /api/counter/core-returns/:id */
export const CoreReturnDecisionSchema = z.object({
  status: z.enum(['accepted', 'rejected'], { error: 'status must be accepted or rejected.' }),
  reason,
}).strict().refine((v) => v.status !== 'rejected' || v.reason.length >= 3, {
  path: ['reason'], message: 'Say why the old unit is not accepted.',
})

/** Largest single payment booked by hand: £1,000,000.00 (a typing slip beyond it is far likelier than the payment). */
export const MAX_ACCOUNT_PAYMENT_MINOR = 100_000_000

/**
 * POST /api/admin/trade-accounts/:id/payments: money a garage on account terms paid outside the card flow.
 * `reference` is the bank or cheque reference as printed; the same reference is never booked twice for a garage.
 */
export const AccountPaymentSchema = z.object({
  amountMinor: z.number({ error: 'Enter the amount received.' }).int('Enter the amount in pence (a whole number).')
    .positive('The amount must be more than zero.').max(MAX_ACCOUNT_PAYMENT_MINOR, 'That is more than one payment can be; check the amount.'),
  reference: z.string({ error: 'Enter the payment reference.' }).trim().min(2, 'Enter the payment reference (bank or cheque reference).')
    .max(60, 'The reference is at most 60 characters.'),
  receivedOn: z.string({ error: 'Enter the date the money arrived.' }).regex(/^\d{4}-\d{2}-\d{2}$/, 'Enter the date as YYYY-MM-DD.')
    .refine((d) => !Number.isNaN(Date.parse(`${d}T00:00:00Z`)) && new Date(`${d}T00:00:00Z`).toISOString().slice(0, 10) === d, 'That date does not exist.'),
  note,
  /** which open items the payment pays, and how much of each; what is not allocated settles the oldest first */
  allocations: z.array(z.object({
    entryId: z.number({ error: 'Choose an open item.' }).int().positive('Choose an open item.'),
    amountMinor: z.number({ error: 'Enter the amount for this item.' }).int('Enter the amount in pence (a whole number).').positive('The amount must be more than zero.'),
  }).strict(), { error: 'List the items the payment pays.' }).max(200, 'Allocate to at most 200 items; the rest settles the oldest first.').optional(),
}).strict().superRefine((v, ctx) => {
  const allocated = (v.allocations ?? []).reduce((s, a) => s + a.amountMinor, 0)
  if (allocated > v.amountMinor) ctx.addIssue({ code: 'custom', path: ['allocations'], message: 'The amounts allocated add up to more than the payment.' })
  const ids = (v.allocations ?? []).map((a) => a.entryId)
  if (new Set(ids).size !== ids.length) ctx.addIssue({ code: 'custom', path: ['allocations'], message: 'Each item can be chosen once.' })
})
export type AccountPaymentInput = z.infer<typeof AccountPaymentSchema>

/** GET /api/statement?month=YYYY-MM (and the CSV): one calendar month (UTC) with its opening balance; empty = all. */
export const StatementQuerySchema = z.object({
  month: z.preprocess((v) => (v === '' ? undefined : v),
    z.string({ error: 'Choose a month as YYYY-MM.' }).regex(/^\d{4}-(0[1-9]|1[0-2])$/, 'Choose a month as YYYY-MM, e.g. 2026-11.').optional()),
})
