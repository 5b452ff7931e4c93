/**
 * The cells of refused rows as the file wrote them, for the refused-rows list and its CSV: most refusals carry
 * them from the reading thread; the few found while comparing are read again from the file, or, should that read
 * fail, written back from the values as they were understood.
 */
import { setImmediate as yieldToLoop } from 'node:timers/promises'
import type { ColumnMapping } from '../../../shared/types/price-files'
import type { RowSource } from './file-rows'
import { rawCells } from './row-batches'
import { F, type PriceCheckFinding } from './findings'

/** Fills in `raw` of these refusals from the rows of `source` (read again), or from their values. */
export async function fillRefusedCells(refusals: PriceCheckFinding[], source: () => RowSource, mapping: ColumnMapping, headers: string[], decimal: '.' | ','): Promise<void> {
  if (!refusals.length) return
  const cells = await cellsOfRows(source(), new Set(refusals.map((f) => f[F.row]!)), mapping, headers)
    .catch(() => new Map<number, Record<string, string>>())
  for (const f of refusals) f[F.raw] = cells.get(f[F.row]!) ?? rawFromFinding(mapping, f, decimal)
}

/** The cells of a row that was found valid, written back as the file had them (for the refused-rows list). */
function rawFromFinding(mapping: ColumnMapping, f: PriceCheckFinding, decimal: '.' | ','): Record<string, string> {
  const amount = (m: number | null) => (m == null ? '' : (m / 100).toFixed(2).replace('.', decimal))
  const raw: Record<string, string> = {}
  const put = (h: string | null | undefined, v: string) => { if (h) raw[h] = v }
  put(mapping.sku, f[F.sku] ?? '')
  put(mapping.description, f[F.description] ?? '')
  put(mapping.type, f[F.type] ?? '')
  put(mapping.listPrice, amount(f[F.newList]))
  put(mapping.tradeCost, amount(f[F.newTrade]))
  put(mapping.coreDeposit, amount(f[F.newCore]))
  put(mapping.packQuantity, f[F.newPack] == null ? '' : String(f[F.newPack]))
  const stock = f[F.stock] ?? {}
  for (const [code, h] of Object.entries(mapping.stock)) put(h, stock[code] == null ? '' : String(stock[code]))
  return raw
}

/** The mapped cells of the given rows, read again from the file (for the few refusals found while comparing). */
async function cellsOfRows(source: RowSource, wanted: Set<number>, mapping: ColumnMapping, headers: string[]): Promise<Map<number, Record<string, string>>> {
  const out = new Map<number, Record<string, string>>()
  try {
    for await (const rows of source.rows) {
      for (const r of rows) if (wanted.has(r.rowNumber)) out.set(r.rowNumber, rawCells(mapping, r.cells, headers))
      if (out.size === wanted.size) break
      await yieldToLoop()
    }
  } finally {
    await source.rows.return(undefined)
  }
  return out
}
