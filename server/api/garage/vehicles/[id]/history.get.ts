/**
 * GET /api/garage/vehicles/:id/history?page=&pageSize= -> Page<HistoryEntry>: inspections, quotes (line by line,
 * approved or declined), orders and odometer readings of the vehicle, newest first.
 * 401; 403 without `vehicles.use`; 404 not the garage's vehicle; 422 bad id or page.
 */
import { IdParamsSchema } from '#shared/schemas/garage-vehicles'
import { PageQuerySchema } from '#shared/schemas/page'
import { garageVehicleOf } from '../../../../services/garage-vehicles/register'
import { vehicleHistory } from '../../../../services/garage-vehicles/history'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'vehicles.use')
  const { id } = paramsWith(event, IdParamsSchema)
  const query = queryWith(event, PageQuerySchema)
  const v = await garageVehicleOf(org.id, id)
  return vehicleHistory(org.id, v.id, query)
})
