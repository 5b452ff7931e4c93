/**
 * Prices that include tax. Expected values come from mathjs BigNumber (decimal.js, a general-purpose library:
 * its default rounding ROUND_HALF_UP "rounds towards nearest neighbour; if equidistant, rounds away from zero",
 * the product's rule) or plain integer arithmetic written here, never from the code under test.
 */
import { describe, expect, it } from 'vitest'
import { all, create } from 'mathjs'
import { lineFigures, quoteTotals, restatedMinor, sellingUnitMinor, withPriceEnding } from '#shared/utils/quote-totals'
import { formatMinor, parseMoneyToMinor } from '#shared/utils/money'

const math = create(all, { number: 'BigNumber', precision: 64 })
const dec = (x: number | string) => math.bignumber(x)

/**
 * The tax inside a price that includes it, by the tax fraction rate / (1 + rate) (HMRC, VAT Notice 700 "VAT
 * fraction": 1/6 at 20 %, 1/21 at 5 %, from memory), in decimal: G x r / (10 000 + r) with r in basis points.
 * A tie (x.5 exactly) is a finite decimal, so 64 digits hold it exactly and the rounding is the true one.
 */
function refTaxInside(grossMinor: number, bp: number): number {
  const x = math.divide(math.multiply(dec(grossMinor), dec(bp)), dec(10_000 + bp))
  return Number(math.round(x as never).toString())
}

/** "123.45" from 12345, with integer arithmetic only (what a person types). */
const typed = (minor: number) => `${Math.floor(minor / 100)}.${String(minor % 100).padStart(2, '0')}`

describe('every price with tax from 0.01 to 999.99 can be stated and comes back as it was', () => {
  for (const bp of [2000, 500]) {
    it(`at ${bp / 100} %: reachable, split into net and tax as the tax fraction gives, and round-tripping`, () => {
      for (let gross = 1; gross <= 99_999; gross++) {
        const tax = refTaxInside(gross, bp)
        const entered = parseMoneyToMinor(typed(gross))
        expect(entered).toBe(gross)
        const t = quoteTotals([{ id: 1, kind: 'part', amountMinor: entered!, taxBp: bp, taxIncluded: true }])
        if (t.grossMinor !== gross || t.taxMinor !== tax || t.netMinor !== gross - tax) {
          expect({ gross, net: t.netMinor, tax: t.taxMinor, total: t.grossMinor }).toEqual({ gross, net: gross - tax, tax, total: gross })
        }
        // the same stored amount read again (the owner's page, the PDF, a reload) gives the same net and tax
        const again = lineFigures(gross, bp, true)
        if (again.netMinor !== gross - tax || again.taxMinor !== tax) expect(again).toEqual({ netMinor: gross - tax, taxMinor: tax, grossMinor: gross })
      }
    })
  }

  it('states 99.99, 49.99 and 0.01 at 20 % as worked by hand', () => {
    // 99.99 / 6 = 16.665 -> 16.67 (half away from zero); net 99.99 - 16.67 = 83.32
    expect(lineFigures(9_999, 2000, true)).toEqual({ netMinor: 8_332, taxMinor: 1_667, grossMinor: 9_999 })
    // 49.99 / 6 = 8.331.. -> 8.33; net 41.66
    expect(lineFigures(4_999, 2000, true)).toEqual({ netMinor: 4_166, taxMinor: 833, grossMinor: 4_999 })
    // 0.01 / 6 = 0.0016.. -> 0.00: a penny is all net
    expect(lineFigures(1, 2000, true)).toEqual({ netMinor: 1, taxMinor: 0, grossMinor: 1 })
    // 5 %: 10.50 / 21 = 0.50 exactly; net 10.00
    expect(lineFigures(1_050, 500, true)).toEqual({ netMinor: 1_000, taxMinor: 50, grossMinor: 1_050 })
    expect(formatMinor(9_999, 'GBP')).toBe('£99.99')
  })

  it('shows why: adding tax to a net price leaves 3,166 of the 19,000 prices from 10.00 to 199.99 out of reach at 20 %', () => {
    // integer arithmetic of our own: net n at 20 % comes to n + round(n / 5), half away from zero
    const reachable = new Set<number>()
    for (let n = 0; n <= 20_000; n++) reachable.add(n + Math.floor((2 * n + 5) / 10))
    let out = 0
    for (let g = 1_000; g <= 19_999; g++) if (!reachable.has(g)) out++
    expect(out).toBe(3_166)
    expect(reachable.has(9_999)).toBe(false) // 99.99 (83.32 + 16.66 = 99.98; 83.33 + 16.67 = 100.00)
  })
})

describe('a part priced with tax, price endings and restating a price', () => {
  it('rounds a net price x markup x tax once (mathjs BigNumber)', () => {
    for (const [net, markup, tax] of [[3_333, 3_500, 2_000], [8_759, 2_500, 2_000], [1, 4_000, 500], [12_345, 0, 2_000]] as const) {
      const ref = Number(math.round(math.divide(math.multiply(math.multiply(dec(net), dec(10_000 + markup)), dec(10_000 + tax)), dec(100_000_000)) as never).toString())
      expect(sellingUnitMinor(net, markup, tax)).toBe(ref)
    }
    // by hand: 33.33 x 1.35 x 1.2 = 53.99460 -> 53.99
    expect(sellingUnitMinor(3_333, 3_500, 2_000)).toBe(5_399)
    // a large price loses no minor unit past 2^53: 1 000 000.00 x 5 x 2 = 10 000 000.00
    expect(sellingUnitMinor(100_000_000, 40_000, 10_000)).toBe(1_000_000_000)
  })

  it('moves a price up to the garage\'s ending, never down (worked by hand)', () => {
    expect(withPriceEnding(4_123, 99)).toBe(4_199) // 41.23 -> 41.99
    expect(withPriceEnding(4_199, 99)).toBe(4_199) // already ends in .99
    expect(withPriceEnding(4_200, 99)).toBe(4_299) // 42.00 -> 42.99 (41.99 would lose a penny)
    expect(withPriceEnding(4_201, 0)).toBe(4_300) // whole amounts: 42.01 -> 43.00
    expect(withPriceEnding(4_200, 0)).toBe(4_200)
    expect(withPriceEnding(4_196, 95)).toBe(4_295)
    expect(withPriceEnding(0, 99)).toBe(0) // nothing to charge stays nothing
    expect(withPriceEnding(1_234, null)).toBe(1_234)
    expect(() => withPriceEnding(100, 100)).toThrow(RangeError)
  })

  it('restates a price the other way once, keeping it to the minor unit (worked by hand)', () => {
    expect(restatedMinor(4_166, 2000, true)).toBe(4_999) // 41.66 x 1.2 = 49.992 -> 49.99
    expect(restatedMinor(4_999, 2000, false)).toBe(4_166) // 49.99 / 1.2 = 41.658.. -> 41.66
    expect(restatedMinor(-1_000, 2000, true)).toBe(-1_200) // a discount keeps its sign
  })
})
