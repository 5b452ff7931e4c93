/**
 * The one part-search index of this process, built from the database on first use (the server starts building
 * it in the background at start) and kept current by {@link refreshIndexedParts} after every catalogue change.
 * Plain Node.
 */
import { QueryTypes } from 'sequelize'
import { getDb } from '../../utils/db'
import type { PartType } from '../../../shared/schemas/catalogue/part-types'
import { FITTING_RULES } from '../../../shared/utils/catalogue/fitting-rules'
import { PartSearchIndex, type IndexInput } from './search-index'
import { readRevision } from './pricing'

let index: PartSearchIndex | null = null
let building: Promise<PartSearchIndex> | null = null
let builtInMs = 0

interface PartRow { id: number; sku: string; type: PartType; description: string; productLine: string; status: string; specs: string }

const BATCH = 25_000

/** Parts with their OE numbers and the old SKUs they replace; `ids` limits it to those parts. */
async function loadInputs(ids?: number[], afterId = 0, limit = BATCH): Promise<IndexInput[]> {
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

let indexRevision: number | null = null

/**
 * The index, built once per process and rebuilt when the catalogue revision moved without this process knowing
 * (another writer: a price-file import, a script). Concurrent callers share one build, so a search right after
 * a bulk import waits for the rebuild once.
 */
export function getPartIndex(revision?: number): Promise<PartSearchIndex> {
  const stale = index !== null && revision !== undefined && revision !== indexRevision
  if (index && !stale) return Promise.resolve(index)
  building ??= (async () => {
    const t0 = performance.now()
    const rev = (await readRevision()).catalogue // read first: a change during the load makes the next call rebuild
    const built = new PartSearchIndex(FITTING_RULES)
    // in batches, so the rows read never sit in memory all at once
    for (let after = 0; ;) {
      const batch = await loadInputs(undefined, after)
      if (!batch.length) break
      built.addBatch(batch)
      after = batch[batch.length - 1]!.id
    }
    built.finish()
    index = built
    indexRevision = rev
    builtInMs = performance.now() - t0
    return built
  })().finally(() => { building = null })
  return building
}

/** After this process changed the catalogue itself (and refreshed the parts it touched): from -> to is known. */
export function advanceIndexRevision(from: number, to: number): void {
  if (index && indexRevision === from) indexRevision = to
}

export function partIndexStats(): { ready: boolean; parts: number; builtInMs: number } {
  return { ready: !!index, parts: index?.size ?? 0, builtInMs: Math.round(builtInMs) }
}

/** Re-reads these parts from the database into the index (removes those that are gone). */
export async function refreshIndexedParts(partIds: number[]): Promise<void> {
  // a rebuild under way may have read these rows before the change, and replaces the index when it ends: wait for
  // it, then update the index it leaves (updating the old one would be lost)
  if (building) await building.catch(() => {})
  const target = index // dropped or rebuilt while the rows are read: the next search reads the database anyway
  if (!target || !partIds.length) return
  const inputs = await loadInputs(partIds)
  const found = new Set(inputs.map((i) => i.id))
  for (const id of partIds) if (!found.has(id)) target.remove(id)
  for (const input of inputs) target.upsert(input)
}

/** Drops the index; the next search rebuilds it (after bulk changes). */
export function resetPartIndex(): void {
  index = null
  indexRevision = null
}
