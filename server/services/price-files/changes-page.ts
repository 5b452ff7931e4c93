/**
 * One page of one kind of a check's findings, filtered and sorted on the server (the preview's tables): the findings
 * of that kind are read whole (a small cache keeps the last few, findings.ts), then filtered, sorted and cut.
 */
import { QueryTypes } from 'sequelize'
import { getDb } from '../../utils/db'
import { likeAnyCase } from '../../utils/sql'
import { pageOfList } from '../../utils/page'
import type { ChangeSort, ChangesQuery } from '../../../shared/schemas/price-files'
import type { PriceChangeRow } from '../../../shared/types/price-files'
import type { Page } from '../../../shared/types/page'
import { F, readFindings, type PriceCheckFinding } from './findings'

type Indexed = { f: PriceCheckFinding; i: number }

const SORTS: Record<ChangeSort, (a: PriceCheckFinding, b: PriceCheckFinding) => number> = {
  row: (a, b) => nullsLast(a[F.row], b[F.row]) || text(a[F.sku], b[F.sku]),
  sku: (a, b) => text(a[F.sku], b[F.sku]),
  change: (a, b) => nullsLast(a[F.pct], b[F.pct]),
  old: (a, b) => nullsLast(a[F.oldList], b[F.oldList]),
  new: (a, b) => nullsLast(a[F.newList], b[F.newList]),
}
function nullsLast(a: number | null, b: number | null): number {
  if (a === b) return 0
  if (a === null) return Number.POSITIVE_INFINITY
  if (b === null) return Number.NEGATIVE_INFINITY
  return a - b
}
function text(a: string | null, b: string | null): number {
  return (a ?? '') < (b ?? '') ? -1 : (a ?? '') > (b ?? '') ? 1 : 0
}

/** Findings whose SKU or description holds `needle`, or whose catalogue part's description does. */
async function matching(rows: Indexed[], needle: string): Promise<Indexed[]> {
  const lower = needle.toLowerCase()
  const like = `%${needle.replace(/[\\%_]/g, (c) => `\\${c}`)}%`
  const byDescription = new Set((await getDb().query<{ id: number }>(
    `SELECT id FROM parts WHERE description ${likeAnyCase()} $1 ESCAPE '\\'`, { bind: [like], type: QueryTypes.SELECT },
  )).map((r) => r.id))
  return rows.filter(({ f }) => (f[F.sku] ?? '').toLowerCase().includes(lower) || (f[F.description] ?? '').toLowerCase().includes(lower)
    || (f[F.partId] != null && byDescription.has(f[F.partId]!)))
}

/** Descriptions and types of catalogue parts (the file may leave them blank). */
async function partsOf(rows: Indexed[]): Promise<Map<number, { description: string; type: string }>> {
  const ids = [...new Set(rows.map(({ f }) => f[F.partId]).filter((x): x is number => x != null))]
  if (!ids.length) return new Map()
  const parts = await getDb().query<{ id: number; description: string; type: string }>(
    'SELECT id, description, type FROM parts WHERE id IN (:ids)', { replacements: { ids }, type: QueryTypes.SELECT },
  )
  return new Map(parts.map((p) => [p.id, p]))
}

/** One page of one kind of findings, filtered and sorted as asked (nulls last either way; ties by SKU, then file order). */
export async function changesPage(priceFileId: number, q: ChangesQuery): Promise<Page<PriceChangeRow>> {
  const all = await readFindings(priceFileId, q.kind)
  let rows: Indexed[] = all.map((f, i) => ({ f, i }))
  if (q.q) rows = await matching(rows, q.q)
  if (q.large) rows = rows.filter(({ f }) => f[F.large] === 1)
  if (q.direction === 'up') rows = rows.filter(({ f }) => f[F.newList] != null && f[F.oldList] != null && f[F.newList]! > f[F.oldList]!)
  if (q.direction === 'down') rows = rows.filter(({ f }) => f[F.newList] != null && f[F.oldList] != null && f[F.newList]! < f[F.oldList]!)
  const by = SORTS[q.sort]
  const sign = q.dir === 'desc' ? -1 : 1
  rows.sort((a, b) => {
    const primary = by(a.f, b.f)
    if (primary !== 0) {
      // nulls stay last whichever way the rest is ordered
      if (!Number.isFinite(primary)) return primary > 0 ? 1 : -1
      return sign * primary
    }
    return text(a.f[F.sku], b.f[F.sku]) || a.i - b.i
  })
  const page = pageOfList(q, rows)
  const parts = await partsOf(page.data)
  const data: PriceChangeRow[] = page.data.map(({ f, i }) => {
    const part = f[F.partId] != null ? parts.get(f[F.partId]!) : undefined
    return {
      id: i + 1, kind: q.kind, rowNumber: f[F.row], sku: f[F.sku],
      description: f[F.description] ?? part?.description ?? null, partType: f[F.type] ?? part?.type ?? null,
      oldListMinor: f[F.oldList], newListMinor: f[F.newList], oldTradeMinor: f[F.oldTrade], newTradeMinor: f[F.newTrade],
      oldCoreMinor: f[F.oldCore], newCoreMinor: f[F.newCore], oldPack: f[F.oldPack], newPack: f[F.newPack],
      changePct: f[F.pct], large: f[F.large] === 1, stock: f[F.stock], columns: f[F.columns], reason: f[F.reason],
    }
  })
  return { data, meta: page.meta }
}
