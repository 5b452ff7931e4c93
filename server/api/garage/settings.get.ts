/**
 * GET /api/garage/settings  -> GarageSettingsView (managers)
 * Labour rate, markup rules, tax rate and whether prices are shown with it, the part price ending, whether core
 * deposits are passed on to owners, quote validity and terms, whether technicians see trade prices (the
 * organisation's flag, shared with the catalogue), the logo, and the installation's currency.
 * 401; 403 without `garage.settings`.
 */
import { garageSettingsView } from '../../services/garage-settings'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'garage.settings')
  return garageSettingsView(org, serverFormats().currency)
})
