/**
 * GET /api/inspections/:id -> InspectionDetail (readings, verdicts, recommended catalogue parts).
 * 401 signed out; 403 without `inspections.record`; 404 when it does not exist or belongs to another garage;
 * 422 for an id that is not a number.
 */
import { InspectionParamsSchema } from '#shared/schemas/inspections'
import { findInspection } from '../../services/inspection-records'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'inspections.record')
  const { id } = paramsWith(event, InspectionParamsSchema)
  return findInspection(org.id, id)
})
