/**
 * DELETE /api/garage/logo  -> GarageSettingsView without a logo (managers).
 * 401; 403 without `garage.settings`.
 */
import { garageSettingsView, removeGarageLogo } from '../../services/garage-settings'

export default defineEventHandler(async (event) => {
  const auth = requireAbility(event, 'garage.settings')
  await removeGarageLogo(auth, String(useRuntimeConfig(event).uploadsDir))
  return garageSettingsView(auth.org, serverFormats().currency)
})
