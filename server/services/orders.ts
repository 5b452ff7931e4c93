/**
 * Placing orders: pricing at the garage's current net price, the trade-account credit check, stock reserved
 * in the same write transaction as the order (guarded UPDATE + CHECK (quantity >= 0)), and the views the
 * routes answer with. Plain Node (no Nitro auto-imports), so the demo seed can place orders too.
 *
 * Stock: an order holds its units from the moment it is created (`stock_held`); they go back to the shelf
 * when an unpaid card checkout lapses, or when the order is cancelled before dispatch.
 */
import { Op, QueryTypes, type Transaction } from 'sequelize'
import { Branch, Organisation, User } from '../models/accounts'
import { Part, StockLevel } from '../models/catalogue'
import { CoreReturn, LedgerEntry, Order, OrderLine } from '../models/orders'
import { getDb } from '../utils/db'
import { garagePrices } from './pricing'
import { linesFromQuote, type QuoteOrderLine } from './order-quotes'
import { formatMinor } from '../../shared/utils/money'
import { ORDER_TAX_RATE_BP, orderLineTaxMinor, orderTotals } from '../../shared/utils/order-totals'
import {
  COUNTER_MOVES, CORE_RETURN_LABELS, ORDER_STATUS_LABELS, PAYMENT_STATE_LABELS, orderReference,
  type BranchView, type CoreReturnView, type OrderDetail, type OrderPreview, type OrderSummary, type PaymentMethod, type PricedLine,
} from '../../shared/types/orders'
import { DomainError, invalidInput, notFound, conflict, forbidden } from './errors'

export const ORDER_CURRENCY = 'GBP'

/** How long a card order may hold stock without a checkout being opened (the sweep lets it lapse after). */
export const UNPAID_HOLD_MINUTES = 60

export interface OrderSource {
  quoteId?: number
  lines?: { sku: string; quantity: number }[]
  branchId?: number
}

export const orderIncludes = () => [
  { model: OrderLine, as: 'lines' },
  { model: Branch, as: 'branch' },
  { model: CoreReturn, as: 'coreReturns' },
]

export function branchView(b: Pick<Branch, 'id' | 'code' | 'name'>): BranchView {
  return { id: b.id, code: b.code, name: b.name }
}

/** The caller's own order, or 404 (another garage's order is reported exactly like a missing one). */
export async function findGarageOrder(organisationId: number, id: number, t?: Transaction): Promise<Order> {
  const order = await Order.findOne({ where: { id, organisationId }, include: orderIncludes(), transaction: t })
  if (!order) throw notFound('Order')
  return order
}

export async function findAnyOrder(id: number, t?: Transaction): Promise<Order> {
  const order = await Order.findOne({
    where: { id },
    include: [...orderIncludes(), { model: Organisation, as: 'organisation' }],
    transaction: t,
  })
  if (!order) throw notFound('Order')
  return order
}

// ---------------------------------------------------------------------------------------------------------
// Pricing the lines
// ---------------------------------------------------------------------------------------------------------

interface WantedLine { sku: string; quantity: number; quoteLineId: number | null; quotedUnitNetMinor: number | null }

/** Basket lines merged by SKU (the same part twice becomes one line), or a quote's approved part lines. */
async function wantedLines(org: Organisation, source: OrderSource, t?: Transaction): Promise<{ wanted: WantedLine[]; skipped: { sku: string; reason: string }[] }> {
  if (source.quoteId !== undefined) {
    const fromQuote: { lines: QuoteOrderLine[]; skipped: { sku: string; reason: string }[] } = await linesFromQuote(org.id, source.quoteId, t)
    return { wanted: fromQuote.lines.map((l) => ({ ...l })), skipped: fromQuote.skipped }
  }
  const merged = new Map<string, WantedLine>()
  for (const l of source.lines ?? []) {
    const key = l.sku.trim().toUpperCase()
    const prev = merged.get(key)
    if (prev) prev.quantity += l.quantity
    else merged.set(key, { sku: l.sku.trim(), quantity: l.quantity, quoteLineId: null, quotedUnitNetMinor: null })
  }
  return { wanted: [...merged.values()], skipped: [] }
}

