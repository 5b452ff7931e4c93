/**
 * GET /api/price-files/:id/rejects.csv -> text/csv attachment `<file name>-refused-rows.csv`: every refused row
 * with its row number, the columns at fault and the reason, then the row's cells as read under the file's own
 * headers (so the fixed rows can be uploaded again as they are); formulas are neutralised.
 * Errors: 401, 403, 404.
 */
import { PriceFileIdParamsSchema } from '#shared/schemas/price-files'
import { findPriceFile } from '../../../services/price-files/present'
import { refusedRowsCsv } from '../../../services/price-files/refused-csv'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'priceFiles.manage')
  const { id } = paramsWith(event, PriceFileIdParamsSchema)
  const { name, csv } = await refusedRowsCsv(await findPriceFile(id))
  return sendDownload(event, csv, { name, type: 'text/csv; charset=utf-8' })
})
