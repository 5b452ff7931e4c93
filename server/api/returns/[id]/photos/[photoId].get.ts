/**
 * GET /api/returns/:id/photos/:photoId -> the photo (shown inline, never sniffed). The garage that sent it and
 * distributor staff who decide returns. 401; 403; 404 not theirs.
 */
import { ReturnPhotoParamsSchema } from '#shared/schemas/returns'
import { can } from '#shared/utils/abilities'
import { readReturnPhoto } from '../../../../services/returns/photos'

export default defineEventHandler(async (event) => {
  const auth = requireAuth(event)
  const staff = auth.org.kind === 'distributor' && can(auth.user.role, 'returns.decide')
  if (!staff) requireAbility(event, 'returns.request')
  const { id, photoId } = paramsWith(event, ReturnPhotoParamsSchema)
  const photo = await readReturnPhoto(id, photoId, staff ? null : auth.org.id, String(useRuntimeConfig(event).uploadsDir))
  setResponseHeader(event, 'content-security-policy', "default-src 'none'; sandbox")
  return sendDownload(event, photo.bytes, { name: photo.name, type: photo.mime, inline: true })
})
