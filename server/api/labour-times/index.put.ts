/**
 * PUT /api/labour-times  { vehicleId, operation, hours | null }
 * Counter staff and the admin set the guide's hours; a garage manager sets the garage's own hours for the
 * operation (null: back to the guide's). -> LabourTimeView[] for the operation.
 * 401; 403 for other roles; 422 with `data.fields`.
 */
import { LabourTimeSetSchema } from '#shared/schemas/jobs'
import { can } from '#shared/utils/abilities'
import { setLabourTime } from '../../services/jobs/labour-guide'

export default defineEventHandler(async (event) => {
  const { user, org } = requireAuth(event)
  const input = await bodyWith(event, LabourTimeSetSchema)
  const guide = can(user.role, 'labour.guide')
  if (!guide && !can(user.role, 'labour.ownHours')) throw forbidden()
  return setLabourTime(input, guide ? null : org.id, user.id)
})
