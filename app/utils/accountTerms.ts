import { parseMoneyToMinor } from '#shared/utils/money'
import type { TermsDraft } from '~/components/accounts/TradeTermsFields.vue'

/**
 * The terms form's text inputs -> the API's numbers (credit limit in minor units). Returns field messages
 * for what cannot be read; the server checks the rest with the shared schema.
 */
export function termsPayload(d: TermsDraft): { payload: { tierId?: number; terms: 'card' | 'account'; creditLimitMinor?: number; paymentDays?: number }; fields: Record<string, string> } {
  const fields: Record<string, string> = {}
  const payload: { tierId?: number; terms: 'card' | 'account'; creditLimitMinor?: number; paymentDays?: number } = { terms: d.terms }
  if (d.tierId) payload.tierId = d.tierId
  else fields.tierId = 'Choose a discount tier.'
  if (d.terms === 'account') {
    const limit = parseMoneyToMinor(d.creditLimit.replace(/[^\d.-]/g, '')) // the currency sign, spaces and thousands commas go
    if (limit === null || limit <= 0) fields.creditLimitMinor = 'Enter the credit limit, e.g. 2500.00.'
    else payload.creditLimitMinor = limit
    const days = Number(d.paymentDays)
    if (!/^\d+$/.test(d.paymentDays.trim()) || days < 1 || days > 120) fields.paymentDays = 'Enter whole days from 1 to 120.'
    else payload.paymentDays = days
  }
  return { payload, fields }
}
