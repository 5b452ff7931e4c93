/**
 * Unit conversions and tyre-size geometry for the brake calculations.
 *
 * Everything inside the brake library is SI-based: mm, mm², N, kPa (N/mm² = MPa internally where it keeps the
 * arithmetic short). These helpers exist for the unit switches in the UI (mm/in, N/lbf, kPa/bar/psi) and for
 * reading tyre size codes. Factors are the exact definitions given in NIST SP 811 (2008), App. B.8/B.9.
 */

/** 1 in = 25.4 mm, exact by definition (NIST SP 811 App. B.9). */
export const MM_PER_INCH = 25.4
/** 1 in² = 645.16 mm², exact (25.4²), written out so no rounding creeps in. */
export const MM2_PER_SQUARE_INCH = 645.16
/** Standard acceleration of gravity, m/s², exact by definition (NIST SP 811 App. B.9, "standard gravity"). */
export const STANDARD_GRAVITY_MPS2 = 9.80665
/** 1 lb (avoirdupois) = 0.45359237 kg, exact (NIST SP 811 App. B.9). */
export const KG_PER_POUND = 0.45359237
/** 1 lbf = 0.45359237 kg × 9.80665 m/s² = 4.4482216152605 N (NIST SP 811 App. B.9). */
export const N_PER_LBF = KG_PER_POUND * STANDARD_GRAVITY_MPS2
/** 1 psi = 1 lbf/in² = 6894.757293168361 Pa (NIST SP 811 App. B.9), derived from the exact lbf and inch. */
export const PA_PER_PSI = N_PER_LBF / (0.0254 * 0.0254)
/** 1 psi in kPa. */
export const KPA_PER_PSI = PA_PER_PSI / 1000
/** 1 bar = 100 kPa, exact (NIST SP 811 App. B.9). */
export const KPA_PER_BAR = 100

export type LengthUnit = 'mm' | 'in'
export type ForceUnit = 'N' | 'lbf'
export type PressureUnit = 'kPa' | 'bar' | 'psi'

/** Both ways of one exact factor: `[multiply by it, divide by it]`. */
function byFactor(factor: number): [(value: number) => number, (value: number) => number] {
  return [(value) => value * factor, (value) => value / factor]
}

/** Inches to millimetres and back. */
export const [inchToMm, mmToInch] = byFactor(MM_PER_INCH)
/** Square inches to mm² (piston areas quoted in in²) and back. */
export const [squareInchToMm2, mm2ToSquareInch] = byFactor(MM2_PER_SQUARE_INCH)
/** Pound-force to newtons and back. */
export const [lbfToN, nToLbf] = byFactor(N_PER_LBF)
/** psi to kPa and back. */
export const [psiToKPa, kPaToPsi] = byFactor(KPA_PER_PSI)
/** bar to kPa and back. */
export const [barToKPa, kPaToBar] = byFactor(KPA_PER_BAR)

/** °C to °F (exact definition: °F = °C × 9/5 + 32); used to show the FMVSS No. 116 boiling points both ways. */
export function celsiusToFahrenheit(celsius: number): number {
  return (celsius * 9) / 5 + 32
}

const LENGTH_TO_MM: Record<LengthUnit, number> = { mm: 1, in: MM_PER_INCH }
const FORCE_TO_N: Record<ForceUnit, number> = { N: 1, lbf: N_PER_LBF }
const PRESSURE_TO_KPA: Record<PressureUnit, number> = { kPa: 1, bar: KPA_PER_BAR, psi: KPA_PER_PSI }

/** Converts a length between mm and in (UI unit switch). */
export function convertLength(value: number, from: LengthUnit, to: LengthUnit): number {
  return from === to ? value : (value * LENGTH_TO_MM[from]) / LENGTH_TO_MM[to]
}

