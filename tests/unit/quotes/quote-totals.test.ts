import { describe, expect, it } from 'vitest'
import { all, create } from 'mathjs'
import {
  hoursToHundredths, labourAmountMinor, lineTaxMinor, quoteTotals, quoteTotalsBrief, sellingUnitMinor, formatBp,
  type TotalsLineInput,
} from '#shared/utils/quote-totals'

// Reference: mathjs BigNumber (decimal.js, general-purpose library from npm). Its default rounding mode is
// ROUND_HALF_UP, which decimal.js defines as "rounds towards nearest neighbour; if equidistant, rounds away
// from zero": exactly the product's rule, computed in decimal instead of our integer division.
const math = create(all, { number: 'BigNumber', precision: 64 })
const dec = (x: number | string) => math.bignumber(x)
/** reference: value in minor units (may be fractional) rounded half away from zero, as a JS number */
const refRound = (x: ReturnType<typeof dec>) => Number(math.round(x).toString())
const refTax = (amount: number, bp: number) => refRound(math.divide(math.multiply(dec(amount), dec(bp)), dec(10_000)) as never)

const part = (amountMinor: number, taxBp = 2000, id?: number): TotalsLineInput => ({ id, kind: 'part', amountMinor, taxBp })

describe('tax per line, rounded half away from zero', () => {
  it('rounds the 0.5 minor-unit boundary up for charges and down for discounts', () => {
    // 20 % of 2.5p is exactly 0.5p -> 1p; of -2.5p (a discount) -> -1p (rule: half away from zero)
    expect(lineTaxMinor(25, 2000)).toBe(5)
    expect(lineTaxMinor(1, 5000)).toBe(1) // 0.5 -> 1
    expect(lineTaxMinor(-1, 5000)).toBe(-1) // -0.5 -> -1
    expect(lineTaxMinor(3, 5000)).toBe(2) // 1.5 -> 2 (not banker's rounding, which would give 2 as well)
    expect(lineTaxMinor(5, 5000)).toBe(3) // 2.5 -> 3 (banker's rounding would give 2)
    expect(lineTaxMinor(2, 2000)).toBe(0) // 0.4 -> 0
    expect(lineTaxMinor(3, 2000)).toBe(1) // 0.6 -> 1
    // 17.5 % (the UK's former standard rate): 10p -> 1.75p -> 2p; 2p -> 0.35p -> 0 (from memory)
    expect(lineTaxMinor(10, 1750)).toBe(2)
    expect(lineTaxMinor(2, 1750)).toBe(0)
  })

  it('agrees with decimal arithmetic (mathjs BigNumber) over a sweep of amounts and rates', () => {
    for (const bp of [0, 500, 1250, 1750, 2000, 2500, 5000]) {
      for (let amount = -2_000; amount <= 2_000; amount += 1) {
        expect(lineTaxMinor(amount, bp)).toBe(refTax(amount, bp))
      }
    }
  })

  it('charges nothing at 0 % and refuses negative or fractional inputs', () => {
    expect(lineTaxMinor(123_456, 0)).toBe(0)
    expect(() => lineTaxMinor(10, -1)).toThrow(RangeError)
    expect(() => lineTaxMinor(10.5, 2000)).toThrow(RangeError)
  })

  it('works out UK VAT at 20 % on a worked amount: £12.34 -> £2.47 (12.34 x 0.2 = 2.468, common practice)', () => {
    expect(lineTaxMinor(1234, 2000)).toBe(247)
  })
})

describe('selling prices and labour', () => {
  it('adds the markup to the net price and rounds the unit price once', () => {
    expect(sellingUnitMinor(1000, 3000)).toBe(1300)
    expect(sellingUnitMinor(1001, 2500)).toBe(1251) // 1251.25 -> 1251
    expect(sellingUnitMinor(1002, 2500)).toBe(1253) // 1252.5 -> 1253 (half away from zero)
    expect(sellingUnitMinor(999, 0)).toBe(999)
    expect(() => sellingUnitMinor(100, -10_001)).toThrow(RangeError)
  })

  it('matches decimal arithmetic for markups (mathjs BigNumber)', () => {
    for (const bp of [1250, 3333, 3500, 4000]) {
      for (let net = 0; net <= 5000; net += 7) {
        const ref = refRound(math.divide(math.multiply(dec(net), dec(10_000 + bp)), dec(10_000)) as never)
        expect(sellingUnitMinor(net, bp)).toBe(ref)
      }
    }
  })

  it('prices labour from hundredths of an hour', () => {
    expect(labourAmountMinor(150, 6500)).toBe(9750) // 1.5 h at £65.00
    expect(labourAmountMinor(25, 6550)).toBe(1638) // 0.25 h x 65.50 = 16.375 -> 16.38
    expect(labourAmountMinor(33, 5001)).toBe(1650) // 16.5033 -> 16.50
    expect(hoursToHundredths(1.5)).toBe(150)
    expect(hoursToHundredths(0.1 + 0.2)).toBe(30) // binary floating point noise is not a third decimal
    expect(hoursToHundredths(1.255)).toBeNull()
    expect(hoursToHundredths(-1)).toBeNull()
  })
})

