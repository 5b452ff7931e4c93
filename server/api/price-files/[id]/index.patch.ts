/**
 * PATCH /api/price-files/:id { mapping?, delimiter?, decimalMark?, supplierName?, rememberMapping? }
 * -> 202 { id, status: "parsing" }
 * Changes how the file is read (which column means what, delimiter, decimal mark) and checks it again.
 * A mapping given with a supplier name is remembered for that supplier unless rememberMapping is false.
 * Errors: 401, 403, 404, 409 (being checked, applied or scheduled, or the file is no longer kept), 422.
 */
import { PriceFileIdParamsSchema, RecheckSchema } from '#shared/schemas/price-files'
import { recheckPriceFile } from '../../../services/price-files/recheck'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'priceFiles.manage')
  const { id } = paramsWith(event, PriceFileIdParamsSchema)
  const body = await bodyWith(event, RecheckSchema)
  const queued = await recheckPriceFile(id, body, user.id)
  setResponseStatus(event, 202)
  return queued
})
