/**
 * GET /api/price-lists/:id/changes?kind=new|changed|unchanged|missing|rejected&page=&pageSize=
 *     &sort=row|sku|change|old|new&dir=asc|desc&q=<sku or description>&large=1&direction=up|down
 * -> { data: PriceChangeRow[], meta: { page, pageSize, total, pages } }
 * What the check found, one page at a time; sorting and filtering happen here, on the server.
 */
import { ChangesQuerySchema, UploadIdParamsSchema } from '#shared/schemas/price-lists'
import { PriceUpload } from '../../../models/price-lists'
import { changesPage } from '../../../services/price-lists/present'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'priceLists.manage')
  const { id } = paramsWith(event, UploadIdParamsSchema)
  const q = queryWith(event, ChangesQuerySchema)
  const up = await PriceUpload.findByPk(id, { attributes: ['id'] })
  if (!up) throw notFound('Price file')
  return changesPage(id, q)
})
