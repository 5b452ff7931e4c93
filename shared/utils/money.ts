/**
 * Money is integer minor units everywhere (pence, cents). Rounding rule for the whole product: a result
 * that falls between two minor units is rounded half away from zero ("commercial rounding"), once, at the
 * point where the amount is stated (a line, a tax figure), never on intermediate sums.
 */

/** `value / divisor` for integers, rounded half away from zero. Exact for |value| < 2^53. */
export function divRoundHalfUp(value: number, divisor: number): number {
  if (!Number.isInteger(value) || !Number.isInteger(divisor) || divisor === 0) {
    throw new RangeError(`divRoundHalfUp needs integers and a non-zero divisor (got ${value} / ${divisor})`)
  }
  const sign = Math.sign(value) * Math.sign(divisor)
  const a = Math.abs(value)
  const b = Math.abs(divisor)
  const q = Math.floor(a / b)
  const r = a - q * b
  return sign * (2 * r >= b ? q + 1 : q) || 0 // never -0
}

/**
 * `a x b / divisor` for integers, rounded half away from zero, worked in BigInt so the product never loses a
 * minor unit however large (a net price x markup x tax runs past 2^53 long before money does).
 */
export function mulDivRoundHalfUp(a: number, b: number, divisor: number): number {
  if (!Number.isSafeInteger(a) || !Number.isSafeInteger(b) || !Number.isSafeInteger(divisor) || divisor === 0) {
    throw new RangeError(`mulDivRoundHalfUp needs safe integers and a non-zero divisor (got ${a} x ${b} / ${divisor})`)
  }
  const value = BigInt(a) * BigInt(b)
  const d = BigInt(divisor)
  const negative = (value < 0n) !== (d < 0n)
  const av = value < 0n ? -value : value
  const ad = d < 0n ? -d : d
  const q = av / ad
  const rounded = 2n * (av - q * ad) >= ad ? q + 1n : q
  const n = Number(negative ? -rounded : rounded)
  return n || 0 // never -0
}

/** The garage's net price: list price less its tier discount (basis points, 1250 = 12.5 %). */
export function netPriceMinor(listPriceMinor: number, discountBp: number): number {
  if (discountBp < 0 || discountBp > 10_000) throw new RangeError(`discount must be 0..10000 bp (got ${discountBp})`)
  return divRoundHalfUp(listPriceMinor * (10_000 - discountBp), 10_000)
}

/** Parses "12.34" / "12,34" (as the user says) into minor units, or null when it is not a money amount. */
export function parseMoneyToMinor(text: string, decimal: '.' | ',' = '.'): number | null {
  const t = text.trim()
  const re = decimal === '.' ? /^(-)?(\d{1,12})(?:\.(\d{1,2}))?$/ : /^(-)?(\d{1,12})(?:,(\d{1,2}))?$/
  const m = re.exec(t)
  if (!m) return null
  const minor = Number(m[2]) * 100 + Number((m[3] ?? '').padEnd(2, '0') || '0')
  return m[1] ? -minor : minor
}

/** Formats minor units for people, e.g. formatMinor(123456, 'GBP', 'en-GB') -> "£1,234.56". */
export function formatMinor(minor: number, currency: string, locale = 'en-GB'): string {
  return new Intl.NumberFormat(locale, { style: 'currency', currency }).format(minor / 100)
}
