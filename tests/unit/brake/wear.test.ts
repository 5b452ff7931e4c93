import { describe, it, expect } from 'vitest'
import { unit } from 'mathjs'
import {
  WEAR_DEFAULTS,
  checkDisc,
  checkDrum,
  checkPads,
  computeWear,
  worstVerdict,
} from '#shared/utils/brake/wear'
import { FMVSS_116_GRADES, checkFluid, fluidBoilingPoints, fluidGradesMix } from '#shared/utils/brake/fluid'
import { BrakeInputError, FLUID_GRADE_NAMES, type DiscWear } from '#shared/utils/brake/schemas'

describe('FMVSS No. 116 minimum boiling points', () => {
  // FMVSS No. 116 (49 CFR 571.116): minimum dry (equilibrium reflux) and wet boiling points, °C (°F)
  const table = {
    'DOT 3': { dryC: 205, wetC: 140, dryF: 401, wetF: 284, base: 'glycol' },
    'DOT 4': { dryC: 230, wetC: 155, dryF: 446, wetF: 311, base: 'glycol' },
    'DOT 5.1': { dryC: 260, wetC: 180, dryF: 500, wetF: 356, base: 'glycol' },
    'DOT 5': { dryC: 260, wetC: 180, dryF: 500, wetF: 356, base: 'silicone' },
  } as const

  for (const grade of FLUID_GRADE_NAMES) {
    it(`${grade}`, () => {
      const want = table[grade]
      const got = fluidBoilingPoints(grade)
      expect(got.dryC).toBe(want.dryC)
      expect(got.wetC).toBe(want.wetC)
      // the regulation's °F figures
      expect(got.dryF).toBeCloseTo(want.dryF, 9)
      expect(got.wetF).toBeCloseTo(want.wetF, 9)
      // and mathjs 15 temperature units agree with the conversion
      expect(got.dryF).toBeCloseTo(unit(want.dryC, 'degC').toNumber('degF'), 9)
      expect(got.wetF).toBeCloseTo(unit(want.wetC, 'degC').toNumber('degF'), 9)
      expect(FMVSS_116_GRADES[grade].base).toBe(want.base)
    })
  }

  it('grades 3, 4 and 5.1 mix; DOT 5 silicone does not', () => {
    // check-values.md (FMVSS No. 116): DOT 3, 4 and 5.1 mix with one another; DOT 5 must not be mixed with them
    for (const a of ['DOT 3', 'DOT 4', 'DOT 5.1'] as const) {
      for (const b of ['DOT 3', 'DOT 4', 'DOT 5.1'] as const) expect(fluidGradesMix(a, b)).toBe(true)
      expect(fluidGradesMix(a, 'DOT 5')).toBe(false)
      expect(fluidGradesMix('DOT 5', a)).toBe(false)
    }
    expect(fluidGradesMix('DOT 5', 'DOT 5')).toBe(true)
  })
})

describe('fluid checks', () => {
  it('water content: under 2 % ok, 2-3 % advise, 3 % or more replace', () => {
    // check-values.md [CP; a refractometer maker's guidance]
    const verdict = (w: number) => checkFluid({ waterPercent: w })[0]!.verdict
    expect(verdict(0)).toBe('ok')
    expect(verdict(1.9)).toBe('ok')
    expect(verdict(2)).toBe('advise')
    expect(verdict(2.9)).toBe('advise')
    expect(verdict(3)).toBe('fail')
    expect(verdict(4.5)).toBe('fail')
    expect(checkFluid({ waterPercent: 3.2, gradeInSystem: 'DOT 4' })[0]!.message).toMatch(/155 °C wet/)
  })

  it('compatibility verdicts', () => {
    const item = (gradeInSystem: 'DOT 3' | 'DOT 4' | 'DOT 5.1' | 'DOT 5', gradeToAdd: typeof gradeInSystem) =>
      checkFluid({ gradeInSystem, gradeToAdd }).find((i) => i.kind === 'fluid-compatibility')!
    expect(item('DOT 4', 'DOT 5.1').verdict).toBe('ok')
    expect(item('DOT 4', 'DOT 4').verdict).toBe('ok')
    expect(item('DOT 4', 'DOT 3').verdict).toBe('advise')
    expect(item('DOT 4', 'DOT 3').message).toMatch(/205 °C dry, 140 °C wet/)
    expect(item('DOT 4', 'DOT 5').verdict).toBe('fail')
    expect(item('DOT 5', 'DOT 5.1').verdict).toBe('fail')
    expect(item('DOT 5', 'DOT 5.1').message).toMatch(/never by colour/)
    expect(checkFluid({ gradeInSystem: 'DOT 4', gradeToAdd: 'DOT 4', specifiedGrade: 'DOT 5.1' })[0]!.verdict).toBe('advise')
  })
})

