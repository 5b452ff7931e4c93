/**
 * Distributor order arithmetic in integer minor units (pure; the server states the totals, the basket page
 * shows the same figures).
 *
 * - A line's net amount is the garage's unit net price x quantity, exactly (the unit price was rounded once,
 *   where it was stated: netPriceMinor in shared/utils/money.ts).
 * - Tax is worked out per line, net x rate rounded half away from zero; the order's tax is the sum of its line
 *   taxes, never re-rounded (the same rule as quotes, shared/utils/quote-totals.ts).
 * - THE CORE DEPOSIT RULE: a core deposit is part of the price of the exchange part it comes with, so it carries
 *   tax at the part's rate, worked per line like the part (deposit x quantity x rate, rounded once). The invoice
 *   charges deposit and its tax; the credit note that returns the deposit when the old unit is accepted credits
 *   the deposit and the same tax back. (A refundable surcharge on an exchange unit is further consideration for
 *   the part, and its refund a reduction of it: HMRC's treatment of exchange-unit surcharges, from memory.)
 * - Once stated, a line's tax is kept with the line: when a line is later split (a short pick), the part that
 *   stays takes its own rounded tax and the part split off takes the remainder, so the order's tax never moves.
 */
import { divRoundHalfUp } from './money'

/** UK standard rate of VAT, 20 % (gov.uk "VAT rates": standard rate 20 %), in basis points. */
export const ORDER_TAX_RATE_BP = 2000

export interface OrderTotalsLine {
  quantity: number
  unitNetMinor: number
  coreDepositUnitMinor: number
}

export interface LineFigures {
  lineNetMinor: number
  lineTaxMinor: number
  coreDepositMinor: number
  coreDepositTaxMinor: number
}

export interface OrderTotals {
  lines: LineFigures[]
  subtotalMinor: number
  coreDepositMinor: number
  /** tax on the parts and on the deposits */
  taxMinor: number
  /** of which on the deposits */
  coreDepositTaxMinor: number
  totalMinor: number
}

/** Tax on one line's net amount (a part line or a deposit line). */
export function orderLineTaxMinor(lineNetMinor: number, taxRateBp = ORDER_TAX_RATE_BP): number {
  return divRoundHalfUp(lineNetMinor * taxRateBp, 10_000)
}

/** One line's amounts: net, its tax, the deposit and the deposit's tax. */
export function orderLineFigures(l: OrderTotalsLine, taxRateBp = ORDER_TAX_RATE_BP): LineFigures {
  for (const k of ['quantity', 'unitNetMinor', 'coreDepositUnitMinor'] as const) {
    const v = l[k]
    if (!Number.isSafeInteger(v) || v < 0) throw new RangeError(`${k} must be a whole number, 0 or more (got ${v})`)
  }
  const lineNetMinor = l.unitNetMinor * l.quantity
  const coreDepositMinor = l.coreDepositUnitMinor * l.quantity
  return {
    lineNetMinor,
    lineTaxMinor: orderLineTaxMinor(lineNetMinor, taxRateBp),
    coreDepositMinor,
    coreDepositTaxMinor: orderLineTaxMinor(coreDepositMinor, taxRateBp),
  }
}

/** Adds up stated line figures into the order's figures. */
export function sumFigures(lines: readonly LineFigures[]): Omit<OrderTotals, 'lines'> {
  const add = (k: keyof LineFigures) => lines.reduce((s, l) => s + l[k], 0)
  const subtotalMinor = add('lineNetMinor')
  const coreDepositMinor = add('coreDepositMinor')
  const coreDepositTaxMinor = add('coreDepositTaxMinor')
  const taxMinor = add('lineTaxMinor') + coreDepositTaxMinor
  return { subtotalMinor, coreDepositMinor, taxMinor, coreDepositTaxMinor, totalMinor: subtotalMinor + coreDepositMinor + taxMinor }
}

/** Subtotal, deposits, tax and the total to pay for a list of order lines. */
export function orderTotals(lines: readonly OrderTotalsLine[], taxRateBp = ORDER_TAX_RATE_BP): OrderTotals {
  const out = lines.map((l) => orderLineFigures(l, taxRateBp))
  return { lines: out, ...sumFigures(out) }
}

/**
 * Splits a stated amount of tax between `part` of `whole` units: the part gets its share rounded half away from
 * zero, never more than the whole; the rest keeps the remainder. Used when a line is split and when part of an
 * invoiced line is credited, so the pieces always add up to exactly what was stated.
 */
export function shareOfTax(taxMinor: number, part: number, whole: number): number {
  if (!Number.isSafeInteger(part) || !Number.isSafeInteger(whole) || part < 0 || whole <= 0 || part > whole) {
    throw new RangeError(`cannot take ${part} of ${whole}`)
  }
  if (part === whole) return taxMinor
  return Math.min(taxMinor, divRoundHalfUp(taxMinor * part, whole))
}