async function resolveBranch(org: Organisation, branchId: number | undefined, t?: Transaction): Promise<Branch> {
  const id = branchId ?? org.homeBranchId ?? undefined
  const branch = id ? await Branch.findByPk(id, { transaction: t }) : null
  if (!branch) {
    throw invalidInput({ branchId: branchId ? 'There is no such branch.' : 'Choose the branch that delivers this order.' })
  }
  return branch
}

async function stockAt(branchId: number, partIds: number[], t?: Transaction): Promise<Map<number, number>> {
  const rows = partIds.length
    ? await StockLevel.findAll({ where: { branchId, partId: { [Op.in]: partIds } }, transaction: t })
    : []
  return new Map(rows.map((r) => [r.partId, r.quantity]))
}

export interface PricedOrder {
  branch: Branch
  lines: PricedLine[]
  skipped: { sku: string; reason: string }[]
  subtotalMinor: number
  coreDepositMinor: number
  taxMinor: number
  totalMinor: number
}

/**
 * Prices what the garage wants at its current net prices. Unknown, discontinued or unpriced basket lines are
 * a 422 naming the line (`lines.N.sku`); for a quote they are skipped with the reason (the garage sees it).
 */
export async function priceOrder(org: Organisation, source: OrderSource, t?: Transaction): Promise<PricedOrder> {
  const branch = await resolveBranch(org, source.branchId, t)
  const { wanted, skipped } = await wantedLines(org, source, t)
  const skus = wanted.flatMap((w) => [w.sku, w.sku.toUpperCase()])
  const prices = await garagePrices(org, skus, t)
  const fields: Record<string, string> = {}
  const lines: PricedLine[] = []
  const fromQuote = source.quoteId !== undefined
  wanted.forEach((w, i) => {
    const p = prices.get(w.sku) ?? prices.get(w.sku.toUpperCase())
    let problem: string | null = null
    if (!p) problem = (fromQuote ? 'no longer in the catalogue or has no current price' : 'There is no such part with a current price.')
    else if (p.part.status === 'discontinued') problem = fromQuote ? 'discontinued' : 'This part is discontinued.'
    if (problem || !p) {
      if (fromQuote) skipped.push({ sku: w.sku, reason: problem! })
      else fields[`lines.${originalIndex(source, w.sku) ?? i}.sku`] = `${w.sku}: ${problem}`
      return
    }
    const lineNetMinor = p.unitNetMinor * w.quantity
    lines.push({
      sku: p.part.sku,
      partId: p.part.id,
      description: p.part.description,
      quantity: w.quantity,
      unitListMinor: p.listPriceMinor,
      unitNetMinor: p.unitNetMinor,
      lineNetMinor,
      lineTaxMinor: orderLineTaxMinor(lineNetMinor),
      coreDepositUnitMinor: p.coreDepositMinor,
      available: 0,
      quoteLineId: w.quoteLineId,
      quotedUnitNetMinor: w.quotedUnitNetMinor,
      priceChangeMinor: w.quotedUnitNetMinor !== null && w.quotedUnitNetMinor !== p.unitNetMinor ? p.unitNetMinor - w.quotedUnitNetMinor : null,
    })
  })
  if (Object.keys(fields).length) throw invalidInput(fields, 'Some lines cannot be ordered.')
  if (!lines.length) {
    throw invalidInput({ lines: fromQuote ? 'None of this quote\'s approved part lines can be ordered.' : 'Add at least one part.' })
  }
  const stock = await stockAt(branch.id, lines.map((l) => l.partId), t)
  for (const l of lines) l.available = stock.get(l.partId) ?? 0
  const totals = orderTotals(lines)
  return { branch, lines, skipped, subtotalMinor: totals.subtotalMinor, coreDepositMinor: totals.coreDepositMinor, taxMinor: totals.taxMinor, totalMinor: totals.totalMinor }
}

function originalIndex(source: OrderSource, sku: string): number | undefined {
  const i = (source.lines ?? []).findIndex((l) => l.sku.trim().toUpperCase() === sku.trim().toUpperCase())
  return i >= 0 ? i : undefined
}

