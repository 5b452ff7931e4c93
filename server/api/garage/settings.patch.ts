/**
 * PATCH /api/garage/settings  { labourRateMinor?, markupRules?, taxRateBp?, pricesIncludeTax?, partPriceEndingMinor?,
 *   coreDepositsPassedOn?, quoteValidityDays?, quoteTerms?, techniciansSeePrices? }
 * Managers only. New values apply to lines added from now on: lines already on quotes keep the net price,
 * markup, rate, tax and way of stating it they were added with. -> GarageSettingsView.
 * 401; 422 with `data.fields`; 403 without `garage.settings`.
 */
import { GarageSettingsUpdateSchema } from '#shared/schemas/quotes'
import { garageSettingsView, updateGarageSettings } from '../../services/garage-settings'

export default defineEventHandler(async (event) => {
  requireAuth(event)
  const body = await bodyWith(event, GarageSettingsUpdateSchema)
  const auth = requireAbility(event, 'garage.settings')
  return garageSettingsView(await updateGarageSettings(auth, body), serverFormats().currency)
})
