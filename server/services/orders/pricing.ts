/**
 * Pricing and supplying what a garage wants: basket lines (the same part twice becomes one line) or a quote's
 * approved part lines, at the garage's current net prices, from the branch that delivers (its home branch unless
 * one is named). Each requested line is then supplied as far as the branch's shelf goes, the rest by transfer or
 * back-order (supply-plan.ts), each piece with its promise. Plain Node.
 */
import type { Transaction } from 'sequelize'
import { Branch, type Organisation } from '../../models/accounts'
import { garagePrices } from '../pricing'
import { linesFromQuote } from './from-quote'
import { ORDER_TAX_RATE_BP, orderLineFigures, sumFigures } from '../../../shared/utils/order-totals'
import type { Fulfilment, OrderAmounts, PricedLine } from '../../../shared/types/orders'
import { invalidInput } from '../errors'
import { availableStock, branchTimes } from './branches'
import { counterSettings } from './counter-settings'
import { planSupply, stockKey } from './supply-plan'
import { branchView } from './views'

export interface OrderSource {
  quoteId?: number
  lines?: { sku: string; quantity: number; fulfilment?: Fulfilment }[]
  branchId?: number
  fulfilment?: Fulfilment
  collect?: boolean
}

/** The moment the order is priced ("now", which tests may move) and the zone its promises are told in. */
export interface OrderClock { now: Date; timeZone: string }

interface WantedLine { sku: string; quantity: number; quoteLineId: number | null; quotedUnitNetMinor: number | null; fulfilment?: Fulfilment }
type Skipped = { sku: string; reason: string }[]

export interface PricedOrder extends Omit<OrderAmounts, 'taxRateBp'> {
  branch: Branch
  lines: PricedLine[]
  skipped: Skipped
  shortages: { sku: string; available: number; wanted: number }[]
  fulfilment: Fulfilment
  collect: boolean
  completeAt: Date | null
  /** per line (same index): when its units are at the order's branch, and when it is promised */
  readyAt: Date[]
  promisedAt: (Date | null)[]
}

const skuKey = (sku: string) => sku.trim().toUpperCase()

async function wantedLines(org: Organisation, source: OrderSource, t?: Transaction): Promise<{ wanted: WantedLine[]; skipped: Skipped }> {
  if (source.quoteId !== undefined) {
    const fromQuote = await linesFromQuote(org.id, source.quoteId, t)
    return { wanted: fromQuote.lines.map((l) => ({ ...l })), skipped: fromQuote.skipped }
  }
  const merged = new Map<string, WantedLine>()
  for (const l of source.lines ?? []) {
    const prev = merged.get(skuKey(l.sku))
    if (prev) {
      prev.quantity += l.quantity
      prev.fulfilment ??= l.fulfilment
    } else {
      merged.set(skuKey(l.sku), { sku: l.sku.trim(), quantity: l.quantity, quoteLineId: null, quotedUnitNetMinor: null, fulfilment: l.fulfilment })
    }
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

/** Where the garage typed the SKU, so the message lands beside that basket line. */
function originalIndex(source: OrderSource, sku: string): number | undefined {
  const i = (source.lines ?? []).findIndex((l) => skuKey(l.sku) === skuKey(sku))
  return i >= 0 ? i : undefined
}

type Requested = Omit<PricedLine, 'lineNetMinor' | 'lineTaxMinor' | 'coreDepositTaxMinor' | 'source' | 'branch' | 'arrivesAt' | 'promise' | 'fulfilment' | 'available' | 'requested'>
  & { fulfilment?: Fulfilment }

/**
 * Prices what the garage wants. Unknown, discontinued or unpriced basket lines are a 422 naming the line
 * (`lines.N.sku`); for a quote they are skipped with the reason (the garage sees it).
 */
async function priceRequested(org: Organisation, source: OrderSource, t?: Transaction): Promise<{ requested: Requested[]; skipped: Skipped }> {
  const { wanted, skipped } = await wantedLines(org, source, t)
  const prices = await garagePrices(org, wanted.flatMap((w) => [w.sku, w.sku.toUpperCase()]), t)
  const fields: Record<string, string> = {}
  const requested: Requested[] = []
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
    requested.push({
      group: requested.length,
      sku: p.part.sku, partId: p.part.id, description: p.part.description, quantity: w.quantity,
      unitListMinor: p.listPriceMinor, unitNetMinor: p.unitNetMinor, coreDepositUnitMinor: p.coreDepositMinor,
      quoteLineId: w.quoteLineId, quotedUnitNetMinor: w.quotedUnitNetMinor,
      priceChangeMinor: w.quotedUnitNetMinor !== null && w.quotedUnitNetMinor !== p.unitNetMinor ? p.unitNetMinor - w.quotedUnitNetMinor : null,
      fulfilment: w.fulfilment,
    })
  })
  if (Object.keys(fields).length) throw invalidInput(fields, 'Some lines cannot be ordered.')
  if (!requested.length) {
    throw invalidInput({ lines: fromQuote ? 'None of this quote\'s approved part lines can be ordered.' : 'Add at least one part.' })
  }
  return { requested, skipped }
}