// ---------------------------------------------------------------------------------------------------------
// The trade account
// ---------------------------------------------------------------------------------------------------------

/** What the garage owes now: the sum of its ledger (positive = owed to the distributor). */
export async function balanceOf(organisationId: number, t?: Transaction): Promise<number> {
  const sum = await LedgerEntry.sum('amountMinor', { where: { organisationId }, transaction: t })
  return Number(sum ?? 0) || 0
}

export interface CreditCheck { creditLimitMinor: number; balanceMinor: number; availableMinor: number; fits: boolean }

export async function creditCheck(org: Organisation, totalMinor: number, t?: Transaction): Promise<CreditCheck> {
  const balanceMinor = await balanceOf(org.id, t)
  const creditLimitMinor = org.creditLimitMinor ?? 0
  return { creditLimitMinor, balanceMinor, availableMinor: creditLimitMinor - balanceMinor, fits: balanceMinor + totalMinor <= creditLimitMinor }
}

function refuseAccount(org: Organisation, totalMinor: number, c?: CreditCheck): never {
  if (!c) {
    throw new DomainError('invalid', `${org.name} pays by card: ordering on trade account is not set up. Choose card payment.`, { fields: { payment: 'This garage pays by card; trade-account terms are not set up.' } })
  }
  const f = (m: number) => formatMinor(m, ORDER_CURRENCY)
  throw new DomainError('payment_required', `Not enough trade credit: this order is ${f(totalMinor)}, the account balance is ${f(c.balanceMinor)} and the credit limit is ${f(c.creditLimitMinor)} (${f(Math.max(0, c.availableMinor))} available). Pay by card, or settle the account first.`, { fields: { payment: 'Over the trade-account credit limit.' }, details: { creditLimitMinor: c.creditLimitMinor, balanceMinor: c.balanceMinor, availableMinor: c.availableMinor, orderTotalMinor: totalMinor } })
}

// ---------------------------------------------------------------------------------------------------------
// Stock
// ---------------------------------------------------------------------------------------------------------

/**
 * Takes the units off the branch's shelf inside the caller's write transaction, all or nothing: each part
 * with a guarded UPDATE whose affected-row count says whether there was enough. Any shortage throws 409
 * "Only N left" (for every short line), and the caller's transaction rolls back whatever was taken.
 */
export async function reserveStock(t: Transaction, branch: Branch, lines: readonly { partId: number; sku: string; quantity: number }[]): Promise<void> {
  const byPart = new Map<number, { sku: string; quantity: number }>()
  for (const l of lines) {
    const prev = byPart.get(l.partId)
    if (prev) prev.quantity += l.quantity
    else byPart.set(l.partId, { sku: l.sku, quantity: l.quantity })
  }
  const shortages: { sku: string; available: number; wanted: number }[] = []
  for (const [partId, l] of byPart) {
    const [, changed] = await getDb().query(
      'UPDATE stock_levels SET quantity = quantity - :q, updated_at = :now WHERE part_id = :p AND branch_id = :b AND quantity >= :q',
      { replacements: { q: l.quantity, p: partId, b: branch.id, now: new Date() }, type: QueryTypes.UPDATE, transaction: t },
    ) as unknown as [unknown, number]
    if (changed === 1) continue
    const row = await StockLevel.findOne({ where: { partId, branchId: branch.id }, transaction: t })
    shortages.push({ sku: l.sku, available: row?.quantity ?? 0, wanted: l.quantity })
  }
  if (shortages.length) {
    const text = shortages.map((s) => `Only ${s.available} left of ${s.sku} at ${branch.name} (you asked for ${s.wanted}).`).join(' ')
    throw new DomainError('conflict', text, { details: { shortages } })
  }
}

