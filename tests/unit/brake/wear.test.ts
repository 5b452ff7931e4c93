/**
 * Wear, condition and fluid verdicts, wheel by wheel. Limits from the outside sources in check-values.md (named beside
 * each check) or marked common practice; every verdict names its wheel.
 */
import { describe, it, expect } from 'vitest'
import { unit } from 'mathjs'
import { WEAR_DEFAULTS, checkCondition, checkDisc, checkDrum, checkPadSides, checkPads, checkShoes, computeWear, worstVerdict } from '#shared/utils/brake/wear'
import { FLUID_GRADES, checkFluid, fluidBoilingPoints, fluidGradesMix } from '#shared/utils/brake/fluid'
import { BrakeInputError } from '#shared/utils/brake/schema-fields'
import type { DiscWear } from '#shared/utils/brake/wear-schemas'

describe('fluid grades and their minimum boiling points', () => {
  it('FMVSS No. 116: DOT 3 205/140 °C, DOT 4 230/155, DOT 5.1 260/180, DOT 5 260/180 (and in °F by mathjs)', () => {
    // FMVSS No. 116 (49 CFR 571.116) [STD]: 401/284, 446/311, 500/356, 500/356 °F
    const table = { 'DOT 3': [205, 140, 401, 284], 'DOT 4': [230, 155, 446, 311], 'DOT 5.1': [260, 180, 500, 356], 'DOT 5': [260, 180, 500, 356] } as const
    for (const [grade, [dry, wet, dryF, wetF]] of Object.entries(table) as [keyof typeof table, readonly number[]][]) {
      const got = fluidBoilingPoints(grade)
      expect([got.dryC, got.wetC]).toEqual([dry, wet])
      expect(got.dryF).toBeCloseTo(dryF!, 9)
      expect(got.wetF).toBeCloseTo(wetF!, 9)
      expect(got.wetF).toBeCloseTo(unit(wet!, 'degC').toNumber('degF'), 9)
    }
  })

  it('ISO 4925 class 6: 250 °C dry, 165 °C wet (from memory), glycol: mixes with DOT 3, 4, 5.1, not DOT 5', () => {
    expect(FLUID_GRADES['ISO 4925 Class 6']).toMatchObject({ minDryBoilingPointC: 250, minWetBoilingPointC: 165, base: 'glycol', standard: 'ISO 4925' })
    for (const g of ['DOT 3', 'DOT 4', 'DOT 5.1', 'ISO 4925 Class 6'] as const) {
      expect(fluidGradesMix('ISO 4925 Class 6', g)).toBe(true)
      expect(fluidGradesMix(g, 'DOT 5')).toBe(false)
    }
  })

  it('topping up class 6 with DOT 4 counts as DOT 4 (the lower wet boiling point)', () => {
    const [item] = checkFluid({ gradeInSystem: 'ISO 4925 Class 6', gradeToAdd: 'DOT 4' })
    expect(item!.verdict).toBe('advise')
    expect(item!.message).toMatch(/DOT 4 \(FMVSS No\. 116 minimum boiling point: 230 °C dry, 155 °C wet\)/)
  })
})

describe('fluid checks', () => {
  it('water content: under 2 % ok, 2-3 % advise, 3 % or more replace (check-values.md, common practice)', () => {
    const verdict = (w: number) => checkFluid({ waterPercent: w })[0]!.verdict
    expect([verdict(1.9), verdict(2), verdict(2.9), verdict(3)]).toEqual(['ok', 'advise', 'advise', 'fail'])
  })

  it('a boiling-point tester: at or below the grade\'s wet minimum replace, within 20 °C advise (FMVSS No. 116 wet figures)', () => {
    const verdict = (c: number) => checkFluid({ gradeInSystem: 'DOT 4', boilingPointC: c })[0]!
    expect(verdict(155).verdict).toBe('fail')
    expect(verdict(155).message).toMatch(/155 °C wet/)
    expect(verdict(175).verdict).toBe('advise')
    expect(verdict(176).verdict).toBe('ok')
    expect(checkFluid({ gradeInSystem: 'ISO 4925 Class 6', boilingPointC: 165 })[0]!.verdict).toBe('fail')
  })

  it('fluid older than 2 years is advised (common practice)', () => {
    expect(checkFluid({ ageMonths: 23 })[0]!.verdict).toBe('ok')
    expect(checkFluid({ ageMonths: 24 })[0]!.verdict).toBe('advise')
  })

  it('DOT 5 into a glycol system fails', () => {
    expect(checkFluid({ gradeInSystem: 'DOT 4', gradeToAdd: 'DOT 5' })[0]!.verdict).toBe('fail')
  })
})

