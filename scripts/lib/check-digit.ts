/**
 * The check digit of the synthetic national range's part numbers (Damm's algorithm, 2004): one more digit computed
 * from the others, chosen so that a wrong digit or two neighbouring digits swapped never makes another valid
 * number. With numbers handed out in sequence and no check digit, nearly every one-slip variant of a number is
 * another real part; with it, none is. Ten-by-ten table and a loop, so no package is worth taking on for it.
 */

/** Damm's quasigroup of order 10 (weakly totally anti-symmetric), row by the running digit, column by the next. */
const TABLE = [
  [0, 3, 1, 7, 5, 9, 8, 6, 4, 2],
  [7, 0, 9, 2, 1, 5, 4, 8, 6, 3],
  [4, 2, 0, 6, 8, 7, 1, 3, 5, 9],
  [1, 7, 5, 0, 9, 8, 3, 4, 2, 6],
  [6, 1, 2, 3, 0, 4, 5, 9, 7, 8],
  [3, 6, 7, 4, 2, 0, 9, 5, 8, 1],
  [5, 8, 6, 9, 7, 2, 0, 1, 3, 4],
  [8, 9, 4, 5, 3, 6, 2, 0, 1, 7],
  [9, 4, 3, 8, 6, 1, 7, 2, 0, 5],
  [2, 5, 8, 1, 4, 3, 6, 7, 9, 0],
] as const

function interim(digits: string): number {
  if (!/^\d*$/.test(digits)) throw new Error(`check digit: digits only (got "${digits}")`)
  let d = 0
  for (const c of digits) d = TABLE[d]![c.charCodeAt(0) - 48]!
  return d
}

/** The digit to append to `digits`. */
export const checkDigit = (digits: string): string => String(interim(digits))

/** Whether `digits` ends in its own check digit. */
export const hasValidCheckDigit = (digits: string): boolean => digits.length > 1 && interim(digits) === 0
