/**
 * GET /api/inspections/:id/photos/:photoId -> the photo (image/jpeg or image/png), to the garage that took it only;
 * served with nosniff and a sandbox CSP. 401; 403 without `inspections.record`; 404 not this garage's; 422 bad ids.
 */
import { InspectionPhotoParamsSchema } from '#shared/schemas/inspections'
import { photoHeaders, readInspectionPhoto } from '../../../../services/inspection-photos'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'inspections.record')
  const { id, photoId } = paramsWith(event, InspectionPhotoParamsSchema)
  const photo = await readInspectionPhoto(org.id, id, photoId, String(useRuntimeConfig(event).uploadsDir))
  setResponseHeaders(event, photoHeaders(photo.mime, 'private, max-age=86400'))
  return photo.data
})