/** Puts an order's units back on its branch's shelf (once: `stock_held` goes false). */
export async function releaseStock(t: Transaction, order: Order): Promise<void> {
  if (!order.stockHeld) return
  const lines = order.lines ?? await OrderLine.findAll({ where: { orderId: order.id }, transaction: t })
  for (const l of lines) {
    const [, changed] = await getDb().query(
      'UPDATE stock_levels SET quantity = quantity + :q, updated_at = :now WHERE part_id = :p AND branch_id = :b',
      { replacements: { q: l.quantity, p: l.partId, b: order.branchId, now: new Date() }, type: QueryTypes.UPDATE, transaction: t },
    ) as unknown as [unknown, number]
    if (changed === 0) await StockLevel.create({ partId: l.partId, branchId: order.branchId, quantity: l.quantity, updatedAt: new Date() }, { transaction: t })
  }
  order.stockHeld = false
  await order.save({ transaction: t })
}

// ---------------------------------------------------------------------------------------------------------
// Placing
// ---------------------------------------------------------------------------------------------------------

export interface PlaceInput extends OrderSource { payment: PaymentMethod; garageReference?: string }

/**
 * Creates the order in the caller's write transaction: re-reads the garage (status, terms, limit), prices
 * the lines, checks credit for account orders, reserves stock, writes order + lines, and for account orders
 * its ledger entries and expected core returns. Returns the order with `replayed` when the garage's
 * idempotency key already made one.
 */
export async function placeOrder(
  t: Transaction, orgId: number, user: Pick<User, 'id'>, input: PlaceInput, idempotencyKey: string | null,
): Promise<{ order: Order; replayed: boolean }> {
  if (idempotencyKey) {
    const existing = await Order.findOne({ where: { organisationId: orgId, idempotencyKey }, transaction: t })
    if (existing) return { order: existing, replayed: true }
  }
  const org = await Organisation.findByPk(orgId, { transaction: t })
  if (!org || org.kind !== 'garage') throw notFound('Garage')
  if (org.status !== 'approved') {
    throw forbidden('This trade account is not active, so it cannot order. Please contact the distributor.')
  }
  const priced = await priceOrder(org, input, t)
  if (input.payment === 'account') {
    if (org.paymentTerms !== 'account') refuseAccount(org, priced.totalMinor)
    const c = await creditCheck(org, priced.totalMinor, t)
    if (!c.fits) refuseAccount(org, priced.totalMinor, c)
  }
  await reserveStock(t, priced.branch, priced.lines)
  const card = input.payment === 'card'
  const order = await Order.create({
    organisationId: org.id,
    branchId: priced.branch.id,
    placedByUserId: user.id,
    quoteId: input.quoteId ?? null,
    status: card ? 'awaiting_payment' : 'confirmed',
    paymentMethod: input.payment,
    paymentState: card ? 'unpaid' : 'on_account',
    subtotalMinor: priced.subtotalMinor,
    coreDepositMinor: priced.coreDepositMinor,
    taxRateBp: ORDER_TAX_RATE_BP,
    taxMinor: priced.taxMinor,
    totalMinor: priced.totalMinor,
    currency: ORDER_CURRENCY,
    garageReference: input.garageReference ?? '',
    idempotencyKey,
    stockHeld: true,
  }, { transaction: t })
  const lines = await OrderLine.bulkCreate(priced.lines.map((l, position) => ({
    orderId: order.id, partId: l.partId, sku: l.sku, description: l.description, quantity: l.quantity,
    unitListMinor: l.unitListMinor, unitNetMinor: l.unitNetMinor, lineNetMinor: l.lineNetMinor,
    coreDepositUnitMinor: l.coreDepositUnitMinor, quoteLineId: l.quoteLineId, quotedUnitNetMinor: l.quotedUnitNetMinor, position,
  })), { transaction: t })
  order.lines = lines
  order.branch = priced.branch
  if (!card) await bookOrderCharges(t, order, null)
  return { order, replayed: false }
}

/**
 * The order's charges on the ledger (goods + tax, and deposits), and the old units it now expects back.
 * Runs when an account order is placed, or when a card order is paid (then `paymentIntentId` books the
 * payment that settles them, so the card garage's balance is back where it was).
 */
