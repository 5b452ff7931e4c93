/**
 * GET /api/price-files/:id -> PriceFileDetail: status, progress while checking, counts, detected headers,
 * the column mapping with its problems, and what may be done next (apply, roll back, check again).
 * Errors: 401, 403, 404.
 */
import { PriceFileIdParamsSchema } from '#shared/schemas/price-files'
import { findPriceFile, priceFileDetail } from '../../../services/price-files/present'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'priceFiles.manage')
  const { id } = paramsWith(event, PriceFileIdParamsSchema)
  return priceFileDetail(await findPriceFile(id))
})
