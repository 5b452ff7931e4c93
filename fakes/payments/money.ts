/** Amounts in minor units: how they read in messages and on the hosted page, and the smallest charge. */
import { paramError } from './errors'

export function formatMoney(amount: number, currency: string): string {
  try {
    const fmt = new Intl.NumberFormat('en-GB', { style: 'currency', currency: currency.toUpperCase() })
    const digits = fmt.resolvedOptions().maximumFractionDigits ?? 2
    return fmt.format(amount / 10 ** digits)
  } catch {
    return `${amount} ${currency.toUpperCase()}`
  }
}

// API reference (from memory): minimum charge amounts per currency in minor units; 50 elsewhere.
const MINIMUM_AMOUNT: Record<string, number> = { usd: 50, eur: 50, gbp: 30, aud: 50, cad: 50, chf: 50, jpy: 50 }

export function minimumAmount(currency: string): number {
  return MINIMUM_AMOUNT[currency] ?? 50
}

/** A three-letter currency code, lower-cased as the API answers it. */
export function currencyCode(value: string, param: string): string {
  const code = value.toLowerCase()
  if (!/^[a-z]{3}$/.test(code)) throw paramError(`Invalid currency: ${value}`, param)
  return code
}
