/**
 * GET /api/price-files/:id -> PriceFileDetail: status, progress while checking, counts, detected headers,
 * the column mapping with its problems, and what may be done next (apply, roll back, check again).
 */
import { UploadIdParamsSchema } from '#shared/schemas/price-files'
import { PriceFile } from '../../../models/price-files'
import { uploadDetail } from '../../../services/price-files/present'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'priceFiles.manage')
  const { id } = paramsWith(event, UploadIdParamsSchema)
  const up = await PriceFile.findByPk(id)
  if (!up) throw notFound('Price file')
  return uploadDetail(up)
})
