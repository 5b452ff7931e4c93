/**
 * The core deposit rule and the shares of stated tax: a deposit carries tax at the part's rate, worked per line;
 * a split or partly credited line takes its share of the stated tax rounded half away from zero and the last
 * piece takes what is left, so the pieces never add up to more than was stated. Expected values are worked by
 * hand (shown beside each) and checked against mathjs BigNumber arithmetic (decimal.js, a general-purpose
 * reference library). VAT: UK standard rate 20 % (gov.uk "VAT rates").
 */
import { describe, expect, it } from 'vitest'
import { all, create } from 'mathjs'
import { orderLineFigures, orderTotals, shareOfTax } from '../../../shared/utils/order-totals'
import { creditOf, type Creditable } from '../../../server/services/documents/creditable'
import { returnTerms } from '../../../server/services/returns/rules'
import { counterSettings } from '../../../server/services/orders/counter-settings'
import type { DocumentLine } from '../../../server/models/counter'

const math = create(all, { number: 'BigNumber', precision: 40 })
const refRound = (expr: string) => Number(math.round(math.evaluate(expr)))

describe('tax on core deposits', () => {
  it('taxes the deposit at the part\'s rate, per line', () => {
    // 2 x £100.00 = £200.00, VAT £40.00; deposits 2 x £25.00 = £50.00, VAT £10.00; total £300.00
    expect(orderLineFigures({ quantity: 2, unitNetMinor: 10_000, coreDepositUnitMinor: 2_500 })).toEqual({ lineNetMinor: 20_000, lineTaxMinor: 4_000, coreDepositMinor: 5_000, coreDepositTaxMinor: 1_000 })
    const t = orderTotals([{ quantity: 2, unitNetMinor: 10_000, coreDepositUnitMinor: 2_500 }, { quantity: 1, unitNetMinor: 1_001, coreDepositUnitMinor: 333 }])
    // second line: £10.01 -> VAT 200.2 -> £2.00; deposit £3.33 -> VAT 66.6 -> £0.67
    expect(t.lines[1]).toEqual({ lineNetMinor: 1_001, lineTaxMinor: refRound('1001 * 0.2'), coreDepositMinor: 333, coreDepositTaxMinor: refRound('333 * 0.2') })
    expect(t).toMatchObject({ subtotalMinor: 21_001, coreDepositMinor: 5_333, coreDepositTaxMinor: 1_067, taxMinor: 4_000 + 200 + 1_067, totalMinor: 21_001 + 5_333 + 5_267 })
  })
})

describe('shares of a stated tax', () => {
  it('rounds a part\'s share half away from zero and gives the whole to the whole', () => {
    // 601 x 1/3 = 200.33 -> 200; 601 x 2/3 = 400.67 -> 401
    expect(shareOfTax(601, 1, 3)).toBe(refRound('601 / 3'))
    expect(shareOfTax(601, 2, 3)).toBe(401)
    expect(shareOfTax(601, 3, 3)).toBe(601)
    expect(() => shareOfTax(601, 4, 3)).toThrow(RangeError)
  })

  const invoiced = (quantity: number, netMinor: number, taxMinor: number) =>
    ({ orderLineId: 1, kind: 'part', sku: 'KD-1', description: 'disc', quantity, unitMinor: netMinor / quantity, netMinor, taxBp: 2000, taxMinor }) as unknown as DocumentLine
  const left = (line: DocumentLine, quantity: number, net: number, tax: number): Creditable => ({ invoiced: line, quantity, netMinor: net, taxMinor: tax })

  it('credits a line piece by piece to exactly what the invoice charged, never more', () => {
    // 3 x £10.01 = £30.03, VAT £6.01 (6.006 rounded)
    const line = invoiced(3, 3_003, 601)
    const a = creditOf(left(line, 3, 3_003, 601), 1)
    const b = creditOf(left(line, 2, 3_003 - a.netMinor, 601 - a.taxMinor), 1)
    const c = creditOf(left(line, 1, 3_003 - a.netMinor - b.netMinor, 601 - a.taxMinor - b.taxMinor), 1)
    expect([a.taxMinor, b.taxMinor, c.taxMinor]).toEqual([200, 200, 201])
    expect(a.netMinor + b.netMinor + c.netMinor).toBe(3_003)
    expect(() => creditOf(left(line, 0, 0, 0), 1)).toThrow(/Only 0/)
  })

  it('never lets the rounded share of a small tax run over what is left', () => {
    // 4 x £0.02 = £0.08, VAT 1.6 -> £0.02; 2 of 4 -> 1; then 1 of 4 -> 0.5 -> 1 would leave 0 for the last: capped
    const line = invoiced(4, 8, 2)
    const a = creditOf(left(line, 4, 8, 2), 2)
    const b = creditOf(left(line, 2, 8 - a.netMinor, 2 - a.taxMinor), 1)
    const c = creditOf(left(line, 1, 8 - a.netMinor - b.netMinor, 2 - a.taxMinor - b.taxMinor), 1)
    expect(a.taxMinor + b.taxMinor + c.taxMinor).toBe(2)
    expect(c.taxMinor).toBeGreaterThanOrEqual(0)
  })
})

describe('return periods and the restocking charge', () => {
  const s = counterSettings({})
  const sent = new Date('2026-11-02T10:00:00Z')
  const day = (n: number) => new Date(sent.getTime() + n * 86_400_000)
  it('uses the configured defaults: 30 days, a year for faults, 15 % after 14 days for unneeded parts', () => {
    expect(s).toEqual({ supplierLeadDays: 2, returnDays: 30, warrantyDays: 365, restockingAfterDays: 14, restockingBp: 1500 })
    expect(returnTerms('not_needed', sent, day(14), s, 'Europe/London')).toMatchObject({ allowed: true, restockingBp: 0 })
    expect(returnTerms('not_needed', sent, day(15), s, 'Europe/London')).toMatchObject({ allowed: true, restockingBp: 1500 })
    expect(returnTerms('wrong_part', sent, day(20), s, 'Europe/London')).toMatchObject({ allowed: true, restockingBp: 0 })
    expect(returnTerms('wrong_part', sent, day(31), s, 'Europe/London')).toMatchObject({ allowed: false, limitDays: 30 })
    expect(returnTerms('faulty', sent, day(200), s, 'Europe/London')).toMatchObject({ allowed: true, restockingBp: 0 })
  })
  it('reads other periods from the environment', () => {
    expect(counterSettings({ BORELINE_RETURN_DAYS: '14', BORELINE_RESTOCKING_PERCENT: '12.5' })).toMatchObject({ returnDays: 14, restockingBp: 1250 })
    expect(counterSettings({ BORELINE_RETURN_DAYS: 'soon' }).returnDays).toBe(30)
  })
})
