/**
 * GET /api/price-files/:id/changes?kind=new|changed|unchanged|missing|rejected&page=&pageSize=(at most 100)
 *     &sort=row|sku|change|old|new&dir=asc|desc&q=<sku or description>&large=1&direction=up|down
 * -> Page<PriceChangeRow>: { data, meta: { page, pageSize, total, pages } }
 * What the check found, one page at a time; sorting and filtering happen here, on the server.
 * Errors: 401, 403, 404, 422 (a filter, the sort or the page out of range).
 */
import { ChangesQuerySchema, PriceFileIdParamsSchema } from '#shared/schemas/price-files'
import { findPriceFile } from '../../../services/price-files/present'
import { changesPage } from '../../../services/price-files/changes-page'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'priceFiles.manage')
  const { id } = paramsWith(event, PriceFileIdParamsSchema)
  const query = queryWith(event, ChangesQuerySchema)
  const priceFile = await findPriceFile(id)
  return changesPage(priceFile.id, query)
})
