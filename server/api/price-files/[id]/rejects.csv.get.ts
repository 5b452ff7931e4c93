/**
 * GET /api/price-files/:id/rejects.csv -> text/csv attachment: every refused row with its row number,
 * the columns at fault and the reason, then the row's cells as read under the file's own headers (so the
 * fixed rows can be uploaded again as they are). Cells are written by csv-stringify with
 * `escape_formulas: true`, so a formula that came in with the file cannot run when the list is opened.
 */
import { stringify } from 'csv-stringify'
import { UploadIdParamsSchema } from '#shared/schemas/price-files'
import { PriceFile } from '../../../models/price-files'
import { F, readFindings } from '../../../services/price-files/findings'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'priceFiles.manage')
  const { id } = paramsWith(event, UploadIdParamsSchema)
  const up = await PriceFile.findByPk(id)
  if (!up) throw notFound('Price file')
  const cellColumns = [up.mapping?.sku, up.mapping?.description, up.mapping?.type, up.mapping?.listPrice, up.mapping?.tradeCost,
    up.mapping?.coreDeposit, up.mapping?.packQuantity, ...Object.values(up.mapping?.stock ?? {})].filter((h): h is string => !!h)
  const csv = stringify({ header: true, columns: ['row', 'problem_columns', 'problem', ...cellColumns], escape_formulas: true, bom: true })
  const base = (up.fileName.replace(/\.[^.]+$/, '').replace(/[^A-Za-z0-9._-]+/g, '-').slice(0, 60) || 'price-file')
  setResponseHeaders(event, {
    'content-type': 'text/csv; charset=utf-8',
    'content-disposition': `attachment; filename="${base}-refused-rows.csv"`,
    'x-content-type-options': 'nosniff',
    'cache-control': 'no-store',
  })
  const refused = await readFindings(id, 'rejected')
  ;(async () => {
    try {
      for (const f of refused) {
        const raw = f[F.raw] ?? {}
        if (!csv.write([f[F.row], f[F.columns] ?? '', f[F.reason] ?? '', ...cellColumns.map((h) => raw[h] ?? (h === up.mapping?.sku ? f[F.sku] ?? '' : ''))])) {
          await new Promise((res) => csv.once('drain', res))
        }
      }
    } finally {
      csv.end()
    }
  })().catch((err) => csv.destroy(err))
  return sendStream(event, csv)
})
