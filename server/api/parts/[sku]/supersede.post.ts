/**
 * POST /api/parts/:sku/supersede  { newSku, note } -> { sku, replacedBy }. The part becomes
 * discontinued; searching its SKU finds `newSku` and says so. Audited.
 */
import { SkuParamsSchema } from '#shared/schemas/catalogue/params'
import { SupersedeSchema } from '#shared/schemas/catalogue/upkeep'
import { supersedePart } from '../../../services/catalogue/upkeep'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'catalogue.edit')
  const { sku } = paramsWith(event, SkuParamsSchema)
  const input = await bodyWith(event, SupersedeSchema)
  await supersedePart(user.id, sku, input.newSku, input.note)
  return { sku, replacedBy: input.newSku }
})
