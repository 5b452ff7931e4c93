/**
 * GET /api/price-lists/:id -> PriceUploadDetail: status, progress while checking, counts, detected headers,
 * the column mapping with its problems, and what may be done next (apply, roll back, check again).
 */
import { UploadIdParamsSchema } from '#shared/schemas/price-lists'
import { PriceUpload } from '../../../models/price-lists'
import { uploadDetail } from '../../../services/price-lists/present'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'priceLists.manage')
  const { id } = paramsWith(event, UploadIdParamsSchema)
  const up = await PriceUpload.findByPk(id)
  if (!up) throw notFound('Price file')
  return uploadDetail(up)
})
