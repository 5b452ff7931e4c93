/**
 * Where the part-search index is saved between starts, and how. On SQLite the file sits beside the database
 * (`<database>.search-index`); on PostgreSQL, where each server process holds its own index, in the machine's
 * temporary directory under a name made from the database's host and name, so the processes of one machine load
 * the same file. `BORELINE_SEARCH_INDEX_FILE` names another path, or `0` to neither save nor load one.
 *
 * A saved file is used only when it was written by code that indexes parts the same way (a fingerprint of the
 * functions that make the index's contents) and, by catalogue:  the revision it was saved at, its part count and
 * highest part id, checked by the loader (catalogue-index.ts). Plain Node.
 */
import { createHash } from 'node:crypto'
import os from 'node:os'
import { join } from 'node:path'
import { FITTING_RULES } from '../../../shared/utils/catalogue/fitting-rules'
import { axleOfSpecs } from '../../../shared/schemas/catalogue/specs'
import { databaseUrl, dialectOfUrl, storageFromUrl } from '../../utils/db'
import { decodeImage, encodeImage, readImageFile, writeImageFile } from './index-image'
import { attributesOf, dimensionsOf, fittingKey } from './part-columns'
import { COMMON_DF, PartSearchIndex } from './search-index'
import { indexTerms } from './search-plan'

export interface SavedMeta { fingerprint: string; revision: number; parts: number; maxPartId: number; savedAt: string }

/** The saved file's path, or null when none is kept (an in-memory database, or turned off). */
export function savedIndexPath(): string | null {
  const set = process.env.BORELINE_SEARCH_INDEX_FILE
  if (set === '0') return null
  if (set) return set
  const url = databaseUrl()
  if (dialectOfUrl(url) === 'sqlite') {
    const file = storageFromUrl(url)
    return file === ':memory:' ? null : `${file}.search-index`
  }
  const u = new URL(url)
  const name = createHash('sha256').update(`${u.hostname}:${u.port}${u.pathname}`).digest('hex').slice(0, 16)
  return join(os.tmpdir(), `boreline-search-index-${name}`)
}

let fingerprint: string | null = null
/** Changes whenever the code that decides what the index holds changes (a saved index from other code is rebuilt). */
function indexFingerprint(): string {
  const ix = PartSearchIndex.prototype as unknown as Record<string, unknown>
  fingerprint ??= createHash('sha256').update([
    String(ix.place), String(ix.identifierEntries), String(ix.finish), String(ix.msText), String(ix.toSections),
    String(indexTerms), String(attributesOf), String(dimensionsOf), String(fittingKey), String(axleOfSpecs),
    JSON.stringify(FITTING_RULES), String(COMMON_DF),
  ].join('\n')).digest('hex').slice(0, 24)
  return fingerprint
}

/** The saved index and what it was saved from, or null when there is none that this code can use. */
export function readSavedIndex(): { index: PartSearchIndex; meta: SavedMeta } | null {
  const path = savedIndexPath()
  const buf = path ? readImageFile(path) : null
  if (!buf) return null
  const image = decodeImage<SavedMeta>(buf)
  if (!image || image.meta.fingerprint !== indexFingerprint()) return null
  const index = PartSearchIndex.fromSections(image.sections, FITTING_RULES)
  return index.size === image.meta.parts ? { index, meta: image.meta } : null
}

/** Saves the index as of `revision` (written whole or not at all). */
export function saveIndex(index: PartSearchIndex, revision: number, path = savedIndexPath()): void {
  if (!path) return
  const meta: SavedMeta = { fingerprint: indexFingerprint(), revision, parts: index.size, maxPartId: index.maxPartId(), savedAt: new Date().toISOString() }
  writeImageFile(path, encodeImage(meta, index.toSections()))
}

/** Saves once the current request work is done; a failure is logged, never thrown (the next start builds again). */
export function saveInBackground(index: PartSearchIndex, revision: number): void {
  if (!savedIndexPath()) return
  setTimeout(() => {
    try { saveIndex(index, revision) } catch (err) { console.error('[boreline] part search index not saved:', (err as Error)?.message ?? err) }
  }, 50).unref?.()
}