describe('disc checks', () => {
  const disc = (over: Partial<DiscWear> = {}): DiscWear => ({
    position: 'front-left',
    thicknessReadingsMm: [24.6, 24.61, 24.6],
    minThicknessMm: 22,
    ...over,
  })

  it('below the minimum thickness: replace, never machine below it', () => {
    // Maryland COMAR 11.19.03.05 C requires the minimum-thickness marking [STD]; replace in axle pairs [CP]
    const [t] = checkDisc(disc({ thicknessReadingsMm: [22.1, 21.95, 22.05] }))
    expect(t!.verdict).toBe('fail')
    expect(t!.measured).toBe(21.95)
    expect(t!.limit).toBe(22)
    expect(t!.unit).toBe('mm')
    expect(t!.message).toMatch(/never machine/)
  })

  it('at the minimum: advise (nothing left to machine); above: ok', () => {
    expect(checkDisc(disc({ thicknessReadingsMm: [22, 22.01] }))[0]!.verdict).toBe('advise')
    expect(checkDisc(disc())[0]!.verdict).toBe('ok')
  })

  it('thickness variation from the readings vs the 0.020 mm default', () => {
    // check-values.md: default 0.020 mm when the vehicle data has none [CP]
    expect(WEAR_DEFAULTS.thicknessVariationLimitMm).toBe(0.02)
    const ok = checkDisc(disc({ thicknessReadingsMm: [24.6, 24.62, 24.61] })).find((i) => i.kind === 'disc-thickness-variation')!
    expect(ok.measured).toBeCloseTo(0.02, 9)
    expect(ok.verdict).toBe('ok')
    expect(ok.limitSource).toBe('default')
    const bad = checkDisc(disc({ thicknessReadingsMm: [24.6, 24.63] })).find((i) => i.kind === 'disc-thickness-variation')!
    expect(bad.verdict).toBe('fail')
    expect(bad.message).toMatch(/Machine only if/)
    const vehicleLimit = checkDisc(disc({ thicknessReadingsMm: [24.6, 24.63], thicknessVariationLimitMm: 0.03 })).find((i) => i.kind === 'disc-thickness-variation')!
    expect(vehicleLimit.verdict).toBe('ok')
    expect(vehicleLimit.limitSource).toBe('vehicle data')
  })

  it('lateral runout vs the 0.05 mm default or the vehicle limit', () => {
    // check-values.md: default 0.05 mm [CP]; service manuals 0.03-0.08 mm [PUB]
    const runout = (runoutMm: number, runoutLimitMm?: number) =>
      checkDisc(disc({ runoutMm, runoutLimitMm })).find((i) => i.kind === 'disc-runout')!
    expect(runout(0.05).verdict).toBe('ok')
    expect(runout(0.06).verdict).toBe('fail')
    expect(runout(0.06, 0.08).verdict).toBe('ok')
    expect(runout(0.04, 0.03).verdict).toBe('fail')
  })
})