/** Converts a force between N and lbf (UI unit switch). */
export function convertForce(value: number, from: ForceUnit, to: ForceUnit): number {
  return from === to ? value : (value * FORCE_TO_N[from]) / FORCE_TO_N[to]
}

/** Converts a pressure between kPa, bar and psi (UI unit switch). */
export function convertPressure(value: number, from: PressureUnit, to: PressureUnit): number {
  return from === to ? value : (value * PRESSURE_TO_KPA[from]) / PRESSURE_TO_KPA[to]
}

/**
 * Rolling circumference ≈ 3.05 × unloaded diameter, a tyre-trade rule of thumb (common practice): a loaded tyre
 * rolls on a radius about 3 % smaller than its unloaded radius. Expressed as a factor on the radius.
 */
export const ROLLING_RADIUS_FACTOR = 3.05 / Math.PI

/** Assumption text shown whenever a rolling radius comes from a tyre size code. */
export const TYRE_RADIUS_ASSUMPTION =
  'Rolling radius from the tyre size code: unloaded radius = rim diameter / 2 + section width × aspect ratio, ' +
  'then × 3.05/π (rolling circumference ≈ 3.05 × unloaded diameter, a tyre-trade rule of thumb); ' +
  'tread wear, inflation and load change it by a few percent.'

/** A metric tyre size code read into its parts, with the radii derived from it (all mm). */
export interface TyreSize {
  /** The code as given, trimmed. */
  code: string
  sectionWidthMm: number
  aspectRatioPercent: number
  rimDiameterInch: number
  /** Sidewall height = section width × aspect ratio / 100. */
  sidewallMm: number
  /** Geometric (static, unloaded) radius = rim diameter / 2 + sidewall. */
  unloadedRadiusMm: number
  /** Unloaded radius × {@link ROLLING_RADIUS_FACTOR}: the radius the brake force is referred to. */
  rollingRadiusMm: number
}

// Metric codes such as "205/55 R16", "P215/60R16 94H", "LT245/75R16", "225/45 ZR17", "195/65-15".
const TYRE_CODE = /^\s*(?:P|LT|T|ST)?\s*(\d{3})\s*\/\s*(\d{2,3})\s*(?:Z?R|RF|-|D|B)?\s*F?\s*(\d{2}(?:\.\d)?)(?:\s|$|[A-Z(])/i

/**
 * Reads a metric tyre size code. Returns null when the text is not a metric size code (flotation sizes such as
 * "31x10.50R15" are not handled; enter the rolling radius in mm instead).
 */
export function parseTyreSize(code: string): TyreSize | null {
  const match = TYRE_CODE.exec(code)
  if (!match) return null
  const sectionWidthMm = Number(match[1])
  const aspectRatioPercent = Number(match[2])
  const rimDiameterInch = Number(match[3])
  // Plausibility limits (common practice): passenger/light-truck sizes.
  if (sectionWidthMm < 100 || sectionWidthMm > 400) return null
  if (aspectRatioPercent < 20 || aspectRatioPercent > 100) return null
  if (rimDiameterInch < 10 || rimDiameterInch > 26) return null
  const sidewallMm = (sectionWidthMm * aspectRatioPercent) / 100
  const unloadedRadiusMm = inchToMm(rimDiameterInch) / 2 + sidewallMm
  return {
    code: code.trim(),
    sectionWidthMm,
    aspectRatioPercent,
    rimDiameterInch,
    sidewallMm,
    unloadedRadiusMm,
    rollingRadiusMm: unloadedRadiusMm * ROLLING_RADIUS_FACTOR,
  }
}

/**
 * Rolling radius in mm from a metric tyre size code ("205/55 R16" -> about 306.7 mm).
 * @throws Error with a plain message when the code can't be read.
 */
export function tyreRollingRadiusMm(code: string): number {
  const size = parseTyreSize(code)
  if (!size) throw new Error(`Tyre size "${code}" is not a metric size code like "205/55 R16"`)
  return size.rollingRadiusMm
}
