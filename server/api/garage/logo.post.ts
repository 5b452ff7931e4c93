/**
 * POST /api/garage/logo  multipart/form-data with one file field `logo` (PNG, JPEG or SVG, under 2 MB)
 * Managers only. The type is read from the bytes; an SVG that holds anything but drawing (script,
 * foreignObject, event handlers, links, external references) is refused. The previous logo is removed once the
 * new one is saved; a failed upload leaves the old one in place. -> GarageSettingsView.
 * 401; 403 without `garage.settings`; 413 too large; 415 not an allowed image; 422 no file.
 */
import { GarageSettings } from '../../models/quotes'
import { checkLogoFile, newLogoName, parseLogoUpload, removeLogo, storeLogo } from '../../services/garage-logo'
import { garageSettingsView } from '../../services/garage-settings'
import { settingsRowFor } from '../../services/quotes'

export default defineEventHandler(async (event) => {
  // who may upload is settled before a byte of the body is read
  const { user, org } = requireAbility(event, 'garage.settings')
  const uploads = String(useRuntimeConfig(event).uploadsDir)
  let cleanup: () => Promise<void> = async () => {}
  let stored: string | null = null
  try {
    const parsed = await parseLogoUpload(event.node.req)
    cleanup = parsed.cleanup
    const checked = await checkLogoFile(parsed.file)
    stored = newLogoName(checked.ext)
    await storeLogo(parsed.file!.filepath, uploads, stored)
    const previous = await withWrite(async (t) => {
      const row = await settingsRowFor(t, org.id)
      const old = row.logoFile
      await GarageSettings.update({ logoFile: stored, logoMime: checked.mime, logoUpdatedAt: new Date() }, { where: { id: row.id }, transaction: t })
      await audit(t, { actorUserId: user.id, organisationId: org.id, action: 'garage.logo.upload', entity: 'garage_settings', entityId: org.id, changes: { mime: checked.mime, size: checked.size } })
      return old
    })
    stored = null // kept
    await removeLogo(uploads, previous)
  } catch (err) {
    if (stored) await removeLogo(uploads, stored)
    throw err
  } finally {
    await cleanup()
  }
  return garageSettingsView(org, quoteCurrency())
})
