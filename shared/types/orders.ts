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
 *   either:  picking ──send what is picked, the rest to follow──> part_dispatched ──> picking …
 *            (cancelling a part-sent order cancels what has not left; the order then stands as dispatched)
 *
 * Each line has its own supply (where its units come from) and state:
 *   reserved (units held at its branch) ──pick──> picked ──dispatch──> dispatched
 *   waiting (back-ordered from the supplier) ──stock arrives, oldest order first──> reserved
 *   any line not yet sent ──cancel──> cancelled
 */
import type { AccountStop, Ageing, OpenItem } from './money-owed'

export const ORDER_STATUSES = ['awaiting_payment', 'confirmed', 'picking', 'part_dispatched', 'dispatched', 'delivered', 'cancelled', 'lapsed'] as const
export type OrderStatus = (typeof ORDER_STATUSES)[number]

export const PAYMENT_METHODS = ['card', 'account'] as const
export type PaymentMethod = (typeof PAYMENT_METHODS)[number]

export const PAYMENT_STATES = ['unpaid', 'paid', 'on_account', 'refund_pending', 'refunded', 'credited'] as const
export type PaymentState = (typeof PAYMENT_STATES)[number]

export const CORE_RETURN_STATUSES = ['expected', 'booked', 'accepted', 'rejected', 'void'] as const
export type CoreReturnStatus = (typeof CORE_RETURN_STATUSES)[number]

export const LEDGER_KINDS = ['order', 'core_deposit', 'payment', 'refund', 'credit', 'core_credit', 'account_payment', 'return_credit'] as const
export type LedgerKind = (typeof LEDGER_KINDS)[number]

/** The moves counter staff make on the queue (PATCH /api/counter/orders/:id). */
export const COUNTER_MOVES: Partial<Record<OrderStatus, OrderStatus[]>> = {
  confirmed: ['picking', 'cancelled'],
  picking: ['dispatched', 'cancelled'],
  part_dispatched: ['picking', 'cancelled'],
  dispatched: ['delivered'],
}

/** What the button for each counter move says. */
export const COUNTER_MOVE_LABELS: Partial<Record<OrderStatus, string>> = {
  picking: 'Start picking',
  dispatched: 'Send what is picked',
  delivered: 'Mark delivered',
}

/** States in which the parts are the distributor's to pick or have left: a delivery note exists. */
export const DELIVERY_NOTE_STATUSES: readonly OrderStatus[] = ['confirmed', 'picking', 'part_dispatched', 'dispatched', 'delivered']

export const ORDER_STATUS_LABELS: Record<OrderStatus, string> = {
  awaiting_payment: 'Waiting for card payment',
  confirmed: 'Confirmed, waiting to be picked',
  picking: 'Being picked',
  part_dispatched: 'Part sent, the rest follows',
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
  return_credit: 'Return credit',
}

/** The reference people quote on the phone and that prints on paperwork: BL-000042. */
export function orderReference(id: number): string {
  return `BL-${String(id).padStart(6, '0')}`
}

export interface BranchView { id: number; code: string; name: string }

/** Where a line's units come from. */
export const SUPPLY_SOURCES = ['home', 'transfer', 'back_order', 'collect'] as const
export type SupplySource = (typeof SUPPLY_SOURCES)[number]

export const SUPPLY_SOURCE_LABELS: Record<SupplySource, string> = {
  home: 'From the shelf',
  transfer: 'By transfer from another branch',
  back_order: 'Back-ordered from the supplier',
  collect: 'Collect from the counter',
}

/** What the garage wants done with a line that cannot all go at once. */
export const FULFILMENTS = ['ship_available', 'wait_for_all'] as const
export type Fulfilment = (typeof FULFILMENTS)[number]

export const FULFILMENT_LABELS: Record<Fulfilment, string> = {
  ship_available: 'Send what is here now, the rest follows',
  wait_for_all: 'Wait and send everything together',
}

export const LINE_STATES = ['reserved', 'waiting', 'picked', 'dispatched', 'cancelled'] as const
export type LineState = (typeof LINE_STATES)[number]

export const LINE_STATE_LABELS: Record<LineState, string> = {
  reserved: 'Held for you',
  waiting: 'Waiting for stock',
  picked: 'Picked',
  dispatched: 'Sent',
  cancelled: 'Cancelled',
}

