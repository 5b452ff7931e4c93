/**
 * GET /api/inspections?vehicleId=&page=  -> { data: InspectionSummary[], meta: { page, pageSize, total } }
 * The caller's garage's inspections, newest first, optionally for one vehicle.
 * 401 signed out; 403 without `inspections.record`; 422 bad query.
 */
import { InspectionListQuerySchema } from '#shared/schemas/inspections'
import { Inspection } from '../../models/inspections'
import { Vehicle } from '../../models/catalogue'
import { User } from '../../models/accounts'
import { inspectionSummary } from '../../services/inspections'

const PAGE_SIZE = 20

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'inspections.record')
  const query = queryWith(event, InspectionListQuerySchema)
  const where = { organisationId: org.id, ...(query.vehicleId ? { vehicleId: query.vehicleId } : {}) }
  const { rows, count } = await Inspection.findAndCountAll({
    where,
    include: [
      { model: Vehicle, as: 'vehicle', attributes: ['id', 'make', 'model', 'generation', 'yearFrom', 'yearTo'] },
      { model: User, as: 'author', attributes: ['id', 'name'] },
    ],
    order: [['createdAt', 'DESC'], ['id', 'DESC']],
    limit: PAGE_SIZE,
    offset: (query.page - 1) * PAGE_SIZE,
  })
  return { data: rows.map(inspectionSummary), meta: { page: query.page, pageSize: PAGE_SIZE, total: count } }
})
