import { describe, expect, it } from 'vitest'
import { modelYearCandidates, normaliseVin, readVin, vinCheckDigit, vinMatchesPattern, vinModelYears, vinRegion, vinShapeProblem } from '#shared/utils/vehicles/vin'

describe('VIN check digit (49 CFR 565.15(c))', () => {
  it('reproduces the worked example of the regulation, Table V', () => {
    // 49 CFR 565.15(c)(5), Table V, sample VIN 1 G 4 A H 5 9 H _ 5 G 1 1 8 3 4 1:
    // values 1 7 4 1 8 5 9 8 . 5 7 1 1 8 3 4 1 times weights 8 7 6 5 4 3 2 10 0 9 8 7 6 5 4 3 2
    // = 8+49+24+5+32+15+18+80+0+45+56+7+6+40+12+12+2 = 411; 411 / 11 = 37 remainder 4 -> "4"
    expect(vinCheckDigit('1G4AH59H05G118341')).toBe('4')
    expect(readVin('1G4AH59H45G118341').checkDigit).toBe('valid')
  })

  it('agrees with published valid VINs', () => {
    // NHTSA "Outline for New Manufacturer Information", worked example: total 314, 314 = 28 x 11 + 6 -> "6"
    expect(vinCheckDigit('1J9RP1A36A1644345')).toBe('6')
    // the check-digit example of the Wikipedia article "Vehicle identification number" (from memory), worked here:
    // 1x8 + M(4)x7 + 8x6 + G(7)x5 + D(4)x4 + M(4)x3 + 9x2 + A(1)x10 + K(2)x9 + P(7)x8 + 0x7 + 4x6 + 2x5 + 7x4 + 8x3 + 8x2
    // = 8+28+48+35+16+12+18+10+18+56+0+24+10+28+24+16 = 351; 351 = 31 x 11 + 10 -> remainder 10 is written "X"
    expect(vinCheckDigit('1M8GDM9AXKP042788')).toBe('X')
    // all ones (a commonly quoted valid test VIN, from memory): the weights add up to 89 = 8 x 11 + 1 -> "1"
    expect(vinCheckDigit('11111111111111111')).toBe('1')
    for (const vin of ['1G4AH59H45G118341', '1J9RP1A36A1644345', '1M8GDM9AXKP042788', '11111111111111111']) {
      expect(readVin(vin)).toMatchObject({ valid: true, checkDigit: 'valid', warning: null })
    }
  })

  it('is an error where the region requires it and a warning where it does not', () => {
    // North America (WMI 1-5) requires it (49 CFR 565); a changed 9th character is refused
    expect(readVin('1G4AH59H75G118341')).toMatchObject({ valid: false, checkDigit: 'invalid', expectedCheckDigit: '4' })
    // Europe (WMI S-Z, ISO 3780) does not: the VIN stands, with a warning to check it against the car
    const eu = readVin('WK3VB2D10FT104472')
    expect(eu).toMatchObject({ valid: true, checkDigit: 'not_used', region: 'europe', expectedCheckDigit: '8' })
    expect(eu.warning).toMatch(/check the VIN/)
    expect(readVin('WK3VB2D18FT104472').checkDigit).toBe('valid')
  })
})

describe('VIN shape (ISO 3779)', () => {
  it('takes 17 digits and capitals without I, O or Q, ignoring spaces people type', () => {
    expect(normaliseVin(' wk3vb2d18 ft104472 ')).toBe('WK3VB2D18FT104472')
    expect(vinShapeProblem('WK3VB2D18FT104472')).toBeNull()
    expect(vinShapeProblem('WK3VB2D18FT10447')).toMatch(/17 characters; this one has 16/)
    expect(vinShapeProblem('WK3VB2D18FTI04472')).toMatch(/never contains I/)
    expect(vinShapeProblem('WK3VB2D18FTO04472')).toMatch(/never contains O/)
    expect(vinShapeProblem('WK3VB2D18FT10447!')).toMatch(/only digits and capital letters/)
    expect(vinShapeProblem('')).toMatch(/Enter the VIN/)
  })

  it('names the region from the first character (ISO 3780)', () => {
    expect(vinRegion('1G4')).toBe('north_america')
    expect(vinRegion('JH4')).toBe('asia')
    expect(vinRegion('SVT')).toBe('europe')
    expect(vinRegion('9BW')).toBe('south_america')
    expect(vinRegion('6FP')).toBe('oceania')
    expect(vinRegion('AHT')).toBe('africa')
  })
})

describe('model year from the 10th character (49 CFR 565.15(d), Table VI)', () => {
  it('follows the 30-year table', () => {
    // Table VI: A = 1980 (and 2010), ... Y = 2000 (2030), 1 = 2001 (2031) ... 9 = 2009 (2039); I O Q U Z 0 unused
    expect(modelYearCandidates('A').slice(0, 2)).toEqual([1980, 2010])
    expect(modelYearCandidates('H').slice(0, 2)).toEqual([1987, 2017])
    expect(modelYearCandidates('N').slice(0, 2)).toEqual([1992, 2022])
    expect(modelYearCandidates('T').slice(0, 2)).toEqual([1996, 2026])
    expect(modelYearCandidates('V').slice(0, 2)).toEqual([1997, 2027])
    expect(modelYearCandidates('Y').slice(0, 2)).toEqual([2000, 2030])
    expect(modelYearCandidates('1').slice(0, 2)).toEqual([2001, 2031])
    expect(modelYearCandidates('9').slice(0, 2)).toEqual([2009, 2039])
    for (const unused of ['I', 'O', 'Q', 'U', 'Z', '0']) expect(modelYearCandidates(unused)).toEqual([])
  })

  it('keeps both years of the cycle when the VIN cannot tell them apart', () => {
    const now = new Date('2026-12-03T00:00:00Z')
    // a European VIN, F in position 10: 1985 or 2015
    expect(vinModelYears('WK3VB2D18FT104472', now)).toEqual([1985, 2015])
    // a year more than one year ahead of today cannot be a model year yet
    expect(vinModelYears('WK3VB2D18FT104472', new Date('2012-06-01T00:00:00Z'))).toEqual([1985])
  })

  it('uses position 7 on North American cars: a letter means 2010-2039, a digit 1980-2009 (49 CFR 565.15)', () => {
    const now = new Date('2026-12-03T00:00:00Z')
    expect(vinModelYears('1G4AH59H45G118341', now)).toEqual([2005]) // 7th "9", 10th "5"
    expect(vinModelYears('1J9RP1A36A1644345', now)).toEqual([2010]) // 7th "A", 10th "A"
  })
})

describe('VIN patterns of fitment breakpoints', () => {
  it('match position by position, * for any character, a shorter pattern on the first positions', () => {
    expect(vinMatchesPattern('WK3VB2D18FT104472', 'WK3VB*D')).toBe(true)
    expect(vinMatchesPattern('WK3VB2D18FT104472', 'WK3VB*P')).toBe(false)
    expect(vinMatchesPattern('WK3VB2D18FT104472', 'wk3******F')).toBe(true)
    expect(vinMatchesPattern('WK3VB2D18FT104472', '*********G')).toBe(false)
  })
})