/** A line's supply as the garage reads it: where from, and when it arrives. */
export interface SupplyView {
  source: SupplySource
  /** the branch the units come from (null: back-ordered, not yet in any branch) */
  branch: BranchView | null
  /** when the line is expected at the garage (or ready at the counter, when collected) */
  arrivesAt: string | null
  /** the promise in words: "next run 14:30, about 15:15", "tomorrow's 08:30 run", "collect from the counter now" */
  promise: string
  fulfilment: Fulfilment
}

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
  /** tax on the line's core deposits (the deposit carries tax at the part's rate) */
  coreDepositTaxMinor: number
  /** set when the line came from a quote: the unit net price the quote had captured */
  quotedUnitNetMinor: number | null
}

export interface OrderLineView extends OrderLineAmounts, SupplyView {
  id: number
  state: LineState
  stateLabel: string
  pickedQuantity: number | null
  dispatchedAt: string | null
  /** units of this line the garage may still ask to return (sent, invoiced, within the return period or not) */
  returnableQuantity: number
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
  /** the deposit that goes back if it is accepted (booked quantity, or all expected before booking), before tax */
  depositMinor: number
  /** the same with its tax: what is credited when the old unit is accepted */
  depositGrossMinor: number
  creditedMinor: number | null
  garageNote: string
  reason: string | null
  bookedAt: string | null
  decidedAt: string | null
  refundPending: boolean
  /** the credit note that returned the deposit */
  creditNote: { id: number; reference: string } | null
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

/** One line of the counter's pick list, in bin order. */
export interface PickLine {
  lineId: number
  sku: string
  description: string
  quantity: number
  /** the shelf location at the branch that picks it; '' when none is recorded */
  bin: string
  source: SupplySource
  /** ready to pick now (held here, transfer arrived, and not waiting for the rest of a wait-for-all group) */
  ready: boolean
  /** why it is not ready yet */
  waitingFor: string | null
  pickedQuantity: number | null
}

export interface DispatchView {
  id: number
  seq: number
  at: string
  lines: number
  invoice: { id: number; reference: string } | null
}

export interface OrderDetail extends OrderSummary, OrderAmounts {
  quoteId: number | null
  fulfilment: Fulfilment
  collect: boolean
  lines: OrderLineView[]
  coreReturns: CoreReturnView[]
  dispatches: DispatchView[]
  placedBy: string
  /** the last card attempt's refusal, shown until a payment succeeds */
  decline: { reason: string; code: string | null; at: string } | null
  /** what the signed-in caller may do next */
  can: { pay: boolean; cancel: boolean; invoice: boolean; returnLines: boolean }
  /** counter views: the moves that are allowed from here */
  nextStatuses?: OrderStatus[]
  /** counter views: what to pick, by bin */
  pickList?: PickLine[]
  timeline: { at: string; label: string }[]
}

export interface PricedLine extends OrderLineAmounts, SupplyView {
  partId: number
  /** units at the order's branch right now, less what older back-orders there are waiting for */
  available: number
  quoteLineId: number | null
  /** unitNetMinor - quotedUnitNetMinor when the price moved since the quote, else null */
  priceChangeMinor: number | null
  /** which requested line (basket or quote line, from 0) this supply fills: a short line is split in several */
  group: number
  /** how many the garage asked for on that requested line */
  requested: number
}

export interface OrderPreview extends OrderAmounts {
  lines: PricedLine[]
  branch: BranchView
  branches: BranchView[]
  currency: string
  fulfilment: Fulfilment
  collect: boolean
  /** when the whole order will have arrived */
  completeAt: string | null
  /** lines whose price differs from the quote's */
  changes: { sku: string; quotedUnitNetMinor: number; unitNetMinor: number }[]
  /** quote lines that could not be ordered (no longer sold, no price), with why */
  skipped: { sku: string; reason: string }[]
  terms: 'card' | 'account'
  account: { creditLimitMinor: number; balanceMinor: number; availableMinor: number; fits: boolean } | null
  /** requested lines the order's branch cannot fill from its shelf: they are split (transfer, back-order) */
  shortages: { sku: string; available: number; wanted: number }[]
}

/** A branch, how it delivers and when its counter is open (the order page and the approval form). */
export interface BranchSchedule extends BranchView {
  address: string
  collection: boolean
  counterOpens: string
  counterCloses: string
  transferMinutes: number
  runs: { departs: string; cutoffMinutes: number; transitMinutes: number; weekdays: string }[]
}

export interface BasketItem { sku: string; description: string; quantity: number }

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
  /** the local day the open items are aged on (YYYY-MM-DD) */
  asOf: string
  /** charges not yet paid in full, oldest first (payments and credits settle the oldest first), whatever the month */
  openItems: OpenItem[]
  /** what is open, by days past its due date */
  ageing: Ageing
  stop: AccountStop
}
