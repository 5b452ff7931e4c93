/**
 * GET /api/inspections?vehicleId=&page=&pageSize= -> Page<InspectionSummary>: the caller's garage's inspections,
 * newest first, optionally of one vehicle. 401 signed out; 403 without `inspections.record`; 422 bad query.
 */
import { InspectionListQuerySchema } from '#shared/schemas/inspections'
import { listInspections } from '../../services/inspection-records'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'inspections.record')
  return listInspections(org.id, queryWith(event, InspectionListQuerySchema))
})
