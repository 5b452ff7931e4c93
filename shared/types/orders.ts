/**
 * Orders, payments, the ledger and core returns: the states and the shapes the routes answer with, shared by
 * the server serialisers and the pages.
 *
 * An order's life (the server refuses every other move with 409):
 *
 *   card:    awaiting_payment ──paid──> confirmed ──> picking ──> dispatched ──> delivered
 *                 │  └─checkout expired─> lapsed ──pay again (stock re-reserved)──> awaiting_payment
 *                 └──cancel──> cancelled <──cancel── confirmed, picking, lapsed
 *   account: confirmed ──> picking ──> dispatched ──> delivered   (cancel from confirmed or picking)
 */

export const ORDER_STATUSES = ['awaiting_payment', 'confirmed', 'picking', 'dispatched', 'delivered', 'cancelled', 'lapsed'] as const
export type OrderStatus = (typeof ORDER_STATUSES)[number]

export const PAYMENT_METHODS = ['card', 'account'] as const
export type PaymentMethod = (typeof PAYMENT_METHODS)[number]

export const PAYMENT_STATES = ['unpaid', 'paid', 'on_account', 'refund_pending', 'refunded', 'credited'] as const
export type PaymentState = (typeof PAYMENT_STATES)[number]

export const CORE_RETURN_STATUSES = ['expected', 'booked', 'accepted', 'rejected', 'void'] as const
export type CoreReturnStatus = (typeof CORE_RETURN_STATUSES)[number]

export const LEDGER_KINDS = ['order', 'core_deposit', 'payment', 'refund', 'credit', 'core_credit', 'account_payment'] as const
export type LedgerKind = (typeof LEDGER_KINDS)[number]

/** The moves counter staff make on the queue (PATCH /api/counter/orders/:id). */
export const COUNTER_MOVES: Partial<Record<OrderStatus, OrderStatus[]>> = {
  confirmed: ['picking', 'cancelled'],
  picking: ['dispatched', 'cancelled'],
  dispatched: ['delivered'],
}

/** What the button for each counter move says. */
export const COUNTER_MOVE_LABELS: Partial<Record<OrderStatus, string>> = {
  picking: 'Start picking',
  dispatched: 'Mark dispatched',
  delivered: 'Mark delivered',
}

/** States in which the parts are the distributor's to pick or have left: a delivery note exists. */
export const DELIVERY_NOTE_STATUSES: readonly OrderStatus[] = ['confirmed', 'picking', 'dispatched', 'delivered']

export const ORDER_STATUS_LABELS: Record<OrderStatus, string> = {
  awaiting_payment: 'Waiting for card payment',
  confirmed: 'Confirmed, waiting to be picked',
  picking: 'Being picked',
  dispatched: 'On its way',
  delivered: 'Delivered',
  cancelled: 'Cancelled',
  lapsed: 'Checkout lapsed',
}

export const PAYMENT_STATE_LABELS: Record<PaymentState, string> = {
  unpaid: 'Not paid yet',
  paid: 'Paid by card',
  on_account: 'On trade account',
  refund_pending: 'Refund on its way',
  refunded: 'Refunded to card',
  credited: 'Credited to account',
}

export const CORE_RETURN_LABELS: Record<CoreReturnStatus, string> = {
  expected: 'Old unit due back',
  booked: 'Booked to come back',
  accepted: 'Accepted, deposit returned',
  rejected: 'Not accepted',
  void: 'Not needed (order cancelled)',
}

export const LEDGER_KIND_LABELS: Record<LedgerKind, string> = {
  order: 'Order',
  core_deposit: 'Core deposit',
  payment: 'Card payment',
  refund: 'Refund to card',
  credit: 'Credit',
  core_credit: 'Core credit',
  account_payment: 'Payment received',
}

/** The reference people quote on the phone and that prints on paperwork: BL-000042. */
export function orderReference(id: number): string {
  return `BL-${String(id).padStart(6, '0')}`
}

export interface BranchView { id: number; code: string; name: string }

