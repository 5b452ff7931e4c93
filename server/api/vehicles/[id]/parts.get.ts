/**
 * GET /api/vehicles/:id/parts?opt.<option key>=<value>...  e.g. `?opt.front_disc_diameter_mm=300&opt.parking_brake=electric`
 * -> `{ vehicle, priceVersion, answers[], questions[], groups: [{ axle, label, types: [{ type, label, parts[] }] }], counts }`.
 * Parts whose fitment qualifiers contradict an answer are left out; `questions` lists the options still open, each
 * value with how many parts it would keep. Money fields (`listPriceMinor`, `netPriceMinor`, `coreDepositMinor`,
 * `tradeCostMinor` for distributor staff) appear only for callers who may see prices.
 * 404 unknown vehicle; 422 (`data.fields["opt.<key>"]`) for an option the vehicle lacks or a value it does not offer.
 */
import { VehicleIdParamsSchema } from '#shared/schemas/catalogue/params'
import { answersFromQuery } from '#shared/schemas/catalogue/vehicle-queries'
import { catalogueContext } from '../../../services/catalogue/context'
import { vehiclePartsBody } from '../../../services/catalogue/vehicle-parts'

export default defineEventHandler(async (event) => {
  const { user, org } = requireAbility(event, 'catalogue.view')
  const { id } = paramsWith(event, VehicleIdParamsSchema)
  const answers = answersFromQuery(getQuery(event))
  const pricing = await catalogueContext(user, org)
  const body = await vehiclePartsBody(id, answers, pricing)
  if (body === null) throw notFound(`Vehicle ${id}`)
  setResponseHeader(event, 'content-type', 'application/json; charset=utf-8')
  return body
})
