import { describe, expect, it } from 'vitest'
import { DEFAULT_MARKUP_RULES, markupBpFor, type MarkupRules } from '#shared/utils/quote-markup'
import { sellingUnitMinor } from '#shared/utils/quote-totals'

describe('markup rules', () => {
  it('by part type: the type\'s percentage, else the default', () => {
    const rules: MarkupRules = { mode: 'by_type', defaultBp: 2500, byType: { pad_set: 4000, disc: 3000 } }
    expect(markupBpFor(rules, { type: 'pad_set', unitNetMinor: 1999 })).toBe(4000)
    expect(markupBpFor(rules, { type: 'disc', unitNetMinor: 4550 })).toBe(3000)
    expect(markupBpFor(rules, { type: 'caliper', unitNetMinor: 9000 })).toBe(2500)
  })

  it('by cost band: upper bounds are inclusive; above the last bound the open band applies', () => {
    const rules: MarkupRules = {
      mode: 'by_cost',
      // deliberately out of order: the function sorts them
      bands: [{ upToMinor: null, bp: 1500 }, { upToMinor: 1000, bp: 6000 }, { upToMinor: 5000, bp: 3500 }],
    }
    expect(markupBpFor(rules, { type: 'x', unitNetMinor: 0 })).toBe(6000)
    expect(markupBpFor(rules, { type: 'x', unitNetMinor: 1000 })).toBe(6000)
    expect(markupBpFor(rules, { type: 'x', unitNetMinor: 1001 })).toBe(3500)
    expect(markupBpFor(rules, { type: 'x', unitNetMinor: 5000 })).toBe(3500)
    expect(markupBpFor(rules, { type: 'x', unitNetMinor: 5001 })).toBe(1500)
    expect(markupBpFor(rules, { type: 'x', unitNetMinor: 10_000_000 })).toBe(1500)
  })

  it('falls back to the last band when no band is open-ended', () => {
    const rules: MarkupRules = { mode: 'by_cost', bands: [{ upToMinor: 1000, bp: 5000 }, { upToMinor: 2000, bp: 4000 }] }
    expect(markupBpFor(rules, { type: 'x', unitNetMinor: 3000 })).toBe(4000)
  })

  it('turns a Silver net price into a selling price: list £50.00, 12.5 % off = £43.75 net, +35 % = £59.06', () => {
    // 4375 x 1.35 = 5906.25 -> 5906 (half away from zero; worked by hand, common practice)
    const bp = markupBpFor(DEFAULT_MARKUP_RULES, { type: 'pad_set', unitNetMinor: 4375 })
    expect(bp).toBe(3500)
    expect(sellingUnitMinor(4375, bp)).toBe(5906)
  })
})
