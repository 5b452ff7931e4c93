/**
 * A discount on the whole quote split across the tax rates of what it discounts, in proportion (the usual
 * practice: HMRC's VAT Notice 700 asks for a "fair and reasonable" apportionment of one price across supplies
 * at different rates and gives no single method; a split in proportion to value is common practice), by largest
 * remainder so the shares add up exactly. Expected figures are worked by hand below.
 */
import { describe, expect, it } from 'vitest'
import { quoteTotals, splitInProportion, type TotalsLineInput } from '#shared/utils/quote-totals'

describe('splitting a discount across tax rates', () => {
  it('matches a published mixed-rate example: 683.00 at 20 % and 128.00 at 0 % less 2.5 % comes to 133.18 tax', () => {
    // AAT Indirect Tax practice assessment (as discussed at forums.aat.org.uk, "Indirect Tax", discussion
    // 440663): standard-rated 683.00 + zero-rated 128.00, a 2.5 % discount; VAT on the invoice 133.18.
    // Here the garage gives 20.28 off (2.5 % of 811.00 = 20.275, stated as 20.28):
    //   shares: 20.28 x 683/811 = 17.0792.. and 20.28 x 128/811 = 3.2007..; whole pennies 1707 + 320 = 2027,
    //           the penny left goes to the larger remainder (.92 against .08): 17.08 at 20 %, 3.20 at 0 %
    //   tax:    683.00 x 20 % = 136.60; -17.08 x 20 % = -3.416 -> -3.42; 136.60 - 3.42 = 133.18
    //   (the assessment takes 2.5 % off 683.00 first: 665.925 x 20 % = 133.185, shown as 133.18)
    const lines: TotalsLineInput[] = [
      { id: 1, kind: 'part', amountMinor: 68_300, taxBp: 2000 },
      { id: 2, kind: 'sundry', amountMinor: 12_800, taxBp: 0 },
      { id: 3, kind: 'discount', amountMinor: -2_028, taxBp: 2000 },
    ]
    const t = quoteTotals(lines)
    expect(t.lines.find((l) => l.id === 3)!.shares).toEqual([{ taxBp: 2000, netMinor: -1_708, taxMinor: -342 }, { taxBp: 0, netMinor: -320, taxMinor: 0 }])
    expect(t).toMatchObject({ netMinor: 79_072, taxMinor: 13_318, grossMinor: 92_390 })
    expect(t.byRate).toEqual([{ taxBp: 2000, netMinor: 66_592, taxMinor: 13_318 }, { taxBp: 0, netMinor: 12_480, taxMinor: 0 }])
  })

  it('splits 10.00 off 100.00 at 20 % and 50.00 at 5 % (worked by hand)', () => {
    // bases 100.00 and 50.00 (150.00): 10.00 x 100/150 = 6.666.. and 10.00 x 50/150 = 3.333..;
    // 666 + 333 = 999, the penny left to the larger remainder (.67): 6.67 at 20 %, 3.33 at 5 %
    // tax: 20.00 - 1.334 -> -1.33 = 18.67 at 20 %; 2.50 - 0.1665 -> -0.17 = 2.33 at 5 %; 21.00 in all
    // (taxing the whole 10.00 at 20 % would take 2.00 off the tax, not 1.50: 20.50)
    const t = quoteTotals([
      { id: 1, kind: 'part', amountMinor: 10_000, taxBp: 2000 },
      { id: 2, kind: 'sundry', amountMinor: 5_000, taxBp: 500 },
      { id: 3, kind: 'discount', amountMinor: -1_000, taxBp: 2000 },
    ])
    expect(t.lines.find((l) => l.id === 3)).toMatchObject({ amountMinor: -1_000, taxMinor: -150, grossMinor: -1_150 })
    expect(t.byRate).toEqual([{ taxBp: 2000, netMinor: 9_333, taxMinor: 1_867 }, { taxBp: 500, netMinor: 4_667, taxMinor: 233 }])
    expect(t).toMatchObject({ netMinor: 14_000, taxMinor: 2_100, grossMinor: 16_100 })
  })

  it('splits a discount stated with tax by the lines\' prices with tax (worked by hand)', () => {
    // with tax: 120.00 at 20 % and 52.50 at 5 % (172.50); 12.00 off with tax:
    //   12.00 x 120/172.5 = 8.3478.. and 12.00 x 52.5/172.5 = 3.6521..; 834 + 365 = 1199, penny to .78: 8.35 and 3.65
    //   tax inside: 8.35 / 6 = 1.3916.. -> 1.39 (net 6.96); 3.65 / 21 = 0.1738.. -> 0.17 (net 3.48)
    //   totals: net 150.00 - 6.96 - 3.48 = 139.56; tax 22.50 - 1.39 - 0.17 = 20.94; gross 160.50 = 172.50 - 12.00
    const t = quoteTotals([
      { id: 1, kind: 'part', amountMinor: 12_000, taxBp: 2000, taxIncluded: true },
      { id: 2, kind: 'sundry', amountMinor: 5_250, taxBp: 500, taxIncluded: true },
      { id: 3, kind: 'discount', amountMinor: -1_200, taxBp: 2000, taxIncluded: true },
    ])
    expect(t.lines.find((l) => l.id === 3)!.shares).toEqual([{ taxBp: 2000, netMinor: -696, taxMinor: -139 }, { taxBp: 500, netMinor: -348, taxMinor: -17 }])
    expect(t).toMatchObject({ netMinor: 13_956, taxMinor: 2_094, grossMinor: 16_050 })
  })

  it('never discounts core deposits, and takes exactly what is left when a discount takes everything', () => {
    // three 0.03 lines at 20 %: each 0.006 -> 0.01 tax, 0.03 in all; 0.09 off takes net 0.09 and tax 0.03, not 0.018 -> 0.02
    const t = quoteTotals([
      { id: 1, kind: 'labour', amountMinor: 3, taxBp: 2000 },
      { id: 2, kind: 'labour', amountMinor: 3, taxBp: 2000 },
      { id: 3, kind: 'labour', amountMinor: 3, taxBp: 2000 },
      { id: 4, kind: 'core_deposit', amountMinor: 4_000, taxBp: 0 },
      { id: 5, kind: 'discount', amountMinor: -9, taxBp: 2000 },
    ])
    expect(t).toMatchObject({ netMinor: 4_000, taxMinor: 0, grossMinor: 4_000, discountCapped: false })
    // a discount larger than the work (the deposit does not count) is reduced and said so
    const over = quoteTotals([{ kind: 'labour', amountMinor: 100, taxBp: 2000 }, { kind: 'core_deposit', amountMinor: 4_000, taxBp: 0 }, { kind: 'discount', amountMinor: -500, taxBp: 2000 }])
    expect(over).toMatchObject({ netMinor: 4_000, taxMinor: 0, discountCapped: true })
  })

  it('shares add up to the amount exactly, by largest remainder (worked by hand)', () => {
    expect(splitInProportion(100, [1, 1, 1])).toEqual([34, 33, 33]) // 33.33 each, the one left to the first of equals
    expect(splitInProportion(10, [0, 5])).toEqual([0, 10])
    expect(splitInProportion(0, [3, 4])).toEqual([0, 0])
    expect(() => splitInProportion(5, [0, 0])).toThrow(RangeError)
    let seed = 7
    const rnd = () => (seed = (seed * 1_103_515_245 + 12_345) % 2 ** 31) / 2 ** 31
    for (let i = 0; i < 500; i++) {
      const weights = [Math.floor(rnd() * 1e7), Math.floor(rnd() * 1e7), Math.floor(rnd() * 1e5) + 1]
      const amount = Math.floor(rnd() * weights.reduce((s, w) => s + w, 0))
      const parts = splitInProportion(amount, weights)
      expect(parts.reduce((s, p) => s + p, 0)).toBe(amount)
      parts.forEach((p, k) => expect(p).toBeLessThanOrEqual(weights[k]!))
    }
  })
})
