/**
 * POST /api/garage/logo  multipart/form-data with one file field `logo` (PNG, JPEG or SVG, under 2 MB)
 * Managers only. The type is read from the bytes; an SVG that holds anything but drawing (script,
 * foreignObject, event handlers, links, external references) is refused. The previous logo is removed once the
 * new one is saved; a failed upload leaves the old one in place. -> GarageSettingsView.
 * 401; 403 without `garage.settings`; 413 too large; 415 not an allowed image; 422 no file.
 */
import { garageSettingsView, replaceGarageLogo } from '../../services/garage-settings'

export default defineEventHandler(async (event) => {
  // who may upload is settled before a byte of the body is read
  const auth = requireAbility(event, 'garage.settings')
  await replaceGarageLogo(auth, event.node.req, String(useRuntimeConfig(event).uploadsDir))
  return garageSettingsView(auth.org, serverFormats().currency)
})
