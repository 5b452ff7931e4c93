/**
 * The one way figures and dates are written for people: money in the installation's currency, dates and times
 * in its one configured time zone (runtime config `public.currency`, `public.locale`, `public.timeZone`), the same
 * on screens, in documents, statements and e-mails. The app gets these from `useFormats()`, the server from
 * `serverFormats()`; both call `formatsFor` here.
 */
import { formatMinor } from './money'

export interface FormatSettings {
  currency: string
  locale: string
  timeZone: string
}

export const DEFAULT_FORMAT_SETTINGS: FormatSettings = { currency: 'GBP', locale: 'en-GB', timeZone: 'Europe/London' }

type When = Date | string | null | undefined

export interface Formats extends FormatSettings {
  /** "£1,234.56"; an absent amount is a dash */
  money: (minor: number | null | undefined) => string
  /** "3 December 2026" */
  day: (when: When) => string
  /** "3 Dec 2026" */
  shortDay: (when: When) => string
  /** "3 Dec 2026, 14:05" */
  moment: (when: When) => string
  /** "December 2026" for a statement month "2026-12" */
  month: (yyyyMm: string) => string
  /** "12,345" */
  count: (n: number) => string
}

function toDate(when: When): Date | null {
  if (when == null || when === '') return null
  const d = when instanceof Date ? when : new Date(when)
  return Number.isNaN(d.getTime()) ? null : d
}

export function formatsFor(settings: Partial<FormatSettings> = {}): Formats {
  const s: FormatSettings = { ...DEFAULT_FORMAT_SETTINGS, ...Object.fromEntries(Object.entries(settings).filter(([, v]) => v)) }
  const dates = (options: Intl.DateTimeFormatOptions) => {
    const f = new Intl.DateTimeFormat(s.locale, { ...options, timeZone: s.timeZone })
    return (when: When) => { const d = toDate(when); return d ? f.format(d) : '' }
  }
  // a month has no time zone: read "2026-12" as that month wherever the server runs
  const monthFormat = new Intl.DateTimeFormat(s.locale, { month: 'long', year: 'numeric', timeZone: 'UTC' })
  const counts = new Intl.NumberFormat(s.locale)
  return {
    ...s,
    money: (minor) => (minor == null ? '–' : formatMinor(minor, s.currency, s.locale)),
    day: dates({ day: 'numeric', month: 'long', year: 'numeric' }),
    shortDay: dates({ day: 'numeric', month: 'short', year: 'numeric' }),
    moment: dates({ dateStyle: 'medium', timeStyle: 'short' }),
    month: (yyyyMm) => (/^\d{4}-\d{2}$/.test(yyyyMm) ? monthFormat.format(new Date(`${yyyyMm}-01T00:00:00Z`)) : yyyyMm),
    count: (n) => counts.format(n),
  }
}
