/**
 * The refused rows of a check as a CSV file: each row's number, the columns at fault and the reason, then its cells
 * as read under the file's own headers, so the fixed rows can be uploaded again as they are. Cells are written by
 * the one CSV writer (csv-export.ts: formulas and leading separators neutralised), so a formula that came in with the
 * file cannot run when the list is opened in a spreadsheet.
 */
import type { PriceFile } from '../../models/price-files'
import { safeCsv } from '../csv-export'
import { F, readFindings } from './findings'

export async function refusedRowsCsv(priceFile: PriceFile): Promise<{ name: string; csv: string }> {
  const m = priceFile.mapping
  const cellColumns = [m?.sku, m?.description, m?.type, m?.listPrice, m?.tradeCost, m?.coreDeposit, m?.packQuantity, ...Object.values(m?.stock ?? {})]
    .filter((h): h is string => !!h)
  const refused = await readFindings(priceFile.id, 'rejected')
  const rows = refused.map((f) => {
    const raw = f[F.raw] ?? {}
    return [f[F.row], f[F.columns] ?? '', f[F.reason] ?? '', ...cellColumns.map((h) => raw[h] ?? (h === m?.sku ? f[F.sku] ?? '' : ''))]
  })
  const csv = safeCsv(rows, { header: true, columns: ['row', 'problem_columns', 'problem', ...cellColumns], bom: true })
  const base = priceFile.fileName.replace(/\.[^.]+$/, '').replace(/[^A-Za-z0-9._-]+/g, '-').slice(0, 60) || 'price-file'
  return { name: `${base}-refused-rows.csv`, csv }
}
