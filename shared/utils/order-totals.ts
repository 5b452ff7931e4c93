/**
 * Distributor order arithmetic in integer minor units (pure; the server states the totals, the basket page
 * shows the same figures).
 *
 * - A line's net amount is the garage's unit net price x quantity, exactly (the unit price was rounded once,
 *   where it was stated: netPriceMinor in shared/utils/money.ts).
 * - Tax is worked out per line, net x rate rounded half away from zero; the order's tax is the sum of its line
 *   taxes, never re-rounded (the same rule as quotes, shared/utils/quote-totals.ts).
 * - Core deposits are refundable deposits held against the old unit and are shown outside tax.
 */
import { divRoundHalfUp } from './money'

/** UK standard rate of VAT, 20 % (gov.uk "VAT rates": standard rate 20 %), in basis points. */
export const ORDER_TAX_RATE_BP = 2000

export interface OrderTotalsLine {
  quantity: number
  unitNetMinor: number
  coreDepositUnitMinor: number
}

export interface OrderTotals {
  lines: { lineNetMinor: number; lineTaxMinor: number; coreDepositMinor: number }[]
  subtotalMinor: number
  coreDepositMinor: number
  taxMinor: number
  totalMinor: number
}

/** Tax on one line's net amount. */
export function orderLineTaxMinor(lineNetMinor: number, taxRateBp = ORDER_TAX_RATE_BP): number {
  return divRoundHalfUp(lineNetMinor * taxRateBp, 10_000)
}

/** Subtotal, deposits, tax and the total to pay for a list of order lines. */
export function orderTotals(lines: readonly OrderTotalsLine[], taxRateBp = ORDER_TAX_RATE_BP): OrderTotals {
  const out = lines.map((l) => {
    for (const k of ['quantity', 'unitNetMinor', 'coreDepositUnitMinor'] as const) {
      const v = l[k]
      if (!Number.isSafeInteger(v) || v < 0) throw new RangeError(`${k} must be a whole number, 0 or more (got ${v})`)
    }
    const lineNetMinor = l.unitNetMinor * l.quantity
    return { lineNetMinor, lineTaxMinor: orderLineTaxMinor(lineNetMinor, taxRateBp), coreDepositMinor: l.coreDepositUnitMinor * l.quantity }
  })
  const subtotalMinor = out.reduce((s, l) => s + l.lineNetMinor, 0)
  const taxMinor = out.reduce((s, l) => s + l.lineTaxMinor, 0)
  const coreDepositMinor = out.reduce((s, l) => s + l.coreDepositMinor, 0)
  return { lines: out, subtotalMinor, coreDepositMinor, taxMinor, totalMinor: subtotalMinor + taxMinor + coreDepositMinor }
}
