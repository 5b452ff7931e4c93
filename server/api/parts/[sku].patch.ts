/**
 * PATCH /api/parts/:sku  { productLine?, description?, status?, specs?, oeNumbers? } -> { sku }.
 * `specs` replaces the whole specification and is checked against the part type's schema. Audited with before/after.
 */
import { SkuParamsSchema } from '#shared/schemas/catalogue/params'
import { PartPatchSchema } from '#shared/schemas/catalogue/upkeep'
import { patchPart } from '../../services/catalogue/upkeep'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'catalogue.edit')
  const { sku } = paramsWith(event, SkuParamsSchema)
  const input = await bodyWith(event, PartPatchSchema)
  const part = await patchPart(user.id, sku, input)
  return { sku: part.sku }
})
