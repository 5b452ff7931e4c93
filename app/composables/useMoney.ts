import { formatMinor } from '#shared/utils/money'

/** Formats minor units in the installation's one currency (runtime config `public.currency`). */
export function useMoney() {
  const config = useRuntimeConfig()
  const currency = String(config.public.currency || 'GBP')
  const locale = String(config.public.locale || 'en-GB')
  return {
    currency,
    locale,
    money: (minor: number | null | undefined) => (minor == null ? '–' : formatMinor(minor, currency, locale)),
    day: (iso: string | null | undefined) => (iso ? new Date(iso).toLocaleDateString(locale, { day: 'numeric', month: 'long', year: 'numeric' }) : ''),
    moment: (iso: string | null | undefined) => (iso ? new Date(iso).toLocaleString(locale, { dateStyle: 'medium', timeStyle: 'short' }) : ''),
  }
}
