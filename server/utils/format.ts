/** The server's figures and dates as people read them (documents, statements, e-mails): see shared/utils/format.ts. */
import { formatsFor, type Formats } from '../../shared/utils/format'

export function serverFormats(): Formats {
  const { currency, locale, timeZone } = useRuntimeConfig().public
  return formatsFor({ currency: String(currency ?? ''), locale: String(locale ?? ''), timeZone: String(timeZone ?? '') })
}
