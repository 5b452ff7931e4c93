/**
 * POST /api/inspections  { vehicleId, registration?, odometer?, answers?: { optionKey: value }, wear: WEAR }
 * Records a garage's inspection of one vehicle: the wear and fluid verdicts (POST /api/calculations/wear) and
 * the catalogue parts that fit this vehicle for each part type the verdicts recommend. -> 201 InspectionDetail.
 * 401 signed out; 403 without `inspections.record` (garage roles only); 422 with `data.fields` (wear fields
 * keyed `wear.<path>`, answers keyed `answers.<key>`); 404 unknown vehicle.
 */
import { readInspection, recordInspection } from '../../services/inspection-records'

export default defineEventHandler(async (event) => {
  const { user, org } = requireAbility(event, 'inspections.record')
  if (org.kind !== 'garage') throw forbidden('Inspections are recorded by garages.')
  const input = readInspection(await readJsonBody(event))
  const detail = await recordInspection(org.id, user, input)
  setResponseStatus(event, 201)
  return detail
})
