/**
 * Where the part-search index is saved between starts, and how. On SQLite the file sits beside the database
 * (`<database>.search-index`); on PostgreSQL, where each server process holds its own index, in the machine's
 * temporary directory under a name made from the database's host and name, so the processes of one machine load
 * the same file. `BORELINE_SEARCH_INDEX_FILE` names another path, or `0` to neither save nor load one.
 *
 * A saved file is used only when it was written by code that indexes parts the same way ({@link indexFingerprint})
 * and fits the catalogue: the revision it was saved at, its part count and highest part id are checked by the
 * loader (catalogue-index.ts). Plain Node.
 */
import { createHash } from 'node:crypto'
import os from 'node:os'
import { join } from 'node:path'
import { FITTING_RULES } from '../../../shared/utils/catalogue/fitting-rules'
import { databaseUrl, dialectOfUrl, storageFromUrl } from '../../utils/db'
import { encodeImage, openImageFile, writeImageFile } from './index-image'
import { COMMON_DF, PartSearchIndex, type IndexInput } from './search-index'

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

/** Bump when the file's sections change meaning in a way the sample parts below would not show. */
const INDEX_FORMAT = 1

/** Sample parts of several types with OE numbers, a superseded SKU and specs that every column reads. */
const SAMPLES: IndexInput[] = [
  { id: 1, sku: 'SA-D-1', type: 'disc', productLine: 'Sample Standard', status: 'active', oeNumbers: ['SMP 615 301 C'], replaces: [{ oldSku: 'SA-OLD-1', note: 'Replaced.' }], description: 'Front brake disc 300 × 25 mm vented, for Sample Model', specs: { axle: 'front', diameterMm: 300, thicknessMm: 25, minThicknessMm: 23, heightMm: 40, centreBoreMm: 57.1, boltHoles: 5, pcdMm: 112, vented: true } },
  { id: 2, sku: 'SA-P-2', type: 'pad_set', productLine: 'Sample Ceramic', status: 'discontinued', oeNumbers: [], replaces: [], description: 'Rear pad set 100 × 45 × 16.5 mm low dust, for Sample Model', specs: { axle: 'rear', padShape: 'PS-1', widthMm: 100, heightMm: 45, thicknessMm: 16.5, wearSensor: 'none', frictionCode: 'FF' } },
  { id: 3, sku: 'SA-C-3', type: 'caliper', productLine: 'Sample Reman', status: 'active', oeNumbers: ['SMP-54-3'], replaces: [], description: 'Front caliper reman twin piston', specs: { axle: 'front', side: 'left', pistonDiametersMm: [38, 42], condition: 'remanufactured', parkingBrake: 'electric', coreDepositApplies: true } },
  { id: 4, sku: 'SA-M-4', type: 'master_cylinder', productLine: 'Sample New', status: 'active', oeNumbers: [], replaces: [], description: 'Master cylinder tandem 22.22 mm bore', specs: { boreMm: 22.22, tandem: true, ports: 2, reservoir: 'integrated', condition: 'new', coreDepositApplies: false } },
  { id: 5, sku: 'SA-H-5', type: 'hose', productLine: 'Sample Standard', status: 'active', oeNumbers: [], replaces: [], description: 'Brake hose 420 mm', specs: { axle: 'front', lengthMm: 420 } },
]

let fingerprint: string | null = null
/**
 * Changes whenever the code that decides what the index holds does: a hash of the sections the code makes of the
 * sample parts (and the format number), so a file saved by other code, or by another build of the same code that
 * indexes differently, is not used. The server's bundle and the worker's, built apart, agree on it.
 */
export function indexFingerprint(): string {
  if (fingerprint) return fingerprint
  const sample = new PartSearchIndex(FITTING_RULES)
  sample.addAll(SAMPLES)
  const h = createHash('sha256').update(`${INDEX_FORMAT}|${COMMON_DF}`)
  for (const b of encodeImage({}, sample.sections())) h.update(b)
  fingerprint = h.digest('hex').slice(0, 24)
  return fingerprint
}

/** The saved index and what it was saved from, or null when there is none that this code can use. */
export async function readSavedIndex(): Promise<{ index: PartSearchIndex; meta: SavedMeta } | null> {
  const path = savedIndexPath()
  // read section by section (the header first: a file of other code is not read further)
  const image = path ? await openImageFile<SavedMeta>(path) : null
  if (!image) return null
  try {
    if (image.meta.fingerprint !== indexFingerprint()) return null
    const index = await PartSearchIndex.fromSections(image.sections, FITTING_RULES)
    return index.size === image.meta.parts ? { index, meta: image.meta } : null
  } finally { await image.close() }
}

/**
 * Saves the index as of `revision` (written whole or not at all), one section at a time. With `consume` the index
 * lets go of each piece as it is written and is empty after: for a process that only builds it to save it.
 */
export function saveIndex(index: PartSearchIndex, revision: number, path = savedIndexPath(), consume = false): void {
  if (!path) return
  const meta: SavedMeta = { fingerprint: indexFingerprint(), revision, parts: index.size, maxPartId: index.maxPartId(), savedAt: new Date().toISOString() }
  writeImageFile(path, meta, index.sections(consume))
}

/** Saves once the current request work is done; a failure is logged, never thrown (the next start builds again). */
export function saveInBackground(index: PartSearchIndex, revision: number): void {
  if (!savedIndexPath()) return
  setTimeout(() => {
    try { saveIndex(index, revision) } catch (err) { console.error('[boreline] part search index not saved:', (err as Error)?.message ?? err) }
  }, 50).unref?.()
}
