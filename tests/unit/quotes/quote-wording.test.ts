import { describe, expect, it } from 'vitest'
import { computeWear } from '#shared/utils/brake'
import { plainFinding } from '#shared/utils/quote-wording'

describe('findings in plain words', () => {
  it('says what a failed disc, thin pads and wet fluid mean for the owner, with the figures', () => {
    const r = computeWear({
      discs: [{ position: 'front-left', thicknessReadingsMm: [21.6], minThicknessMm: 22 }],
      pads: [{ axle: 'rear', innerMm: 2.8, outerMm: 3 }],
      fluid: { gradeInSystem: 'DOT 4', waterPercent: 3.5 },
    })
    const words = r.items.filter((i) => i.verdict !== 'ok').map(plainFinding)
    expect(words).toContain('The front left brake disc has worn thinner than its safe minimum (21.6 mm; the minimum is 22 mm). It has to be replaced, with its partner on the same axle.')
    expect(words.some((w) => /^The rear brake pads are getting thin \(2\.8 mm left\)\.$/.test(w))).toBe(true)
    expect(words.some((w) => /brake fluid has taken up too much water \(3\.5 %\)/.test(w))).toBe(true)
    // no technician's shorthand left over
    for (const w of words) expect(w).not.toMatch(/front-left|TV|runout/)
  })
})
