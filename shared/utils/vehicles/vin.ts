/**
 * Vehicle identification numbers: the ISO 3779 shape (17 characters from digits and capital letters without I, O
 * or Q), the check digit of 49 CFR 565.15(c) (position 9; required in North America and China, optional elsewhere),
 * the model year coded in position 10 (49 CFR 565.15(d), Table VI: a 30-year cycle, so one character stands for two
 * years) and the world manufacturer identifier in positions 1-3 (ISO 3780), whose first character gives the region.
 * Plain functions, used by the server and the forms alike.
 */

export const VIN_LENGTH = 17
/** ISO 3779: digits and capital letters except I, O and Q (too easily read as 1 and 0). */
export const VIN_CHARACTERS = /^[0-9A-HJ-NPR-Z]+$/

/** 49 CFR 565.15(c) Table III: the value given to each letter. */
const LETTER_VALUES: Record<string, number> = {
  A: 1, B: 2, C: 3, D: 4, E: 5, F: 6, G: 7, H: 8,
  J: 1, K: 2, L: 3, M: 4, N: 5, P: 7, R: 9,
  S: 2, T: 3, U: 4, V: 5, W: 6, X: 7, Y: 8, Z: 9,
}
/** 49 CFR 565.15(c) Table IV: the weight of each position (the check digit's own position weighs 0). */
const WEIGHTS = [8, 7, 6, 5, 4, 3, 2, 10, 0, 9, 8, 7, 6, 5, 4, 3, 2] as const

/** Upper case, without spaces or dashes people type between groups. */
export function normaliseVin(raw: string): string {
  return raw.replace(/[\s-]+/g, '').toUpperCase()
}

/** Why a (normalised) VIN is not of the ISO 3779 shape, or null when it is. */
export function vinShapeProblem(vin: string): string | null {
  if (vin.length === 0) return 'Enter the VIN.'
  const bad = [...new Set(vin.replace(/[0-9A-HJ-NPR-Z]/g, ''))]
  if (bad.length) {
    const ioq = bad.filter((c) => 'IOQ'.includes(c))
    return ioq.length
      ? `A VIN never contains ${ioq.join(', ')} (read it as ${ioq.map((c) => (c === 'I' ? '1' : '0')).join(', ')}?).`
      : `A VIN holds only digits and capital letters (not ${bad.map((c) => `"${c}"`).join(', ')}).`
  }
  if (vin.length !== VIN_LENGTH) return `A VIN has 17 characters; this one has ${vin.length}.`
  return null
}

/** The check digit a VIN should carry in position 9: "0"-"9" or "X" (remainder 10). */
export function vinCheckDigit(vin: string): string {
  let sum = 0
  for (let i = 0; i < VIN_LENGTH; i++) {
    const c = vin[i]!
    const value = c >= '0' && c <= '9' ? Number(c) : LETTER_VALUES[c] ?? 0
    sum += value * WEIGHTS[i]!
  }
  const remainder = sum % 11
  return remainder === 10 ? 'X' : String(remainder)
}

export type VinRegion = 'africa' | 'asia' | 'europe' | 'north_america' | 'oceania' | 'south_america'

/** ISO 3780: the region of the first character of the WMI. */
export function vinRegion(vin: string): VinRegion | null {
  const c = vin[0]
  if (!c) return null
  if (c >= 'A' && c <= 'H') return 'africa'
  if (c >= 'J' && c <= 'R') return 'asia'
  if (c >= 'S' && c <= 'Z') return 'europe'
  if (c >= '1' && c <= '5') return 'north_america'
  if (c === '6' || c === '7') return 'oceania'
  if (c === '8' || c === '9' || c === '0') return 'south_america'
  return null
}

/**
 * Where the check digit is compulsory: vehicles for North America (49 CFR 565, whose WMIs start 1-5) and China
 * (GB 16735, WMIs starting L). Elsewhere position 9 may be anything, so a mismatch is only a warning.
 */
