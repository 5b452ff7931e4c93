/**
 * The one part-search index of this process, loaded at start (the server starts it in the background) and kept
 * current by {@link refreshIndexedParts} after every catalogue change. Loaded from the file saved beside the
 * database (saved-index.ts) when one fits, the parts changed since it was saved re-read; else built by a worker
 * thread that saves it (index-worker.ts), then loaded from that file; else, without the worker bundle, built here
 * and saved. Plain Node.
 */
import { once } from 'node:events'
import { existsSync } from 'node:fs'
import { dirname, join } from 'node:path'
import { Worker } from 'node:worker_threads'
import { QueryTypes } from 'sequelize'
import { databaseUrl, getDb } from '../../utils/db'
import { buildFromDatabase, loadInputs } from './index-source'
import type { IndexJob, IndexWorkerMessage } from './index-worker'
import type { PartSearchIndex } from './search-index'
import { readRevision } from './pricing'
import { readSavedIndex, saveInBackground, savedIndexPath } from './saved-index'

let index: PartSearchIndex | null = null
let building: Promise<PartSearchIndex> | null = null
let builtInMs = 0

let indexRevision: number | null = null

/**
 * More changed parts than this (or than 5 % of the catalogue) and the index is built again rather than patched. A
 * price file's apply that makes more new parts than this notes only this many and one more (versions.ts).
 */
export const MAX_PATCH = 20_000

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

export const INDEX_WORKER_FILE = 'part-index-worker.cjs'

/** The worker bundle beside the running server's entry (`nuxi build`), or null (dev, unit tests, turned off). */
function indexWorkerPath(): string | null {
  if (process.env.BORELINE_SEARCH_INDEX_WORKER === '0' || !process.argv[1]) return null
  const file = join(dirname(process.argv[1]), INDEX_WORKER_FILE)
  return existsSync(file) ? file : null
}

/** Builds and saves the index in the worker thread; false when there is no worker or no file to save to. */
async function buildInWorker(): Promise<boolean> {
  const file = indexWorkerPath(), path = savedIndexPath()
  if (!file || !path) return false
  const worker = new Worker(file, { workerData: { databaseUrl: databaseUrl(), path } satisfies IndexJob })
  const ended = once(worker, 'exit')
  // the worker answers once its database connection is closed, and then ends by itself: not terminated, which
  // could tear it down while the sqlite3 driver still has work in flight
  const m = await Promise.race([once(worker, 'message').then(([x]) => x as IndexWorkerMessage), ended.then(() => null)])
  await ended
  if (!m) throw new Error('the part index worker ended without an answer')
  if (m.type === 'failed') throw new Error(m.message)
  return true
}

/**
 * The saved index when it fits this database: loaded, then the parts changed since it was saved re-read. Null when
 * there is none, it is of another format or catalogue, or too much changed since. `fresh`: the file was just
 * written by the worker from every part, so the count of parts needs no check (that scan maps up to 256 MB of the
 * database into this process, at start-up's highest memory).
 */
async function loadSaved(revision: number, fresh = false): Promise<PartSearchIndex | null> {
  const saved = await readSavedIndex()
  if (!saved) return null
  const changed = await changedSince(saved.meta.revision, saved.index.size)
  if (!changed) return null
  await patch(saved.index, changed)
  if (fresh) return saved.index
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
    const fromFile = (fresh = false) => loadSaved(rev, fresh).catch((err) => { console.error('[boreline] saved part search index not used:', err?.message ?? err); return null })
    let built = index ? null : await fromFile()
    // none that fits: built by the worker thread, which saves it, then loaded from its file; else in this thread
    if (!built && await buildInWorker().catch((err) => { console.error('[boreline] part search index worker:', err?.message ?? err); return false })) built = await fromFile(true)
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
