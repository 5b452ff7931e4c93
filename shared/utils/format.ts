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
  /** the money unit for a column or axis heading: the currency's symbol in the locale ("£") */
  moneyUnit: string
  /** "3 Dec 2026": the one way a date is written, on screens, documents and e-mails alike */
  day: (when: When) => string
  /** the same as `day` (kept so a narrow column can say what it wants) */
  shortDay: (when: When) => string
  /** "3 Dec 2026, 14:05" */
  moment: (when: When) => string
  /** "December 2026" for a statement month "2026-12" */
  month: (yyyyMm: string) => string
  /** "12,345" */
  count: (n: number) => string
  /** "1 part", "12,345 parts": the count with the word in the form the locale's plural rules pick */
  counted: (n: number, one: string, other: string) => string
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
  const plurals = new Intl.PluralRules(s.locale)
  // one date format per locale: the medium date style, as `moment` writes the date part ("3 Dec 2026")
  const oneDay = dates({ dateStyle: 'medium' })
  return {
    ...s,
    money: (minor) => (minor == null ? '–' : formatMinor(minor, s.currency, s.locale)),
    moneyUnit: new Intl.NumberFormat(s.locale, { style: 'currency', currency: s.currency }).formatToParts(0).find((p) => p.type === 'currency')?.value ?? s.currency,
    day: oneDay,
    shortDay: oneDay,
    moment: dates({ dateStyle: 'medium', timeStyle: 'short' }),
    month: (yyyyMm) => (/^\d{4}-\d{2}$/.test(yyyyMm) ? monthFormat.format(new Date(`${yyyyMm}-01T00:00:00Z`)) : yyyyMm),
    count: (n) => counts.format(n),
    counted: (n, one, other) => `${counts.format(n)} ${plurals.select(n) === 'one' ? one : other}`,
  }
}
