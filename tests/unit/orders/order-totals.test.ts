/**
 * Distributor order arithmetic, checked against mathjs BigNumber arithmetic (decimal.js, rounding half up:
 * a general-purpose reference library) rather than against our own helpers.
 * VAT: UK standard rate 20 % (gov.uk "VAT rates"); worked per line and rounded to the nearest penny, halves up
 * (HMRC VAT Notice 700, section 17: rounding of amounts of VAT, from memory).
 */
import { describe, expect, it } from 'vitest'
import { create, all } from 'mathjs'
import { ORDER_TAX_RATE_BP, orderLineTaxMinor, orderTotals } from '../../../shared/utils/order-totals'
import { netPriceMinor } from '../../../shared/utils/money'
import { OrderCreateSchema, CoreReturnDecisionSchema } from '../../../shared/schemas/orders'

const math = create(all, { number: 'BigNumber', precision: 40 })
/** reference: amount x rate, rounded half up to a whole minor unit */
const refTax = (net: number, bp: number) => Number(math.round(math.evaluate(`${net} * ${bp} / 10000`)))

describe('order totals', () => {
  it('uses the UK standard rate of VAT, 20 %', () => {
    expect(ORDER_TAX_RATE_BP).toBe(2000)
    // £100.00 net -> £20.00 VAT (gov.uk "VAT rates": standard rate 20 %)
    expect(orderLineTaxMinor(10_000)).toBe(2_000)
  })

  it('works tax per line and sums the line taxes, matching the reference', () => {
    const lines = [
      { quantity: 3, unitNetMinor: 1_234, coreDepositUnitMinor: 0 }, // 3702 -> 740.4
      { quantity: 1, unitNetMinor: 8_002, coreDepositUnitMinor: 4_000 }, // 8002 -> 1600.4
      { quantity: 2, unitNetMinor: 999, coreDepositUnitMinor: 250 }, // 1998 -> 399.6
    ]
    const t = orderTotals(lines)
    const expected = lines.map((l) => refTax(l.quantity * l.unitNetMinor, 2000))
    expect(t.lines.map((l) => l.lineTaxMinor)).toEqual(expected)
    expect(expected).toEqual([740, 1600, 400])
    expect(t.subtotalMinor).toBe(3_702 + 8_002 + 1_998)
    // the deposits carry tax at the part's rate too (the core deposit rule): 4000 -> 800, 500 -> 100
    expect(t.lines.map((l) => l.coreDepositTaxMinor)).toEqual([0, refTax(4_000, 2000), refTax(500, 2000)])
    expect(t.coreDepositTaxMinor).toBe(900)
    expect(t.taxMinor).toBe(2_740 + 900)
    expect(t.coreDepositMinor).toBe(4_000 + 500)
    expect(t.totalMinor).toBe(13_702 + 3_640 + 4_500)
  })

  it('rounds an exact half penny up, as the reference does', () => {
    // at 12.5 %, 4p of net carries exactly half a penny of tax
    expect(orderLineTaxMinor(4, 1250)).toBe(refTax(4, 1250))
    expect(orderLineTaxMinor(4, 1250)).toBe(1)
    for (const net of [1, 3, 7, 12, 99, 1_001, 123_457]) expect(orderLineTaxMinor(net, 1250)).toBe(refTax(net, 1250))
  })

  it('prices a Silver garage at list less 12.5 %, rounded once', () => {
    // 9145 x 0.875 = 8001.875 -> 8002 (reference: mathjs)
    expect(netPriceMinor(9_145, 1250)).toBe(Number(math.round(math.evaluate('9145 * 0.875'))))
  })

  it('refuses amounts that are not whole minor units', () => {
    expect(() => orderTotals([{ quantity: 1, unitNetMinor: 10.5, coreDepositUnitMinor: 0 }])).toThrow(RangeError)
    expect(() => orderTotals([{ quantity: -1, unitNetMinor: 100, coreDepositUnitMinor: 0 }])).toThrow(RangeError)
  })
})

describe('order input schemas', () => {
  it('needs a quote or basket lines, not both, and a payment method', () => {
    expect(OrderCreateSchema.safeParse({ lines: [{ sku: 'KP-1', quantity: 1 }], payment: 'card' }).success).toBe(true)
    expect(OrderCreateSchema.safeParse({ quoteId: 3, payment: 'account' }).success).toBe(true)
    const both = OrderCreateSchema.safeParse({ quoteId: 3, lines: [{ sku: 'KP-1', quantity: 1 }], payment: 'card' })
    expect(both.success).toBe(false)
    expect(OrderCreateSchema.safeParse({ lines: [], payment: 'card' }).success).toBe(false)
    expect(OrderCreateSchema.safeParse({ lines: [{ sku: 'KP-1', quantity: 1 }] }).success).toBe(false)
    // no prices or states from the client
    expect(OrderCreateSchema.safeParse({ lines: [{ sku: 'KP-1', quantity: 1, unitNetMinor: 1 }], payment: 'card' }).success).toBe(false)
  })

  it('wants a reason to turn a core return down', () => {
    expect(CoreReturnDecisionSchema.safeParse({ status: 'rejected' }).success).toBe(false)
    expect(CoreReturnDecisionSchema.safeParse({ status: 'rejected', reason: 'Cracked casting' }).success).toBe(true)
    expect(CoreReturnDecisionSchema.safeParse({ status: 'accepted' }).success).toBe(true)
  })
})
