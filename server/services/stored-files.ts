/**
 * Files kept under the uploads folder, one sub-folder per kind (`proofs`, `logos`), always under names the
 * server made (32 hex characters and an allowed extension), so a stored name can never point elsewhere.
 * Plain Node (no Nitro, no HTTP) so the seed can use it too.
 */
import { randomBytes } from 'node:crypto'
import { copyFile, mkdir, rename, unlink } from 'node:fs/promises'
import { resolve, sep } from 'node:path'

export interface FileStore {
  /** sub-folder of the uploads folder */
  folder: string
  /** extensions a stored name may have */
  extensions: readonly string[]
}

export function storeDir(uploadsDir: string, store: FileStore): string {
  return resolve(uploadsDir, store.folder)
}

/** The stored file's path, refusing anything that is not one of our own names. */
export function storedPath(uploadsDir: string, store: FileStore, storedName: string): string {
  const m = /^[a-f0-9]{32}\.([a-z0-9]+)$/.exec(storedName)
  if (!m || !store.extensions.includes(m[1]!)) throw new Error(`not a stored ${store.folder} name`)
  const dir = storeDir(uploadsDir, store)
  const p = resolve(dir, storedName)
  if (!p.startsWith(dir + sep)) throw new Error(`outside the ${store.folder} folder`)
  return p
}

/** A new random stored name with this extension. */
export function newStoredName(ext: string): string {
  return `${randomBytes(16).toString('hex')}.${ext}`
}

/** Moves a checked temporary file to its stored place (copy when the temp folder is another disk). */
export async function moveIntoStore(tempPath: string, uploadsDir: string, store: FileStore, storedName: string): Promise<string> {
  await mkdir(storeDir(uploadsDir, store), { recursive: true })
  const target = storedPath(uploadsDir, store, storedName)
  try {
    await rename(tempPath, target)
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code !== 'EXDEV') throw err
    await copyFile(tempPath, target)
    await unlink(tempPath)
  }
  return target
}
