import { describe, expect, it } from 'vitest'
import { checkDigit, hasValidCheckDigit } from '../../../scripts/lib/check-digit'

describe('the synthetic part numbers\' check digit (Damm)', () => {
  it('gives the worked example\'s digit', () => {
    // Damm algorithm, worked example (Wikipedia, "Damm algorithm"): 572 -> interim 0 -5-> 9 -7-> 7 -2-> 4, so 5724;
    // and checking 5724 runs on from 4 with the digit 4 to 0
    expect(checkDigit('572')).toBe('4')
    expect(hasValidCheckDigit('5724')).toBe(true)
    // by hand from the same table: 0012345 -> 0,0 stay 0; 1 -> 3; 2 -> row 3 col 2 = 5; 3 -> row 5 col 3 = 4;
    // 4 -> row 4 col 4 = 0; 5 -> row 0 col 5 = 9
    expect(checkDigit('0012345')).toBe('9')
  })

  it('refuses every number with one wrong digit or two neighbouring digits swapped', () => {
    // the property Damm proves for his table (every single-digit error and every adjacent transposition is detected),
    // checked over 20,000 seven-digit numbers
    const wrong: string[] = [] // good numbers refused, slipped ones taken
    let tried = 0
    for (let n = 0; n < 10_000_000; n += 499) {
      const body = String(n).padStart(7, '0')
      const good = body + checkDigit(body)
      if (!hasValidCheckDigit(good)) wrong.push(`${good} itself refused`)
      for (let i = 0; i < good.length; i++) {
        for (let d = 0; d <= 9; d++) {
          const slip = good.slice(0, i) + d + good.slice(i + 1)
          if (slip !== good && hasValidCheckDigit(slip)) wrong.push(slip)
        }
        const swap = good.slice(0, i) + good[i + 1] + good[i] + good.slice(i + 2)
        if (i + 1 < good.length && swap !== good && hasValidCheckDigit(swap)) wrong.push(swap)
        tried++
      }
    }
    expect(wrong).toEqual([])
    expect(tried).toBeGreaterThan(160_000)
  })

  it('explains a number with other characters than digits', () => {
    expect(() => checkDigit('12a')).toThrow(/digits only/)
  })
})
