/**
 * The unit switches of the calculation pages (mm/in, N/lbf, kPa/bar/psi) and how their physical quantities are
 * written. Values are kept in SI everywhere; these helpers convert only for showing and typing, with the brake
 * library's exact factors. Numbers are written in the installation's locale (runtime config, as `useFormats`).
 */
import {
  convertForce, convertLength, convertPressure,
  type ForceUnit, type LengthUnit, type PressureUnit,
} from '#shared/utils/brake'

export type Quantity = 'length' | 'force' | 'pressure'

export interface BrakeUnits {
  length: LengthUnit
  force: ForceUnit
  pressure: PressureUnit
}

export const UNIT_CHOICES: { [K in Quantity]: { value: BrakeUnits[K]; label: string }[] } = {
  length: [{ value: 'mm', label: 'mm' }, { value: 'in', label: 'in' }],
  force: [{ value: 'N', label: 'N' }, { value: 'lbf', label: 'lbf' }],
  pressure: [{ value: 'kPa', label: 'kPa' }, { value: 'bar', label: 'bar' }, { value: 'psi', label: 'psi' }],
}

const SI: BrakeUnits = { length: 'mm', force: 'N', pressure: 'kPa' }

/** Decimals for shown results and for editable values, per unit. */
const SHOW_DIGITS: Record<string, number> = { mm: 1, in: 3, N: 0, lbf: 0, kPa: 0, bar: 1, psi: 0 }
const EDIT_DIGITS: Record<string, number> = { mm: 3, in: 4, N: 1, lbf: 2, kPa: 1, bar: 3, psi: 2 }

const absent = (v: number | null | undefined): v is null | undefined => v === null || v === undefined || !Number.isFinite(v)

/** Shared unit choice for the page (per tab, not stored). */
export function useBrakeUnits() {
  const units = useState<BrakeUnits>('brake-units', () => ({ ...SI }))
  const { locale } = useFormats()

  /** A figure with exactly `digits` decimals, "1,234.5"; "–" when there is none. */
  function number(v: number | null | undefined, digits = 0, grouping = true): string {
    if (absent(v)) return '–'
    return v.toLocaleString(locale, { minimumFractionDigits: digits, maximumFractionDigits: digits, useGrouping: grouping })
  }
  /** A signed percent change, "+12.4 %", or "–" when there is none. */
  function percent(v: number | null | undefined, digits = 1): string {
    if (absent(v)) return '–'
    const rounded = Number(v.toFixed(digits))
    return `${rounded > 0 ? '+' : rounded < 0 ? '−' : '±'}${number(Math.abs(rounded), digits, false)} %`
  }
  function fromSI(q: Quantity, v: number): number {
    if (q === 'length') return convertLength(v, 'mm', units.value.length)
    if (q === 'force') return convertForce(v, 'N', units.value.force)
    return convertPressure(v, 'kPa', units.value.pressure)
  }
  function toSI(q: Quantity, v: number): number {
    if (q === 'length') return convertLength(v, units.value.length, 'mm')
    if (q === 'force') return convertForce(v, units.value.force, 'N')
    return convertPressure(v, units.value.pressure, 'kPa')
  }
  const unitOf = (q: Quantity): string => units.value[q]
  /** A result in the chosen unit, e.g. "5,318 kPa" / "771 psi". */
  function show(q: Quantity, v: number | null | undefined, withUnit = true): string {
    if (absent(v)) return '–'
    const n = number(fromSI(q, v), SHOW_DIGITS[unitOf(q)] ?? 1)
    return withUnit ? `${n} ${unitOf(q)}` : n
  }
  /** The editable text for an SI value in the chosen unit. */
  function editText(q: Quantity, v: number): string {
    const digits = EDIT_DIGITS[unitOf(q)] ?? 3
    return String(Number(fromSI(q, v).toFixed(digits)))
  }
  return { units, fromSI, toSI, unitOf, show, editText, number, percent }
}
