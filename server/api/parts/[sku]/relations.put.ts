/**
 * PUT /api/parts/:sku/relations  { relations: [{ sku, relation, quantity, byFluidVolume?, reason }] }
 * Replaces what the part needs beside it ("also needed"). -> { alsoNeeded }.
 * 401; 403 without `catalogue.edit`; 404 unknown part; 422 with `data.fields` (e.g. `relations.0.sku`).
 */
import { SkuParamsSchema } from '#shared/schemas/catalogue/params'
import { PartRelationsSchema } from '#shared/schemas/jobs'
import { setRelations } from '../../../services/jobs/also-needed'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'catalogue.edit')
  const { sku } = paramsWith(event, SkuParamsSchema)
  const { relations } = await bodyWith(event, PartRelationsSchema)
  return { alsoNeeded: await setRelations(sku, relations, user.id) }
})
