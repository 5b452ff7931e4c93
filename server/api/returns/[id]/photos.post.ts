/**
 * POST /api/returns/:id/photos (multipart/form-data, one file in `photo`: JPEG, PNG or WebP, at most 8 MB)
 * -> ReturnView: a photo of the part, while the counter has not decided the return (at most 4).
 * 401; 403 without `returns.request`; 404 not the caller's; 409 decided; 413 too large; 415 not multipart or
 * not an image; 422 missing or one too many (each naming `photo`).
 */
import { ReturnParamsSchema } from '#shared/schemas/returns'
import { addReturnPhoto } from '../../../services/returns/photos'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'returns.request')
  const { id } = paramsWith(event, ReturnParamsSchema)
  return addReturnPhoto(org.id, id, event.node.req, String(useRuntimeConfig(event).uploadsDir))
})