/** Prices and supplies the order as it would be placed at `clock.now`. Reads only; the caller reserves. */
export async function priceOrder(org: Organisation, source: OrderSource, clock: OrderClock, t?: Transaction): Promise<PricedOrder> {
  const branch = await resolveBranch(org, source.branchId, t)
  const { requested, skipped } = await priceRequested(org, source, t)
  const [available, times] = await Promise.all([availableStock(requested.map((r) => r.partId), t), branchTimes(t)])
  const home = times.find((b) => b.id === branch.id)!
  const fulfilment = source.fulfilment ?? 'ship_available'
  const collect = !!source.collect
  const pieces = planSupply(requested.map((r) => ({ group: r.group, partId: r.partId, quantity: r.quantity, fulfilment: r.fulfilment })), {
    home, others: times.filter((b) => b.id !== branch.id), available, now: clock.now, timeZone: clock.timeZone,
    collect, fulfilment, supplierLeadDays: counterSettings().supplierLeadDays,
  })
  const figures = pieces.map((piece) => {
    const r = requested[piece.group]!
    return orderLineFigures({ quantity: piece.quantity, unitNetMinor: r.unitNetMinor, coreDepositUnitMinor: r.coreDepositUnitMinor })
  })
  const lines: PricedLine[] = pieces.map((piece, i) => {
    const { fulfilment: _ask, ...r } = requested[piece.group]!
    const { lineNetMinor, lineTaxMinor, coreDepositTaxMinor } = figures[i]!
    return {
      ...r, lineNetMinor, lineTaxMinor, coreDepositTaxMinor, quantity: piece.quantity, requested: r.quantity,
      available: available.get(stockKey(branch.id, r.partId)) ?? 0,
      source: piece.source, branch: piece.branch ? branchView(piece.branch) : null,
      arrivesAt: piece.arrivesAt?.toISOString() ?? null, promise: piece.promise, fulfilment: piece.fulfilment,
    }
  })
  const shortages = requested.filter((r) => (available.get(stockKey(branch.id, r.partId)) ?? 0) < r.quantity)
    .map((r) => ({ sku: r.sku, available: available.get(stockKey(branch.id, r.partId)) ?? 0, wanted: r.quantity }))
  const arrivals = pieces.map((p) => p.arrivesAt?.getTime() ?? 0)
  const { subtotalMinor, coreDepositMinor, taxMinor, totalMinor } = sumFigures(figures)
  return {
    branch, lines, skipped, shortages, fulfilment, collect, subtotalMinor, coreDepositMinor, taxMinor, totalMinor,
    readyAt: pieces.map((p) => p.readyAt), promisedAt: pieces.map((p) => p.arrivesAt),
    completeAt: arrivals.length && arrivals.every((a) => a > 0) ? new Date(Math.max(...arrivals)) : null,
  }
}

/** The priced order's figures as an order states them, in the installation's currency. */
export function orderAmounts(priced: Pick<PricedOrder, 'subtotalMinor' | 'coreDepositMinor' | 'taxMinor' | 'totalMinor'>, currency: string): OrderAmounts & { currency: string } {
  const { subtotalMinor, coreDepositMinor, taxMinor, totalMinor } = priced
  return { subtotalMinor, coreDepositMinor, taxRateBp: ORDER_TAX_RATE_BP, taxMinor, totalMinor, currency }
}
