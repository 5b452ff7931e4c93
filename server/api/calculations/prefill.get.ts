/**
 * GET /api/calculations/prefill?vehicleId=<id>&sku=<part>&opt.<option key>=<value>
 * -> the bore-check body built from the vehicle's original-equipment data and, for a master cylinder, caliper or
 *    wheel cylinder SKU, the replacement from that part's specifications; plus the option questions, the OE wear
 *    limits per axle (for the inspection form), what the data lacks (`missing`), the defaults used
 *    (`assumptions`) and plain notes. Nothing is computed here: POST /api/calculations/hydraulics does that.
 * 401 signed out; 422 bad query (`vehicleId`, `sku`, `opt.<key>`); 404 unknown vehicle or part.
 */
import { z } from 'zod'
import { SkuSchema, answersFromQuery } from '#shared/schemas/parts'
import { answerProblems } from '#shared/utils/catalogue/qualifiers'
import { Vehicle, VehicleOption } from '../../models/catalogue'
import { PrefillNotFound, buildPrefill } from '../../services/prefill'

const QuerySchema = z.object({
  vehicleId: z.coerce.number({ error: 'vehicleId must be a number' }).int({ error: 'vehicleId must be a whole number' }).positive({ error: 'vehicleId is required' }),
  sku: z.preprocess((v) => (v === '' ? undefined : v), SkuSchema.optional()),
})

export default defineEventHandler(async (event) => {
  requireAbility(event, 'calculations.use')
  const raw = getQuery(event)
  const query = parseWith(QuerySchema, raw)
  const answers = answersFromQuery(raw)
  if (!(await Vehicle.findByPk(query.vehicleId, { attributes: ['id'] }))) throw notFound('Vehicle')
  const options = await VehicleOption.findAll({ where: { vehicleId: query.vehicleId } })
  const problems = answerProblems(options, answers)
  if (Object.keys(problems).length) throw invalidInput(problems)
  try {
    return await buildPrefill(query.vehicleId, query.sku, answers)
  } catch (err) {
    if (err instanceof PrefillNotFound) throw notFound(err.what)
    throw err
  }
})
