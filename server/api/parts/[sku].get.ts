/**
 * GET /api/parts/:sku[?vehicleId=] -> the part page: `specs`, `oeNumbers`, `supersedes`, `replacedBy`, `resolvedFrom`
 * (when an old SKU was asked for), `vehicles: [{ vehicleId, label, axle, side, quantity, qualifiers, note }]`,
 * `stock` per branch, prices for callers who may see them, `alternatives` with the same fitting dimensions within
 * `alternativesRule`, and `alsoNeeded: [{ sku, relation, quantity, reason, description, fits }]` (with a vehicle:
 * quantities for it and whether each fits it). 404 for an unknown SKU.
 */
import { SkuParamsSchema } from '#shared/schemas/catalogue/params'
import { AlsoNeededQuerySchema } from '#shared/schemas/jobs'
import { partDetail } from '../../services/catalogue/parts'
import { catalogueContext } from '../../services/catalogue/context'
import { alsoNeededFor } from '../../services/jobs/also-needed'

export default defineEventHandler(async (event) => {
  const { user, org } = requireAbility(event, 'catalogue.view')
  const { sku } = paramsWith(event, SkuParamsSchema)
  const { vehicleId } = queryWith(event, AlsoNeededQuerySchema)
  const part = await partDetail(sku, await catalogueContext(user, org))
  if (!part) throw notFound(`Part ${sku}`)
  return { ...part, alsoNeeded: await alsoNeededFor(part.id, vehicleId) }
})
