/**
 * GET /api/labour-times?vehicleId=&operation=&page=&pageSize= -> Page<LabourTimeView>: the hours per operation
 * for a vehicle; for a garage, its own hours where it set them (`source: "garage"`, with the guide's beside).
 * 401; 403 without `catalogue.view`; 422 bad query.
 */
import { LabourTimesQuerySchema } from '#shared/schemas/jobs'
import { labourTimes } from '../../services/jobs/labour-guide'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'catalogue.view')
  const query = queryWith(event, LabourTimesQuerySchema)
  const own = org.kind === 'garage' ? org.id : null
  return pageOfList(query, await labourTimes(query.vehicleId, own, query.operation))
})
