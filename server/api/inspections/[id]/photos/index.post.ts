/**
 * POST /api/inspections/:id/photos  multipart/form-data: one file field `photo` (JPEG or PNG, resized in the
 * browser, under 4 MB) and the fields `position` (front-left … rear-right, or system), `subject` (disc, pads,
 * drum, shoes, hose, pipe, caliper, wheel-cylinder, leak, parking-brake, fluid) and `caption?`.
 * The type is read from the bytes and any metadata (location) is dropped before it is stored. -> 201 InspectionPhotoView.
 * 401; 403 without `inspections.record`; 404 not this garage's inspection; 409 too many photos; 413 too large;
 * 415 not a JPEG or PNG, or not multipart; 422 no file or a field at fault (named).
 */
import { InspectionParamsSchema } from '#shared/schemas/inspections'
import { addInspectionPhoto, ownInspection } from '../../../../services/inspection-photos'

export default defineEventHandler(async (event) => {
  // who may upload, and to which inspection, is settled before a byte of the body is read
  const { user, org } = requireAbility(event, 'inspections.record')
  const { id } = paramsWith(event, InspectionParamsSchema)
  const inspection = await ownInspection(org.id, id)
  const photo = await addInspectionPhoto(inspection, user, event.node.req, String(useRuntimeConfig(event).uploadsDir))
  setResponseStatus(event, 201)
  return photo
})
