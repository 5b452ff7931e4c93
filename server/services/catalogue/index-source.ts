/**
 * Part search: reading the parts the index holds from the database (with their OE numbers and the old SKUs they
 * replace) and building the index from all of them. Used by the server thread and by the index worker, so it
 * imports nothing but the database and the index. Plain Node.
 */
import { QueryTypes } from 'sequelize'
import { getDb } from '../../utils/db'
import type { PartType } from '../../../shared/schemas/catalogue/part-types'
import { FITTING_RULES } from '../../../shared/utils/catalogue/fitting-rules'
import { PartSearchIndex, type IndexInput } from './search-index'

interface PartRow { id: number; sku: string; type: PartType; description: string; productLine: string; status: string; specs: string }

export const BATCH = 25_000

/** Parts with their OE numbers and the old SKUs they replace; `ids` limits it to those parts. */
export async function loadInputs(ids?: number[], afterId = 0, limit = BATCH): Promise<IndexInput[]> {
  const db = getDb()
  const parts = ids
    ? await db.query<PartRow>('SELECT id, sku, type, description, product_line AS productLine, status, specs FROM parts WHERE id IN (:ids)', { type: QueryTypes.SELECT, replacements: { ids } })
    : await db.query<PartRow>('SELECT id, sku, type, description, product_line AS productLine, status, specs FROM parts WHERE id > :afterId ORDER BY id LIMIT :limit', { type: QueryTypes.SELECT, replacements: { afterId, limit } })
  if (!parts.length) return []
  const lo = parts[0]!.id, hi = parts[parts.length - 1]!.id
  const scope = ids ? 'IN (:ids)' : 'BETWEEN :lo AND :hi'
  const replacements = { ids: parts.map((p) => p.id), lo, hi }
  const oe = await db.query<{ partId: number; oe: string }>(`SELECT part_id AS partId, oe_normalised AS oe FROM part_oe_numbers WHERE part_id ${scope}`, { type: QueryTypes.SELECT, replacements })
  const sup = await db.query<{ partId: number; oldSku: string; note: string }>(`SELECT new_part_id AS partId, old_sku AS oldSku, note FROM supersessions WHERE new_part_id ${scope}`, { type: QueryTypes.SELECT, replacements })
  const oeBy = new Map<number, string[]>()
  for (const o of oe) { const a = oeBy.get(o.partId); if (a) a.push(o.oe); else oeBy.set(o.partId, [o.oe]) }
  const supBy = new Map<number, { oldSku: string; note: string }[]>()
  for (const x of sup) { const a = supBy.get(x.partId); const v = { oldSku: x.oldSku, note: x.note }; if (a) a.push(v); else supBy.set(x.partId, [v]) }
  return parts.map((p) => ({
    id: p.id, sku: p.sku, type: p.type, description: p.description, productLine: p.productLine, status: p.status,
    specs: safeJson(p.specs), oeNumbers: oeBy.get(p.id) ?? [], replaces: supBy.get(p.id) ?? [],
  }))
}

function safeJson(s: string): Record<string, unknown> {
  try { return JSON.parse(s) as Record<string, unknown> } catch { return {} }
}

/**
 * Builds the index from every part in the database, in batches so the rows read never sit in memory all at once.
 * `textLater`: the text indexes are left for the save to fill one part type at a time (see `PartSearchIndex.finish`).
 */
export async function buildFromDatabase({ textLater = false } = {}): Promise<PartSearchIndex> {
  const built = new PartSearchIndex(FITTING_RULES)
  for (let after = 0; ;) {
    const batch = await loadInputs(undefined, after)
    if (!batch.length) break
    built.addBatch(batch)
    after = batch[batch.length - 1]!.id
  }
  built.finish(textLater)
  return built
}

/** The catalogue revision now (the triggers of migration 0004 move it on every change). */
export async function catalogueRevision(): Promise<number> {
  const [row] = await getDb().query<{ catalogue: number }>('SELECT catalogue FROM catalogue_revisions WHERE id = 1', { type: QueryTypes.SELECT })
  return Number(row?.catalogue ?? 0)
}