describe('discs, wheel by wheel', () => {
  const disc = (readings: number[], extra: Partial<DiscWear> = {}): DiscWear => ({ position: 'front-left', thicknessReadingsMm: readings, minThicknessMm: 22, ...extra })
  const thickness = (d: DiscWear, padsDue = false) => checkDisc(d, { padsDue })[0]!

  it('under the discard thickness fails and says so for the front left disc (COMAR 11.19.03.05 C: never below the stamped minimum)', () => {
    const item = thickness(disc([21.9, 22.4]))
    expect(item.verdict).toBe('fail')
    expect(item.message).toMatch(/^Front left disc: thinnest reading 21\.9 mm is under the discard thickness 22 mm/)
  })

  it('exactly at it: advise, nothing left to wear; above: ok', () => {
    // COMAR 11.19.03.05 C fails only below the minimum; at it there is no wear left to run on: advise (common practice)
    expect(thickness(disc([22, 22.3])).verdict).toBe('advise')
    expect(thickness(disc([23.5])).verdict).toBe('ok')
  })

  it('within 1 mm of the discard thickness while the pads are due: advised with the pads (common practice)', () => {
    expect(thickness(disc([22.8]), false).verdict).toBe('ok')
    const withPads = thickness(disc([22.8]), true)
    expect(withPads.verdict).toBe('advise')
    expect(withPads.message).toMatch(/renew the discs with the pads/)
    expect(thickness(disc([23.2]), true).verdict).toBe('ok')
  })

  it('refinish minimum and discard are different figures: under the refinish minimum is fine to run, unless it needs machining', () => {
    // makers stamp the discard figure on the disc and print the machining (refinish) minimum in the manual (common practice)
    const fine = thickness(disc([22.5, 22.51], { refinishMinThicknessMm: 22.8 }))
    expect(fine.verdict).toBe('ok')
    expect(fine.message).toMatch(/can't be machined/)
    // thickness variation 0.05 mm over 0.02: it needs machining it can't have
    const needs = thickness(disc([22.5, 22.55], { refinishMinThicknessMm: 22.8 }))
    expect(needs.verdict).toBe('advise')
    expect(needs.message).toMatch(/replace the discs as a pair/)
  })

  it('thickness variation and runout over the limit are advised (clean the hub, re-check), never a failure on their own', () => {
    // defaults 0.020 mm and 0.05 mm (check-values.md, common practice)
    const items = checkDisc(disc([24.1, 24.2], { runoutMm: 0.09 }))
    expect(items.map((i) => [i.kind, i.verdict])).toEqual([['disc-thickness', 'ok'], ['disc-thickness-variation', 'advise'], ['disc-runout', 'advise']])
    expect(items[1]!.measured).toBe(0.1)
    expect(items[1]!.message).toMatch(/clean the hub face and re-check/)
    expect(items[2]!.message).toMatch(/measure again/)
    // the micrometer figure wins over the readings
    expect(checkDisc(disc([24.1, 24.2], { thicknessVariationMm: 0.01 }))[1]!.verdict).toBe('ok')
  })
})

describe('pads, wheel by wheel', () => {
  it('under 1.5 mm fails (UK roadworthiness test), about 3 mm advised (common practice), named by wheel and face', () => {
    const items = checkPads({ axle: 'front', side: 'right', innerMm: 1.4, outerMm: 3 })
    expect(items.map((i) => [i.id, i.verdict])).toEqual([['pad:front:right:inner', 'fail'], ['pad:front:right:outer', 'advise']])
    expect(items[0]!.message).toMatch(/^Front right inner pad: 1\.4 mm/)
    expect(items[0]!.position).toBe('front-right')
  })

  it('inner and outer more than 2 mm apart: a sticking slide or piston (common practice)', () => {
    const items = checkPads({ axle: 'front', side: 'left', innerMm: 3.5, outerMm: 7 })
    const uneven = items.find((i) => i.kind === 'pad-wear-uneven')!
    expect(uneven.verdict).toBe('advise')
    expect(uneven.message).toMatch(/^Front left pads wear unevenly: inner 3\.5 mm, outer 7 mm \(3\.5 mm apart/)
    expect(checkPads({ axle: 'front', side: 'left', innerMm: 5, outerMm: 7 }).some((i) => i.kind === 'pad-wear-uneven')).toBe(false)
  })

  it('left and right more than 2 mm apart: the more worn wheel drags', () => {
    const [item] = checkPadSides([{ axle: 'rear', side: 'left', innerMm: 8, outerMm: 8 }, { axle: 'rear', side: 'right', innerMm: 4, outerMm: 4.5 }])
    expect(item).toMatchObject({ kind: 'pad-wear-sides', position: 'rear-right', verdict: 'advise' })
    expect(item!.message).toMatch(/check the rear right caliper/)
  })
})

describe('drums and shoes', () => {
  it('over the maximum fails; exactly at it is advised and not "worn past"; within the 0.8 mm machining allowance advised', () => {
    // never beyond the maximum cast into the drum (common practice); a machined drum needs about 0.030 in (0.76 mm) of
    // allowance below it, taken as 0.8 mm (from memory: drum lathe practice)
    const d = (diameterMm: number) => checkDrum({ position: 'rear-left', diameterMm, maxDiameterMm: 230.1 })
    expect(d(230.5).verdict).toBe('fail')
    expect(d(230.5).message).toMatch(/^Rear left drum: 230\.5 mm is over its maximum/)
    expect(d(230.1).verdict).toBe('advise')
    expect(d(230.1).message).not.toMatch(/over|past/)
    expect(d(229.5).verdict).toBe('advise')
    expect(d(229.2).verdict).toBe('ok')
    expect(checkDrum({ position: 'rear-left', diameterMm: 229.5, maxDiameterMm: 230.1, machiningAllowanceMm: 0.5 }).verdict).toBe('ok')
  })

  it('shoe lining: under 1.5 mm fails, 2 mm or less advised', () => {
    // MOT Inspection Manual (DVSA) 1.1: a brake lining or pad less than 1.5 mm thick is a failure; 2 mm advised (common practice)
    expect(checkShoes({ position: 'rear-right', liningMm: 1.2 }).verdict).toBe('fail')
    expect(checkShoes({ position: 'rear-right', liningMm: 2 }).verdict).toBe('advise')
    expect(checkShoes({ position: 'rear-right', liningMm: 3 }).message).toMatch(/^Rear right shoes: 3 mm/)
  })

  it('what the technician saw keeps its verdict and names the wheel', () => {
    const item = checkCondition({ position: 'front-left', item: 'hose', state: 'fail', note: 'bulging near the clip' })
    expect(item).toMatchObject({ kind: 'condition', subject: 'hose', verdict: 'fail', axle: 'front' })
    expect(item.message).toBe('Front left brake hose: bulging, chafed or damaged: renew before the vehicle is driven (bulging near the clip).')
  })
})

describe('the whole check', () => {
  it('pads due on the front bring a near-minimum front disc with them, and recommend per axle and side', () => {
    const r = computeWear({
      discs: [{ position: 'front-left', thicknessReadingsMm: [22.6, 22.62], minThicknessMm: 22 }],
      pads: [{ axle: 'front', side: 'left', innerMm: 2.5, outerMm: 3.5 }],
      conditions: [{ position: 'front-right', item: 'caliper', state: 'advise' }],
    })
    expect(r.items.find((i) => i.id === 'disc:front-left:thickness')!.verdict).toBe('advise')
    expect(r.recommendedParts.map((p) => [p.axle, p.side, p.partType, p.verdict])).toEqual([
      ['front', null, 'discs', 'advise'], ['front', null, 'pads', 'advise'], ['front', 'right', 'calipers', 'advise'],
    ])
    expect(r.overall).toBe('advise')
  })

  it('runout alone is advised but buys nothing (clean the hub, re-check first: common practice); uneven thickness calls for discs and pads', () => {
    const runout = computeWear({ discs: [{ position: 'front-left', thicknessReadingsMm: [24, 24.01], minThicknessMm: 22, runoutMm: 0.09 }] })
    expect(runout.overall).toBe('advise')
    expect(runout.recommendedParts).toEqual([])
    const uneven = computeWear({ discs: [{ position: 'rear-right', thicknessReadingsMm: [24, 24.1], minThicknessMm: 22 }] })
    expect(uneven.recommendedParts.map((p) => [p.axle, p.partType, p.verdict])).toEqual([['rear', 'discs', 'advise'], ['rear', 'pads', 'advise']])
  })

  it('brake tester readings become verdicts on the same scale', () => {
    const r = computeWear({ brakeTest: { massKg: 1350, readings: [{ wheel: 'front_left', serviceN: 2000 }, { wheel: 'front_right', serviceN: 3200 }] } })
    expect(r.brakeTest!.imbalancePercent.front).toBeCloseTo(37.5, 9)
    const item = r.items.find((i) => i.id === 'brake-test:imbalance-front')!
    expect(item).toMatchObject({ verdict: 'fail', position: 'front-left' })
  })

  it('all within limits: ok, nothing suggested; bad input throws with the field named', () => {
    const r = computeWear({ pads: [{ axle: 'rear', innerMm: 8, outerMm: 8 }] })
    expect(r.overall).toBe('ok')
    expect(r.recommendedParts).toEqual([])
    expect(() => computeWear({ pads: [{ axle: 'rear', innerMm: -1, outerMm: 8 }] })).toThrow(BrakeInputError)
    expect(worstVerdict(['ok', 'advise', 'ok'])).toBe('advise')
    expect(WEAR_DEFAULTS.padFailBelowMm).toBe(1.5)
  })
})