export async function bookOrderCharges(t: Transaction, order: Order, paymentIntentId: string | null, options: { expectCores?: boolean } = {}): Promise<void> {
  const ref = orderReference(order.id)
  await LedgerEntry.create({
    organisationId: order.organisationId, orderId: order.id, kind: 'order', amountMinor: order.subtotalMinor + order.taxMinor,
    reference: ref, description: `Parts ${formatMinor(order.subtotalMinor, order.currency)} + VAT ${formatMinor(order.taxMinor, order.currency)}`,
  }, { transaction: t })
  if (order.coreDepositMinor > 0) {
    await LedgerEntry.create({
      organisationId: order.organisationId, orderId: order.id, kind: 'core_deposit', amountMinor: order.coreDepositMinor,
      reference: ref, description: 'Deposits on old units to be returned',
    }, { transaction: t })
  }
  if (paymentIntentId) {
    await LedgerEntry.create({
      organisationId: order.organisationId, orderId: order.id, kind: 'payment', amountMinor: -order.totalMinor,
      reference: ref, description: 'Card payment received', externalId: paymentIntentId,
    }, { transaction: t })
  }
  if (options.expectCores === false) return
  const lines = order.lines ?? await OrderLine.findAll({ where: { orderId: order.id }, transaction: t })
  for (const l of lines) {
    if (l.coreDepositUnitMinor <= 0) continue
    const exists = await CoreReturn.findOne({ where: { orderLineId: l.id }, transaction: t })
    if (exists) continue
    await CoreReturn.create({
      organisationId: order.organisationId, orderId: order.id, orderLineId: l.id, status: 'expected',
      quantityExpected: l.quantity, depositUnitMinor: l.coreDepositUnitMinor,
    }, { transaction: t })
  }
}

/** Read-only: what the order would be, with price changes against the quote, stock and the credit check. */
export async function previewOrder(orgId: number, input: OrderSource & { payment?: PaymentMethod }): Promise<OrderPreview> {
  const org = await Organisation.findByPk(orgId)
  if (!org) throw notFound('Garage')
  const priced = await priceOrder(org, input)
  const branches = await Branch.findAll({ order: [['name', 'ASC']] })
  const account = org.paymentTerms === 'account' ? await creditCheck(org, priced.totalMinor) : null
  return {
    lines: priced.lines,
    branch: branchView(priced.branch),
    branches: branches.map(branchView),
    subtotalMinor: priced.subtotalMinor,
    coreDepositMinor: priced.coreDepositMinor,
    taxRateBp: ORDER_TAX_RATE_BP,
    taxMinor: priced.taxMinor,
    totalMinor: priced.totalMinor,
    currency: ORDER_CURRENCY,
    changes: priced.lines.filter((l) => l.priceChangeMinor !== null).map((l) => ({ sku: l.sku, quotedUnitNetMinor: l.quotedUnitNetMinor!, unitNetMinor: l.unitNetMinor })),
    skipped: priced.skipped,
    terms: org.paymentTerms ?? 'card',
    account,
    shortages: priced.lines.filter((l) => l.available < l.quantity).map((l) => ({ sku: l.sku, available: l.available, wanted: l.quantity })),
  }
}

// ---------------------------------------------------------------------------------------------------------
// Views
// ---------------------------------------------------------------------------------------------------------

export function coreReturnView(cr: CoreReturn, line: OrderLine | undefined, garage?: string): CoreReturnView {
  const qty = cr.quantityBooked ?? cr.quantityExpected
  return {
    id: cr.id,
    orderId: cr.orderId,
    orderReference: orderReference(cr.orderId),
    orderLineId: cr.orderLineId,
    sku: line?.sku ?? '',
    description: line?.description ?? '',
    status: cr.status,
    statusLabel: CORE_RETURN_LABELS[cr.status],
    quantityExpected: cr.quantityExpected,
    quantityBooked: cr.quantityBooked ?? null,
    depositUnitMinor: cr.depositUnitMinor,
    depositMinor: cr.depositUnitMinor * qty,
    creditedMinor: cr.creditedMinor ?? null,
    garageNote: cr.garageNote ?? '',
    reason: cr.reason ?? null,
    bookedAt: cr.bookedAt?.toISOString() ?? null,
    decidedAt: cr.decidedAt?.toISOString() ?? null,
    refundPending: !!cr.refundPending,
    ...(garage ? { garage } : {}),
  }
}

