import { describe, expect, it } from 'vitest'
import { SEVERITY_SCALE, computeWear } from '#shared/utils/brake'
import { FINDING_WORDS, QUOTE_SAFETY_CAUTION, RECOMMENDATION_WORDS, plainFinding } from '#shared/utils/quote-wording'

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

describe('one severity scale from the inspection to the owner', () => {
  it('the same words for a verdict and for the line that puts it right', () => {
    expect(FINDING_WORDS).toEqual({ fail: SEVERITY_SCALE.fail.word, advise: SEVERITY_SCALE.advise.word })
    expect(RECOMMENDATION_WORDS).toEqual({ required: SEVERITY_SCALE.fail.word, advised: SEVERITY_SCALE.advise.word })
    expect(QUOTE_SAFETY_CAUTION).toContain(`"${SEVERITY_SCALE.fail.word}"`)
  })

  it('names the wheel for every finding of a wheel, and says runout is re-checked, not required', () => {
    const r = computeWear({
      discs: [{ position: 'rear-right', thicknessReadingsMm: [10.2, 10.3], minThicknessMm: 9, runoutMm: 0.12 }],
      pads: [{ axle: 'front', side: 'left', innerMm: 1.2, outerMm: 4 }],
      drums: [{ position: 'rear-left', diameterMm: 230.1, maxDiameterMm: 230.1 }],
      conditions: [{ position: 'front-right', item: 'hose', state: 'fail' }],
    })
    const words = r.items.filter((i) => i.verdict !== 'ok').map(plainFinding)
    expect(words).toContain('The rear right brake disc wobbles as it turns, which makes the brakes judder. It is checked again after cleaning the hub; if it still wobbles it needs renewing.')
    expect(words).toContain('The front left brake pads are worn down to 1.2 mm: too thin to be safe.')
    expect(words.some((w) => /^The rear left brake drum is close to its largest safe size/.test(w))).toBe(true)
    expect(words).toContain('The front right brake hose is damaged and not safe: it has to be renewed.')
    expect(r.items.find((i) => i.kind === 'disc-runout')!.verdict).toBe('advise')
  })
})
