/**
 * GET /api/parts/:sku -> the part page: `specs`, `oeNumbers`, `supersedes`, `replacedBy`, `resolvedFrom` (when an
 * old SKU was asked for), `vehicles: [{ vehicleId, label, axle, side, quantity, qualifiers, note }]`, `stock` per
 * branch, prices for callers who may see them, and `alternatives` with the same fitting dimensions within
 * `alternativesRule`. 404 for an unknown SKU.
 */
import { SkuParamsSchema } from '#shared/schemas/catalogue/params'
import { partDetail } from '../../services/catalogue/parts'
import { catalogueContext } from '../../services/catalogue/context'

export default defineEventHandler(async (event) => {
  const { user, org } = requireAbility(event, 'catalogue.view')
  const { sku } = paramsWith(event, SkuParamsSchema)
  const part = await partDetail(sku, await catalogueContext(user, org))
  if (!part) throw notFound(`Part ${sku}`)
  return part
})
