/** The server's figures and dates as people read them (documents, statements, e-mails): see shared/utils/format.ts. */
import { formatsFor, type Formats } from '../../shared/utils/format'

let made: { key: string; formats: Formats } | undefined

/**
 * The formats for the installation's settings, made once per settings: making them builds several `Intl`
 * formatters (1-3 ms), and jobs every few seconds and routes ask for them (a stall on the server's one thread).
 */
export function serverFormats(): Formats {
  const { currency, locale, timeZone } = useRuntimeConfig().public
  const settings = { currency: String(currency ?? ''), locale: String(locale ?? ''), timeZone: String(timeZone ?? '') }
  const key = `${settings.currency}|${settings.locale}|${settings.timeZone}`
  if (made?.key !== key) made = { key, formats: formatsFor(settings) }
  return made.formats
}
