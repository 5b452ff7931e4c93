/**
 * GET /api/inspections/:id -> InspectionDetail (readings, verdicts, recommended catalogue parts).
 * 401 signed out; 403 without `inspections.record`; 404 when it does not exist or belongs to another garage.
 */
import { InspectionParamsSchema } from '#shared/schemas/inspections'
import { Inspection } from '../../models/inspections'
import { Vehicle } from '../../models/catalogue'
import { User } from '../../models/accounts'
import { inspectionDetail } from '../../services/inspections'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'inspections.record')
  const { id } = paramsWith(event, InspectionParamsSchema)
  const row = await Inspection.findOne({
    where: { id, organisationId: org.id },
    include: [
      { model: Vehicle, as: 'vehicle', attributes: ['id', 'make', 'model', 'generation', 'yearFrom', 'yearTo'] },
      { model: User, as: 'author', attributes: ['id', 'name'] },
    ],
  })
  if (!row) throw notFound('Inspection')
  return inspectionDetail(row)
})
