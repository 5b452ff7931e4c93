/**
 * Turning what people type into what the quote routes take: money as "68.50" -> 6850 minor units,
 * percentages as "12.5" -> 1250 basis points, hours as "1.25". `null` means "not a valid entry".
 */
import { parseMoneyToMinor } from '#shared/utils/money'

export function minorToInput(minor: number | null | undefined): string {
  if (minor == null) return ''
  const sign = minor < 0 ? '-' : ''
  const a = Math.abs(minor)
  return `${sign}${Math.floor(a / 100)}.${String(a % 100).padStart(2, '0')}`
}

export function inputToMinor(text: string): number | null {
  return parseMoneyToMinor(text.replace(/[£€$\s]/g, ''))
}

export function bpToInput(bp: number | null | undefined): string {
  if (bp == null) return ''
  return String(bp / 100)
}

/** "12.5" / "12,5" / "12.5 %" -> 1250; null when not a number with at most two decimals. */
export function inputToBp(text: string): number | null {
  const t = text.replace('%', '').replace(',', '.').trim()
  if (!/^-?\d{1,4}(\.\d{1,2})?$/.test(t)) return null
  return Math.round(Number(t) * 100)
}

export function inputToHours(text: string): number | null {
  const t = text.replace(',', '.').replace(/h(ours?)?$/i, '').trim()
  if (!/^\d{1,3}(\.\d{1,2})?$/.test(t)) return null
  return Number(t)
}
