/**
 * GET /api/price-files/:id/changes?kind=new|changed|unchanged|missing|rejected&page=&pageSize=
 *     &sort=row|sku|change|old|new&dir=asc|desc&q=<sku or description>&large=1&direction=up|down
 * -> { data: PriceChangeRow[], meta: { page, pageSize, total, pages } }
 * What the check found, one page at a time; sorting and filtering happen here, on the server.
 */
import { ChangesQuerySchema, UploadIdParamsSchema } from '#shared/schemas/price-files'
import { PriceFile } from '../../../models/price-files'
import { changesPage } from '../../../services/price-files/present'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'priceFiles.manage')
  const { id } = paramsWith(event, UploadIdParamsSchema)
  const q = queryWith(event, ChangesQuerySchema)
  const up = await PriceFile.findByPk(id, { attributes: ['id'] })
  if (!up) throw notFound('Price file')
  return changesPage(id, q)
})
