import { formatsFor, type Formats } from '#shared/utils/format'

/** Money, dates and counts as people read them, in the installation's currency, locale and time zone. */
export function useFormats(): Formats {
  const { currency, locale, timeZone } = useRuntimeConfig().public
  return formatsFor({ currency: String(currency ?? ''), locale: String(locale ?? ''), timeZone: String(timeZone ?? '') })
}
