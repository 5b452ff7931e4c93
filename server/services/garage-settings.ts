/** The garage settings as the settings page reads them. Plain Node. */
import type { Organisation } from '../models/accounts'
import { settingsOf } from './quotes'
import type { GarageSettingsView } from '../../shared/types/quotes'

export async function garageSettingsView(org: Organisation, currency: string): Promise<GarageSettingsView> {
  const s = await settingsOf(org.id)
  return {
    organisationName: org.name,
    labourRateMinor: s.labourRateMinor,
    markupRules: s.markupRules,
    taxRateBp: s.taxRateBp,
    quoteValidityDays: s.quoteValidityDays,
    quoteTerms: s.quoteTerms,
    techniciansSeePrices: !!org.techniciansSeePrices,
    logo: s.logoFile && s.logoMime
      ? { url: `/api/garage/logo?v=${s.logoUpdatedAt ? new Date(s.logoUpdatedAt).getTime() : 0}`, mime: s.logoMime, updatedAt: new Date(s.logoUpdatedAt ?? Date.now()).toISOString() }
      : null,
    currency,
  }
}
