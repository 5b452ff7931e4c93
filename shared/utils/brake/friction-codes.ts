/**
 * SAE J866 friction codes (the two letters on a pad or lining edge): first letter the normal friction coefficient,
 * second the hot one. SAE J866 Table 1:
 *   C ≤ 0.15 < D ≤ 0.25 < E ≤ 0.35 < F ≤ 0.45 < G ≤ 0.55 < H;  Z unclassified.
 * A boundary value takes the lower letter. The codes do not predict how a brake system performs.
 */

export type FrictionLetter = 'C' | 'D' | 'E' | 'F' | 'G' | 'H' | 'Z'

/** One letter's range: above `above` (exclusive) up to `upTo` (inclusive); null = open-ended / not classified. */
export interface FrictionRange {
  letter: FrictionLetter
  above: number | null
  upTo: number | null
}

/** SAE J866 Table 1. */
export const SAE_J866_TABLE: readonly FrictionRange[] = [
  { letter: 'C', above: null, upTo: 0.15 },
  { letter: 'D', above: 0.15, upTo: 0.25 },
  { letter: 'E', above: 0.25, upTo: 0.35 },
  { letter: 'F', above: 0.35, upTo: 0.45 },
  { letter: 'G', above: 0.45, upTo: 0.55 },
  { letter: 'H', above: 0.55, upTo: null },
  { letter: 'Z', above: null, upTo: null },
]

// Decimal inputs like 0.1 + 0.05 land a hair above 0.15; treat them as on the boundary.
const EPSILON = 1e-9

/**
 * SAE J866 letter for a friction coefficient (boundary values take the lower letter).
 * @param mu friction coefficient; null/undefined/non-finite gives 'Z' (unclassified)
 */
export function frictionLetter(mu: number | null | undefined): FrictionLetter {
  if (mu === null || mu === undefined || !Number.isFinite(mu) || mu < 0) return 'Z'
  for (const row of SAE_J866_TABLE) {
    if (row.upTo !== null && mu <= row.upTo + EPSILON) return row.letter
  }
  return 'H'
}

/** The coefficient range a letter stands for. @throws Error for a letter that is not in SAE J866. */
export function frictionRange(letter: string): FrictionRange {
  const row = SAE_J866_TABLE.find((r) => r.letter === letter.trim().toUpperCase())
  if (!row) throw new Error(`"${letter}" is not an SAE J866 friction letter (C, D, E, F, G, H or Z)`)
  return row
}

/**
 * A representative coefficient for a letter: the middle of its range (D 0.20, E 0.30, F 0.40, G 0.50); the open
 * ranges C and H give their bound (0.15, 0.55) and Z gives null. For a rough estimate only.
 */
export function nominalCoefficient(letter: string): number | null {
  const { above, upTo } = frictionRange(letter)
  if (above !== null && upTo !== null) return Math.round(((above + upTo) / 2) * 1000) / 1000
  return upTo ?? above
}

/** A two-letter edge code read into its parts. */
export interface FrictionCode {
  code: string
  normal: FrictionRange
  hot: FrictionRange
}

/** Reads a two-letter edge code such as "FF" or "EE". @throws Error when it is not two J866 letters. */
export function parseFrictionCode(code: string): FrictionCode {
  const clean = code.trim().toUpperCase()
  if (!/^[CDEFGHZ]{2}$/.test(clean)) {
    throw new Error(`"${code}" is not an SAE J866 edge code (two letters from C, D, E, F, G, H, Z, e.g. "FF")`)
  }
  return { code: clean, normal: frictionRange(clean[0] as string), hot: frictionRange(clean[1] as string) }
}

/** The two-letter edge code for a normal and a hot coefficient. */
export function frictionCode(normalMu: number | null | undefined, hotMu: number | null | undefined): string {
  return `${frictionLetter(normalMu)}${frictionLetter(hotMu)}`
}
