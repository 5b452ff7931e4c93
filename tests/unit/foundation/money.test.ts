import { describe, expect, it } from 'vitest'
import { divRoundHalfUp, formatMinor, netPriceMinor, parseMoneyToMinor } from '#shared/utils/money'

describe('money in minor units', () => {
  it('rounds half away from zero at exact .5 boundaries (commercial rounding, common practice)', () => {
    expect(divRoundHalfUp(5, 10)).toBe(1)
    expect(divRoundHalfUp(4, 10)).toBe(0)
    expect(divRoundHalfUp(-5, 10)).toBe(-1)
    expect(divRoundHalfUp(15, 10)).toBe(2)
    expect(divRoundHalfUp(25, 10)).toBe(3) // not banker's rounding
  })
  it('agrees with exact decimal arithmetic via BigInt over many values', () => {
    for (let v = -20_000; v <= 20_000; v += 7) {
      for (const d of [3, 10, 100, 10_000]) {
        // reference: BigInt integer arithmetic (general-purpose, part of the JS language)
        const a = BigInt(Math.abs(v)), b = BigInt(d)
        const q = a / b, r = a % b
        const ref = Number(2n * r >= b ? q + 1n : q) * Math.sign(v)
        expect(divRoundHalfUp(v, d)).toBe(ref === 0 ? 0 : ref)
      }
    }
  })
  it('computes a tier net price from the list price', () => {
    expect(netPriceMinor(10_000, 1250)).toBe(8750)
    expect(netPriceMinor(999, 500)).toBe(949) // 949.05 -> 949
    expect(netPriceMinor(1010, 500)).toBe(960) // 959.5 -> 960 (half up)
    expect(netPriceMinor(4321, 0)).toBe(4321)
    expect(() => netPriceMinor(100, 10_001)).toThrow(RangeError)
  })
  it('parses amounts with the decimal mark the user chose', () => {
    expect(parseMoneyToMinor('12.34')).toBe(1234)
    expect(parseMoneyToMinor('12,5', ',')).toBe(1250)
    expect(parseMoneyToMinor('12.345')).toBeNull()
    expect(parseMoneyToMinor('1,234.00')).toBeNull()
    expect(parseMoneyToMinor('abc')).toBeNull()
  })
  it('formats for people with Intl (ECMA-402)', () => {
    expect(formatMinor(123456, 'GBP', 'en-GB')).toBe('£1,234.56')
  })
})
