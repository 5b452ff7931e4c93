/**
 * Where proof-of-trade documents live: `<uploads>/proofs/<32 hex>.<pdf|jpg|png>`, names made by the server.
 * Plain Node (no Nitro, no HTTP) so the seed can use it too.
 */
import { randomBytes } from 'node:crypto'
import { createReadStream } from 'node:fs'
import { copyFile, mkdir, rename, unlink } from 'node:fs/promises'
import { resolve, sep } from 'node:path'

/** Printable, short, without path parts: shown to staff and offered as the download name. */
export function cleanFileName(name: string): string {
  const base = name.split(/[\\/]/).pop() ?? ''
  // eslint-disable-next-line no-control-regex
  const printable = base.replace(/[\u0000-\u001f\u007f"<>|]/g, '').trim()
  return printable.slice(-200) || 'document'
}

export function proofsDir(uploadsDir: string): string {
  return resolve(uploadsDir, 'proofs')
}

/** The stored document's path, refusing anything that is not one of our own names. */
export function proofPath(uploadsDir: string, storedName: string): string {
  if (!/^[a-f0-9]{32}\.(pdf|jpg|png)$/.test(storedName)) throw new Error('not a stored proof name')
  const dir = proofsDir(uploadsDir)
  const p = resolve(dir, storedName)
  if (!p.startsWith(dir + sep)) throw new Error('outside the proofs folder')
  return p
}

export function newStoredName(ext: string): string {
  return `${randomBytes(16).toString('hex')}.${ext}`
}

/** Moves the checked temporary file to its stored place (copy when the temp folder is another disk). */
export async function moveIntoStore(tempPath: string, uploadsDir: string, storedName: string): Promise<string> {
  await mkdir(proofsDir(uploadsDir), { recursive: true })
  const target = proofPath(uploadsDir, storedName)
  try {
    await rename(tempPath, target)
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code !== 'EXDEV') throw err
    await copyFile(tempPath, target)
    await unlink(tempPath)
  }
  return target
}

export function openProof(uploadsDir: string, storedName: string) {
  return createReadStream(proofPath(uploadsDir, storedName))
}
