import { describe, it, expect } from 'vitest'
import { unit } from 'mathjs'
import {
  KPA_PER_BAR,
  KPA_PER_PSI,
  MM2_PER_SQUARE_INCH,
  MM_PER_INCH,
  N_PER_LBF,
  PA_PER_PSI,
  ROLLING_RADIUS_FACTOR,
  barToKPa,
  convertForce,
  convertLength,
  convertPressure,
  inchToMm,
  kPaToBar,
  kPaToPsi,
  lbfToN,
  mm2ToSquareInch,
  mmToInch,
  nToLbf,
  parseTyreSize,
  psiToKPa,
  squareInchToMm2,
  tyreRollingRadiusMm,
} from '#shared/utils/brake/units'

/** |actual − expected| ≤ tol × |expected| */
function expectRel(actual: number, expected: number, tol: number) {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(tol * Math.abs(expected))
}

describe('exact conversion factors', () => {
  it('1 in = 25.4 mm and 1 in² = 645.16 mm²', () => {
    // NIST SP 811 (2008) App. B.9: inch and square inch, exact
    expect(MM_PER_INCH).toBe(25.4)
    expect(MM2_PER_SQUARE_INCH).toBe(645.16)
    expect(squareInchToMm2(1) / 100).toBeCloseTo(6.4516, 12) // cm²
  })

  it('1 lbf = 4.4482216152605 N', () => {
    // NIST SP 811 (2008) App. B.9: pound-force = 0.45359237 kg × 9.80665 m/s²
    expectRel(N_PER_LBF, 4.4482216152605, 1e-14)
  })

  it('1 psi = 6894.757293168361 Pa', () => {
    // NIST SP 811 (2008) App. B.9: pound-force per square inch
    expectRel(PA_PER_PSI, 6894.757293168361, 1e-14)
  })

  it('1 bar = 100 kPa = 14.503773773 psi', () => {
    // NIST SP 811 (2008) App. B.9: bar, exact
    expect(KPA_PER_BAR).toBe(100)
    expectRel(kPaToPsi(barToKPa(1)), 14.503773773, 1e-10)
  })

  it('100 lbf on 1 in² is 100 psi = 689.4757 kPa; on 2 in² 50 psi = 344.7379 kPa', () => {
    // NIST SP 811 (2008) App. B.8/B.9 factors, P = F / A
    const p1 = (lbfToN(100) / squareInchToMm2(1)) * 1000
    const p2 = (lbfToN(100) / squareInchToMm2(2)) * 1000
    expect(p1).toBeCloseTo(689.4757, 4) // table value given to 4 decimals
    expectRel(kPaToPsi(p1), 100, 1e-12)
    expect(p2).toBeCloseTo(344.7379, 4)
    expectRel(kPaToPsi(p2), 50, 1e-12)
  })
})

describe('agreement with mathjs units (general-purpose reference library, 1e-9 relative)', () => {
  // mathjs 15 unit definitions; its psi agrees with the exact factor to ~6e-11
  const cases: Array<[string, number, number]> = [
    ['inch -> mm', inchToMm(1), unit(1, 'inch').toNumber('mm')],
    ['mm -> inch', mmToInch(7), unit(7, 'mm').toNumber('inch')],
    ['in² -> mm²', squareInchToMm2(3.5), unit(3.5, 'inch^2').toNumber('mm^2')],
    ['mm² -> in²', mm2ToSquareInch(1000), unit(1000, 'mm^2').toNumber('inch^2')],
    ['lbf -> N', lbfToN(100), unit(100, 'lbf').toNumber('N')],
    ['N -> lbf', nToLbf(500), unit(500, 'N').toNumber('lbf')],
    ['psi -> kPa', psiToKPa(1000), unit(1000, 'psi').toNumber('kPa')],
    ['kPa -> psi', kPaToPsi(10000), unit(10000, 'kPa').toNumber('psi')],
    ['bar -> kPa', barToKPa(120), unit(120, 'bar').toNumber('kPa')],
    ['kPa -> bar', kPaToBar(12345), unit(12345, 'kPa').toNumber('bar')],
    ['psi -> bar', convertPressure(1500, 'psi', 'bar'), unit(1500, 'psi').toNumber('bar')],
    ['in -> mm (switch)', convertLength(0.875, 'in', 'mm'), unit(0.875, 'inch').toNumber('mm')],
    ['lbf -> N (switch)', convertForce(75, 'lbf', 'N'), unit(75, 'lbf').toNumber('N')],
  ]
  for (const [name, ours, reference] of cases) {
    it(name, () => expectRel(ours, reference, 1e-9))
  }

  it('psi factor in kPa', () => {
    // mathjs 15 psi definition
    expectRel(KPA_PER_PSI, unit(1, 'psi').toNumber('kPa'), 1e-9)
  })
})

describe('unit switches round-trip', () => {
  it('returns the same value after there and back', () => {
    for (const v of [0.001, 1, 22.22, 1234.5, 98765]) {
      expectRel(convertLength(convertLength(v, 'mm', 'in'), 'in', 'mm'), v, 1e-14)
      expectRel(convertForce(convertForce(v, 'N', 'lbf'), 'lbf', 'N'), v, 1e-14)
      expectRel(convertPressure(convertPressure(v, 'kPa', 'psi'), 'psi', 'bar'), kPaToBar(v), 1e-14)
      expect(convertPressure(v, 'bar', 'bar')).toBe(v)
    }
  })
})

describe('tyre size code', () => {
  it('reads 205/55 R16: unloaded radius = rim/2 + sidewall', () => {
    const t = parseTyreSize('205/55 R16')
    expect(t).not.toBeNull()
    // Geometry of the metric size code (common practice): sidewall = width × aspect / 100
    expect(t!.sidewallMm).toBeCloseTo(112.75, 10)
    // mathjs: 16 in / 2 + 112.75 mm
    expectRel(t!.unloadedRadiusMm, unit(8, 'inch').toNumber('mm') + 112.75, 1e-9)
    // Rolling circumference ≈ 3.05 × unloaded diameter (common practice rule of thumb)
    expectRel(2 * Math.PI * t!.rollingRadiusMm, 3.05 * 2 * t!.unloadedRadiusMm, 1e-12)
    expect(t!.rollingRadiusMm).toBeCloseTo(315.95 * ROLLING_RADIUS_FACTOR, 9)
  })

  it('reads common spellings', () => {
    expect(parseTyreSize('205/55R16 91V')?.rimDiameterInch).toBe(16)
    expect(parseTyreSize('P215/60R16 94H')?.sectionWidthMm).toBe(215)
    expect(parseTyreSize('225/45 ZR17')?.aspectRatioPercent).toBe(45)
    expect(parseTyreSize('LT245/75R16')?.rimDiameterInch).toBe(16)
    expect(parseTyreSize('195/65-15')?.rimDiameterInch).toBe(15)
    expect(parseTyreSize(' 235/40r18xl ')?.rimDiameterInch).toBe(18)
  })

  it('rejects what is not a metric size code', () => {
    for (const bad of ['', 'abc', '31x10.50R15', '205/55', '205/55 R165', '050/55 R16', '205/55 R40']) {
      expect(parseTyreSize(bad), bad).toBeNull()
    }
    expect(() => tyreRollingRadiusMm('31x10.50R15')).toThrow(/not a metric size code/)
  })
})
