/**
 * Keeping cached catalogue answers current. Two ways in:
 * - every catalogue request passes the revisions it read ({@link noteRevision}); when they moved (any writer,
 *   via the triggers of migration 0004) the cached vehicle lists and facets are dropped and the search index is
 *   rebuilt on its next use;
 * - this process's own edits run through {@link catalogueWrite}, which refreshes just the parts touched in the
 *   search index (no rebuild) and drops the cached lists at once.
 * Plain Node.
 */
import type { Transaction } from 'sequelize'
import { withWrite } from '../../utils/db'
import { advanceIndexRevision, refreshIndexedParts, resetPartIndex } from './catalogue-index'
import { readRevision, type CatalogueRevision } from './pricing'
import { clearVehiclePartsCache } from './vehicle-parts'
import { invalidateVehicleList } from './vehicles'

let known: CatalogueRevision | null = null

/** Drops cached lists when the database's revisions differ from the last ones seen. */
export function noteRevision(rev: CatalogueRevision): void {
  if (!known || rev.catalogue !== known.catalogue) {
    clearVehiclePartsCache()
    invalidateVehicleList()
  } else if (rev.stock !== known.stock) {
    clearVehiclePartsCache()
  }
  known = rev
}

/** For other domains that change parts in bulk and want the index rebuilt now rather than on the next search. */
export async function catalogueChanged(change: { partIds?: number[]; revision?: { from: number; to: number } } = {}): Promise<void> {
  clearVehiclePartsCache()
  invalidateVehicleList()
  if (change.partIds) {
    await refreshIndexedParts(change.partIds)
    if (change.revision) advanceIndexRevision(change.revision.from, change.revision.to)
  } else resetPartIndex()
}

/** Runs a catalogue change in one write transaction, then brings the caches and the index up to date. */
export async function catalogueWrite<T>(fn: (t: Transaction) => Promise<{ result: T; partIds: number[] }>): Promise<T> {
  let from = 0, to = 0
  const out = await withWrite(async (t) => {
    from = (await readRevision(t)).catalogue
    const r = await fn(t)
    to = (await readRevision(t)).catalogue
    return r
  })
  await catalogueChanged({ partIds: out.partIds, revision: { from, to } })
  return out.result
}
