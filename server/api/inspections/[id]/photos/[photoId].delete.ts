/**
 * DELETE /api/inspections/:id/photos/:photoId -> 204; the row and the file go. Audited.
 * 401; 403 without `inspections.record`; 404 not this garage's photo; 422 bad ids.
 */
import { InspectionPhotoParamsSchema } from '#shared/schemas/inspections'
import { removeInspectionPhoto } from '../../../../services/inspection-photos'

export default defineEventHandler(async (event) => {
  const { user, org } = requireAbility(event, 'inspections.record')
  const { id, photoId } = paramsWith(event, InspectionPhotoParamsSchema)
  await removeInspectionPhoto(org.id, user, id, photoId, String(useRuntimeConfig(event).uploadsDir))
  setResponseStatus(event, 204)
  return null
})