/** A line's part and amounts, as placed and as previewed. */
export interface OrderLineAmounts {
  sku: string
  description: string
  quantity: number
  unitListMinor: number
  unitNetMinor: number
  lineNetMinor: number
  lineTaxMinor: number
  coreDepositUnitMinor: number
  /** set when the line came from a quote: the unit net price the quote had captured */
  quotedUnitNetMinor: number | null
}

export interface OrderLineView extends OrderLineAmounts {
  id: number
}

export interface CoreReturnView {
  id: number
  orderId: number
  orderReference: string
  orderLineId: number
  sku: string
  description: string
  status: CoreReturnStatus
  statusLabel: string
  quantityExpected: number
  quantityBooked: number | null
  depositUnitMinor: number
  /** the deposit that goes back if it is accepted (booked quantity, or all expected before booking) */
  depositMinor: number
  creditedMinor: number | null
  garageNote: string
  reason: string | null
  bookedAt: string | null
  decidedAt: string | null
  refundPending: boolean
  /** the garage's name (counter views only) */
  garage?: string
}

export interface OrderSummary {
  id: number
  reference: string
  status: OrderStatus
  statusLabel: string
  paymentMethod: PaymentMethod
  paymentState: PaymentState
  paymentStateLabel: string
  totalMinor: number
  currency: string
  branch: BranchView
  garageReference: string
  lineCount: number
  createdAt: string
  /** counter views only */
  garage?: { id: number; name: string }
}

/** An order's figures: parts, deposits, tax and what is paid. */
export interface OrderAmounts {
  subtotalMinor: number
  coreDepositMinor: number
  taxRateBp: number
  taxMinor: number
  totalMinor: number
}

export interface OrderDetail extends OrderSummary, OrderAmounts {
  quoteId: number | null
  lines: OrderLineView[]
  coreReturns: CoreReturnView[]
  placedBy: string
  /** the last card attempt's refusal, shown until a payment succeeds */
  decline: { reason: string; code: string | null; at: string } | null
  /** what the signed-in caller may do next */
  can: { pay: boolean; cancel: boolean; invoice: boolean }
  /** counter views: the moves that are allowed from here */
  nextStatuses?: OrderStatus[]
  timeline: { at: string; label: string }[]
}

export interface PricedLine extends OrderLineAmounts {
  partId: number
  /** units at the chosen branch right now */
  available: number
  quoteLineId: number | null
  /** unitNetMinor - quotedUnitNetMinor when the price moved since the quote, else null */
  priceChangeMinor: number | null
}

export interface OrderPreview extends OrderAmounts {
  lines: PricedLine[]
  branch: BranchView
  branches: BranchView[]
  currency: string
  /** lines whose price differs from the quote's */
  changes: { sku: string; quotedUnitNetMinor: number; unitNetMinor: number }[]
  /** quote lines that could not be ordered (no longer sold, no price), with why */
  skipped: { sku: string; reason: string }[]
  terms: 'card' | 'account'
  account: { creditLimitMinor: number; balanceMinor: number; availableMinor: number; fits: boolean } | null
  shortages: { sku: string; available: number; wanted: number }[]
}

export interface StatementEntry {
  id: number
  at: string
  kind: LedgerKind
  kindLabel: string
  reference: string
  description: string
  amountMinor: number
  balanceMinor: number
  orderId: number | null
  garageReference: string
}

export interface Statement {
  garage: { id: number; name: string; terms: 'card' | 'account'; creditLimitMinor: number; paymentDays: number }
  currency: string
  /** every entry, or only the chosen month's */
  entries: StatementEntry[]
  /** the balance now, whatever period is shown */
  balanceMinor: number
  availableMinor: number | null
  /** the month shown, with the balance brought forward into it and carried out of it; null = whole ledger */
  period: { month: string; openingBalanceMinor: number; closingBalanceMinor: number } | null
  /** months (YYYY-MM, newest first) that have entries, for choosing one */
  months: string[]
}
