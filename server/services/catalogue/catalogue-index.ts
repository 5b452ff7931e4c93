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
import { readSavedIndex, saveInBackground } from './saved-index'

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

/** More changed parts than this (or than 5 % of the catalogue) and the index is built again rather than patched. */
const MAX_PATCH = 20_000

/** Builds the index from every part in the database, in batches so the rows read never sit in memory all at once. */
async function buildFromDatabase(): Promise<PartSearchIndex> {
  const built = new PartSearchIndex(FITTING_RULES)
  for (let after = 0; ;) {
    const batch = await loadInputs(undefined, after)
    if (!batch.length) break
    built.addBatch(batch)
    after = batch[batch.length - 1]!.id
  }
  built.finish()
  return built
}

/** Parts noted as changed at or after `revision` (see migration 0023), or null when too many to patch. */
async function changedSince(revision: number, parts: number): Promise<number[] | null> {
  const limit = Math.min(MAX_PATCH, Math.max(1000, Math.ceil(parts * 0.05)))
  const rows = await getDb().query<{ id: number }>('SELECT part_id AS id FROM part_search_changes WHERE revision >= :revision LIMIT :limit', { type: QueryTypes.SELECT, replacements: { revision, limit: limit + 1 } })
  return rows.length > limit ? null : rows.map((r) => Number(r.id))
}

/** Re-reads these parts into `target` (drops those that are gone). */
async function patch(target: PartSearchIndex, partIds: number[]): Promise<void> {
  for (let i = 0; i < partIds.length; i += 5000) {
    const ids = partIds.slice(i, i + 5000)
    const inputs = await loadInputs(ids)
    const found = new Set(inputs.map((x) => x.id))
    target.apply(inputs, ids.filter((id) => !found.has(id)))
  }
}

/**
 * The saved index when it fits this database: loaded, then the parts changed since it was saved re-read. Null when
 * there is none, it is of another format or catalogue, or too much changed since.
 */
async function loadSaved(revision: number): Promise<PartSearchIndex | null> {
  const saved = readSavedIndex()
  if (!saved) return null
  const changed = await changedSince(saved.meta.revision, saved.index.size)
  if (!changed) return null
  await patch(saved.index, changed)
  // a load that bypassed the triggers (a bulk script with them off) shows as a count or a highest id that differ
  const [row] = await getDb().query<{ n: number; hi: number | null }>('SELECT COUNT(*) AS n, MAX(id) AS hi FROM parts', { type: QueryTypes.SELECT })
  if (Number(row?.n ?? 0) !== saved.index.size || Number(row?.hi ?? 0) !== saved.index.maxPartId()) return null
  if (changed.length > 1000) saveInBackground(saved.index, revision)
  return saved.index
}

/**
 * The index, loaded from its saved file or built once per process, and brought up to date when the catalogue
 * revision moved without this process knowing (another writer: a price-file import, a script): the parts noted
 * as changed are re-read, or, after a bulk change, the index is built again. Concurrent callers share one load,
 * so a search right after a bulk import waits for it once.
 */
export function getPartIndex(revision?: number): Promise<PartSearchIndex> {
  const stale = index !== null && revision !== undefined && revision !== indexRevision
  if (index && !stale) return Promise.resolve(index)
  building ??= (async () => {
    const t0 = performance.now()
    const rev = (await readRevision()).catalogue // read first: a change during the load makes the next call re-read it
    if (index && indexRevision !== null) {
      const changed = await changedSince(indexRevision, index.size)
      if (changed) {
        await patch(index, changed)
        indexRevision = rev
        return index
      }
    }
    let built = index ? null : await loadSaved(rev).catch((err) => { console.error('[boreline] saved part search index not used:', err?.message ?? err); return null })
    if (!built) {
      built = await buildFromDatabase()
      saveInBackground(built, rev)
    }
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
  await patch(target, partIds)
}

/** Drops the index; the next search rebuilds it (after bulk changes). */
export function resetPartIndex(): void {
  index = null
  indexRevision = null
}