describe('pad and drum checks', () => {
  it('pads: under 1.5 mm fail, about 3 mm advise', () => {
    // check-values.md: under 1.5 mm is a UK roadworthiness-test failure [PUB]; replace at about 3 mm [CP]
    const v = (mm: number) => checkPads({ axle: 'front', innerMm: mm, outerMm: 8 })[0]!.verdict
    expect(v(1.4)).toBe('fail')
    expect(v(0)).toBe('fail')
    expect(v(1.5)).toBe('advise')
    expect(v(3)).toBe('advise')
    expect(v(3.1)).toBe('ok')
    const items = checkPads({ axle: 'rear', side: 'left', innerMm: 5, outerMm: 1 })
    expect(items.map((i) => i.id)).toEqual(['pad:rear:left:inner', 'pad:rear:left:outer'])
    expect(items[1]!.verdict).toBe('fail')
  })

  it('drums: over the maximum diameter fail, at it advise', () => {
    expect(checkDrum({ position: 'rear-left', diameterMm: 229.2, maxDiameterMm: 229 }).verdict).toBe('fail')
    expect(checkDrum({ position: 'rear-left', diameterMm: 229, maxDiameterMm: 229 }).verdict).toBe('advise')
    expect(checkDrum({ position: 'rear-right', diameterMm: 228.1, maxDiameterMm: 229 }).verdict).toBe('ok')
    expect(checkDrum({ position: 'rear-right', diameterMm: 228.1, maxDiameterMm: 229 }).axle).toBe('rear')
  })
})

describe('computeWear', () => {
  it('gives an overall verdict and part types per axle', () => {
    const r = computeWear({
      discs: [
        { position: 'front-left', thicknessReadingsMm: [21.8, 21.9], minThicknessMm: 22 },
        { position: 'front-right', thicknessReadingsMm: [22.6, 22.61], minThicknessMm: 22 },
      ],
      pads: [{ axle: 'front', innerMm: 2.5, outerMm: 4 }, { axle: 'rear', innerMm: 6, outerMm: 6 }],
      drums: [{ position: 'rear-left', diameterMm: 228.5, maxDiameterMm: 229 }],
      fluid: { gradeInSystem: 'dot4', gradeToAdd: 'DOT 4', waterPercent: 2.4 },
    })
    expect(r.overall).toBe('fail')
    const parts = r.recommendedParts.map((p) => `${p.axle}:${p.partType}:${p.verdict}`)
    expect(parts).toEqual(['front:discs:fail', 'front:pads:fail', 'system:brake-fluid:advise'])
    expect(r.inputs.fluid?.gradeInSystem).toBe('DOT 4')
    expect(r.assumptions.join(' ')).toMatch(/thickest minus thinnest/)
    expect(r.cautions.length).toBeGreaterThan(0)
    for (const item of r.items) {
      expect(['ok', 'advise', 'fail']).toContain(item.verdict)
      expect(item.message.length).toBeGreaterThan(10)
    }
  })

  it('worn drums suggest drums and shoes on that axle', () => {
    const r = computeWear({ drums: [{ position: 'rear-left', diameterMm: 230, maxDiameterMm: 229 }] })
    expect(r.recommendedParts.map((p) => p.partType)).toEqual(['drums', 'shoes'])
    expect(r.recommendedParts.every((p) => p.axle === 'rear')).toBe(true)
  })

  it('all within limits: ok, nothing suggested', () => {
    const r = computeWear({ pads: [{ axle: 'front', innerMm: 9, outerMm: 9 }], fluid: { waterPercent: 0.5 } })
    expect(r.overall).toBe('ok')
    expect(r.recommendedParts).toEqual([])
  })

  it('bad input throws with the field named', () => {
    expect(() => computeWear({})).toThrow(BrakeInputError)
    expect(() => computeWear({ discs: [{ position: 'front-left', thicknessReadingsMm: [], minThicknessMm: 22 }] })).toThrow(
      /discs\[0\]\.thicknessReadingsMm: at least one disc thickness reading is required/,
    )
  })

  it('worstVerdict', () => {
    expect(worstVerdict([])).toBe('ok')
    expect(worstVerdict(['ok', 'advise'])).toBe('advise')
    expect(worstVerdict(['advise', 'fail', 'ok'])).toBe('fail')
  })
})
