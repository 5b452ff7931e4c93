/**
 * DELETE /api/garage/logo  -> GarageSettingsView without a logo (managers).
 * 401; 403 without `garage.settings`.
 */
import { GarageSettings } from '../../models/quotes'
import { removeLogo } from '../../services/garage-logo'
import { garageSettingsView } from '../../services/garage-settings'

export default defineEventHandler(async (event) => {
  const { user, org } = requireAbility(event, 'garage.settings')
  const previous = await withWrite(async (t) => {
    const row = await GarageSettings.findOne({ where: { organisationId: org.id }, transaction: t })
    if (!row?.logoFile) return null
    const old = row.logoFile
    await GarageSettings.update({ logoFile: null, logoMime: null, logoUpdatedAt: new Date() }, { where: { id: row.id }, transaction: t })
    await audit(t, { actorUserId: user.id, organisationId: org.id, action: 'garage.logo.remove', entity: 'garage_settings', entityId: org.id })
    return old
  })
  await removeLogo(String(useRuntimeConfig(event).uploadsDir), previous)
  return garageSettingsView(org, quoteCurrency())
})
