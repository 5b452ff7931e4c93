/**
 * Pricing what a garage wants at its current net prices: basket lines (the same part twice becomes one line) or
 * a quote's approved part lines, the branch that delivers, and the stock there. Plain Node.
 */
import { Op, type Transaction } from 'sequelize'
import { Branch, type Organisation } from '../../models/accounts'
import { StockLevel } from '../../models/catalogue'
import { garagePrices } from '../pricing'
import { linesFromQuote } from './from-quote'
import { ORDER_TAX_RATE_BP, orderLineTaxMinor, orderTotals } from '../../../shared/utils/order-totals'
import type { OrderAmounts, PricedLine } from '../../../shared/types/orders'
import { invalidInput } from '../errors'

export interface OrderSource {
  quoteId?: number
  lines?: { sku: string; quantity: number }[]
  branchId?: number
}

interface WantedLine { sku: string; quantity: number; quoteLineId: number | null; quotedUnitNetMinor: number | null }
type Skipped = { sku: string; reason: string }[]

export interface PricedOrder extends Omit<OrderAmounts, 'taxRateBp'> {
  branch: Branch
  lines: PricedLine[]
  skipped: Skipped
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
    if (prev) prev.quantity += l.quantity
    else merged.set(skuKey(l.sku), { sku: l.sku.trim(), quantity: l.quantity, quoteLineId: null, quotedUnitNetMinor: null })
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

/** Where the garage typed the SKU, so the message lands beside that basket line. */
function originalIndex(source: OrderSource, sku: string): number | undefined {
  const i = (source.lines ?? []).findIndex((l) => skuKey(l.sku) === skuKey(sku))
  return i >= 0 ? i : undefined
}

/**
 * Prices what the garage wants at its current net prices. Unknown, discontinued or unpriced basket lines are
 * a 422 naming the line (`lines.N.sku`); for a quote they are skipped with the reason (the garage sees it).
 */
export async function priceOrder(org: Organisation, source: OrderSource, t?: Transaction): Promise<PricedOrder> {
  const branch = await resolveBranch(org, source.branchId, t)
  const { wanted, skipped } = await wantedLines(org, source, t)
  const prices = await garagePrices(org, wanted.flatMap((w) => [w.sku, w.sku.toUpperCase()]), t)
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
  const { subtotalMinor, coreDepositMinor, taxMinor, totalMinor } = orderTotals(lines)
  return { branch, lines, skipped, subtotalMinor, coreDepositMinor, taxMinor, totalMinor }
}

/** The priced order's figures as an order states them, in the installation's currency. */
export function orderAmounts(priced: PricedOrder, currency: string): OrderAmounts & { currency: string } {
  const { subtotalMinor, coreDepositMinor, taxMinor, totalMinor } = priced
  return { subtotalMinor, coreDepositMinor, taxRateBp: ORDER_TAX_RATE_BP, taxMinor, totalMinor, currency }
}