describe('quote totals', () => {
  it('sums line taxes (never re-rounds the total): three lines of 2.5p tax make 9p, not 7.5p rounded to 8p', () => {
    // each line: 25p at 10 % = 2.5p -> 3p; 3 x 3p = 9p. Taxing the 75p sum instead would give 8p: not our rule.
    const lines = [part(25, 1000), part(25, 1000), part(25, 1000)]
    const t = quoteTotals(lines)
    expect(t.netMinor).toBe(75)
    expect(t.taxMinor).toBe(9) // 3 x round(2.5) = 3 x 3
    expect(t.grossMinor).toBe(84)
    expect(lineTaxMinor(75, 1000)).toBe(8) // what tax on the total would have given: a different, rejected rule
  })

  it('handles many lines exactly (10 000 lines, compared with mathjs BigNumber)', () => {
    let seed = 42
    const rnd = () => (seed = (seed * 1_103_515_245 + 12_345) % 2 ** 31) / 2 ** 31
    const lines: TotalsLineInput[] = []
    for (let i = 0; i < 10_000; i++) lines.push(part(Math.floor(rnd() * 50_000), [0, 500, 2000][i % 3]!, i))
    const t = quoteTotals(lines)
    let refNet = dec(0)
    let refTaxSum = dec(0)
    for (const l of lines) {
      refNet = math.add(refNet, dec(l.amountMinor)) as never
      refTaxSum = math.add(refTaxSum, dec(refTax(l.amountMinor, l.taxBp))) as never
    }
    expect(t.netMinor).toBe(Number(refNet.toString()))
    expect(t.taxMinor).toBe(Number(refTaxSum.toString()))
    expect(t.grossMinor).toBe(t.netMinor + t.taxMinor)
    expect(t.byRate.map((r) => r.taxBp)).toEqual([2000, 500, 0])
    expect(t.byRate.reduce((s, r) => s + r.taxMinor, 0)).toBe(t.taxMinor)
    expect(t.byRate.find((r) => r.taxBp === 0)!.taxMinor).toBe(0)
  })

  it('mixes 0 % and 20 % lines', () => {
    const t = quoteTotals([part(10_000, 2000), part(3_333, 0), part(1, 2000)])
    expect(t).toMatchObject({ netMinor: 13_334, taxMinor: 2000, grossMinor: 15_334 })
    expect(t.byRate).toEqual([{ taxBp: 2000, netMinor: 10_001, taxMinor: 2000 }, { taxBp: 0, netMinor: 3_333, taxMinor: 0 }])
  })

  it('takes a discount line off the net and its tax off the tax, at the rate of what it discounts, rounding away from zero', () => {
    const t = quoteTotals([part(10_000, 2000, 1), { id: 2, kind: 'discount', amountMinor: -1_002, taxBp: 2000 }, { id: 3, kind: 'discount', amountMinor: -3, taxBp: 5000 }])
    // 10 000 - 1 002 - 3 = 8 995; everything discounted is at 20 %, whatever rate the discount line carries:
    // tax 2 000 - 200.4 -> -200, -0.6 -> -1: 1 799
    expect(t).toMatchObject({ netMinor: 8_995, taxMinor: 1_799, grossMinor: 10_794, discountCapped: false })
    expect(t.lines.find((l) => l.id === 3)).toMatchObject({ taxBp: 2000, taxMinor: -1 })
  })

  it('never lets a discount take the net below zero, and drops discounts when nothing is taken', () => {
    const lines: TotalsLineInput[] = [
      { id: 1, kind: 'part', amountMinor: 5_000, taxBp: 2000, included: false },
      { id: 2, kind: 'labour', amountMinor: 1_500, taxBp: 2000 },
      { id: 3, kind: 'discount', amountMinor: -1_000, taxBp: 2000 },
      { id: 4, kind: 'discount', amountMinor: -1_000, taxBp: 2000 },
    ]
    const t = quoteTotals(lines)
    expect(t.discountCapped).toBe(true)
    expect(t.netMinor).toBe(0)
    expect(t.taxMinor).toBe(0) // 300 - 200 - 100
    expect(t.lines.find((l) => l.id === 4)).toMatchObject({ amountMinor: -500, taxMinor: -100 })
    const none = quoteTotals(lines.map((l) => (l.kind === 'discount' ? l : { ...l, included: false })))
    expect(none).toMatchObject({ netMinor: 0, taxMinor: 0, grossMinor: 0 })
  })

  it('gives 0 for an empty quote and never -0', () => {
    expect(quoteTotalsBrief([])).toEqual({ netMinor: 0, taxMinor: 0, grossMinor: 0 })
    expect(Object.is(quoteTotals([{ kind: 'discount', amountMinor: -1, taxBp: 2000 }]).taxMinor, -0)).toBe(false)
  })

  it('refuses lines with the wrong sign', () => {
    expect(() => quoteTotals([{ kind: 'discount', amountMinor: 5, taxBp: 0 }])).toThrow(RangeError)
    expect(() => quoteTotals([{ kind: 'part', amountMinor: -5, taxBp: 0 }])).toThrow(RangeError)
  })

  it('formats rates for people', () => {
    expect(formatBp(2000)).toBe('20 %')
    expect(formatBp(1250)).toBe('12.5 %')
    expect(formatBp(0)).toBe('0 %')
  })
})