export function orderSummary(o: Order, lineCount?: number): OrderSummary {
  return {
    id: o.id,
    reference: orderReference(o.id),
    status: o.status,
    statusLabel: ORDER_STATUS_LABELS[o.status],
    paymentMethod: o.paymentMethod,
    paymentState: o.paymentState,
    paymentStateLabel: PAYMENT_STATE_LABELS[o.paymentState],
    totalMinor: o.totalMinor,
    currency: o.currency,
    branch: o.branch ? branchView(o.branch) : { id: o.branchId, code: '', name: '' },
    garageReference: o.garageReference ?? '',
    lineCount: lineCount ?? o.lines?.length ?? 0,
    createdAt: o.createdAt.toISOString(),
    ...(o.organisation ? { garage: { id: o.organisation.id, name: o.organisation.name } } : {}),
  }
}

/** Who may do what next, from the order's state (the routes enforce the same rules). */
export function garageMayCancel(o: Order): boolean {
  return ['awaiting_payment', 'lapsed', 'confirmed'].includes(o.status)
}
export function mayPay(o: Order): boolean {
  return o.paymentMethod === 'card' && o.paymentState === 'unpaid' && (o.status === 'awaiting_payment' || o.status === 'lapsed')
}
export function hasInvoice(o: Order): boolean {
  return o.paymentState !== 'unpaid'
}

export async function orderDetail(o: Order, perspective: 'garage' | 'counter'): Promise<OrderDetail> {
  const lines = [...(o.lines ?? [])].sort((a, b) => a.position - b.position || a.id - b.id)
  const placedBy = await User.findByPk(o.placedByUserId, { attributes: ['name'] })
  const timeline: { at: string; label: string }[] = [{ at: o.createdAt.toISOString(), label: 'Order placed' }]
  const push = (d: Date | null | undefined, label: string) => { if (d) timeline.push({ at: d.toISOString(), label }) }
  push(o.declinedAt, 'Card declined')
  push(o.paidAt, 'Paid by card')
  push(o.pickingAt, 'Picking started')
  push(o.dispatchedAt, 'Dispatched')
  push(o.deliveredAt, 'Delivered')
  push(o.cancelledAt, 'Cancelled')
  timeline.sort((a, b) => a.at.localeCompare(b.at))
  const byLine = new Map(lines.map((l) => [l.id, l]))
  return {
    ...orderSummary(o, lines.length),
    quoteId: o.quoteId ?? null,
    subtotalMinor: o.subtotalMinor,
    coreDepositMinor: o.coreDepositMinor,
    taxRateBp: o.taxRateBp,
    taxMinor: o.taxMinor,
    lines: lines.map((l) => ({
      id: l.id, sku: l.sku, description: l.description, quantity: l.quantity, unitListMinor: l.unitListMinor,
      unitNetMinor: l.unitNetMinor, lineNetMinor: l.lineNetMinor, lineTaxMinor: orderLineTaxMinor(l.lineNetMinor, o.taxRateBp),
      coreDepositUnitMinor: l.coreDepositUnitMinor, quotedUnitNetMinor: l.quotedUnitNetMinor ?? null,
    })),
    coreReturns: (o.coreReturns ?? []).sort((a, b) => a.id - b.id).map((cr) => coreReturnView(cr, byLine.get(cr.orderLineId))),
    placedBy: placedBy?.name ?? '',
    decline: o.declineReason && o.paymentState === 'unpaid'
      ? { reason: o.declineReason, code: o.declineCode ?? null, at: (o.declinedAt ?? o.updatedAt).toISOString() }
      : null,
    can: perspective === 'garage'
      ? { pay: mayPay(o), cancel: garageMayCancel(o), invoice: hasInvoice(o) }
      : { pay: false, cancel: (COUNTER_MOVES[o.status] ?? []).includes('cancelled'), invoice: hasInvoice(o) },
    ...(perspective === 'counter' ? { nextStatuses: COUNTER_MOVES[o.status] ?? [] } : {}),
    timeline,
  }
}

/** Parts by id, for the seed and tests. */
export async function partBySku(sku: string, t?: Transaction): Promise<Part | null> {
  return Part.findOne({ where: { sku }, transaction: t })
}