export function checkDigitRequired(vin: string): boolean {
  return vinRegion(vin) === 'north_america' || vin[0] === 'L'
}

/** 49 CFR 565.15(d) Table VI: position 10 and the first model year it stands for (the next is 30 years on). */
const YEAR_CODES = 'ABCDEFGHJKLMNPRSTVWXY123456789'
export const MODEL_YEAR_CYCLE_START = 1980

/** Every model year the 10th character may stand for, oldest first (empty for a character the table lacks). */
export function modelYearCandidates(code: string): number[] {
  const i = YEAR_CODES.indexOf(code)
  if (i < 0) return []
  return [MODEL_YEAR_CYCLE_START + i, MODEL_YEAR_CYCLE_START + 30 + i, MODEL_YEAR_CYCLE_START + 60 + i]
}

/**
 * The model years a VIN may have. 49 CFR 565.15(a)/(d): on a North American passenger car, multipurpose vehicle or
 * light truck, a letter in position 7 means 2010-2039 and a digit 1980-2009; elsewhere both years of the cycle stay
 * candidates. Years more than one year ahead of `now` are dropped (a model year runs at most a year early).
 */
export function vinModelYears(vin: string, now = new Date()): number[] {
  const latest = now.getUTCFullYear() + 1
  let years = modelYearCandidates(vin[9] ?? '').filter((y) => y <= latest && y < MODEL_YEAR_CYCLE_START + 60)
  if (vinRegion(vin) === 'north_america' && vin[6]) {
    const letter = /[A-Z]/.test(vin[6])
    years = years.filter((y) => (letter ? y >= 2010 : y < 2010))
  }
  return years
}

export type CheckDigitState = 'valid' | 'invalid' | 'not_used'

export interface VinReading {
  vin: string
  /** false only when the VIN is unusable: wrong shape, or a wrong check digit where the check digit is compulsory */
  valid: boolean
  checkDigit: CheckDigitState
  /** the digit position 9 should hold */
  expectedCheckDigit: string
  wmi: string
  region: VinRegion | null
  modelYears: number[]
  /** a warning to show beside the field (a mismatching optional check digit) */
  warning: string | null
}

/**
 * Reads a VIN already of the right shape (see {@link vinShapeProblem}). A mismatching check digit is 'invalid' where
 * it is compulsory and 'not_used' elsewhere (with a warning: the VIN may still be mistyped).
 */
export function readVin(vin: string, now = new Date()): VinReading {
  const expected = vinCheckDigit(vin)
  const matches = vin[8] === expected
  const required = checkDigitRequired(vin)
  const checkDigit: CheckDigitState = matches ? 'valid' : required ? 'invalid' : 'not_used'
  const warning = matches ? null : required
    ? `The check digit (9th character) should be ${expected}: the VIN is mistyped or not genuine.`
    : `The 9th character is not a check digit here (it would be ${expected}); check the VIN against the vehicle.`
  return {
    vin, valid: matches || !required, checkDigit, expectedCheckDigit: expected, wmi: vin.slice(0, 3),
    region: vinRegion(vin), modelYears: vinModelYears(vin, now), warning,
  }
}

/**
 * Does a VIN fit a fitment's VIN pattern? A pattern is up to 17 VIN characters where `*` stands for any one
 * character; a shorter pattern compares the first positions (e.g. `SVL*****` + position 8 ...). Letters compare
 * without regard to case.
 */
export function vinMatchesPattern(vin: string, pattern: string): boolean {
  const p = pattern.toUpperCase()
  if (p.length > VIN_LENGTH) return false
  for (let i = 0; i < p.length; i++) {
    if (p[i] !== '*' && p[i] !== vin[i]) return false
  }
  return true
}

/** A VIN pattern as fitment data holds it: 1-17 VIN characters or `*`. */
export const VIN_PATTERN = /^[0-9A-HJ-NPR-Z*]{1,17}$/
