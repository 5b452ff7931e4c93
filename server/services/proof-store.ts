/**
 * Where proof-of-trade documents live: `<uploads>/proofs/<32 hex>.<pdf|jpg|png>`, names made by the server.
 * Plain Node (no Nitro, no HTTP) so the seed can use it too.
 */
import { createReadStream } from 'node:fs'
import { moveIntoStore as moveIntoStoreOf, newStoredName, storeDir, storedPath, type FileStore } from './stored-files'

/** Printable, short, without path parts: shown to staff and offered as the download name. */
export function cleanFileName(name: string): string {
  const base = name.split(/[\\/]/).pop() ?? ''
  // eslint-disable-next-line no-control-regex
  const printable = base.replace(/[\u0000-\u001f\u007f"<>|]/g, '').trim()
  return printable.slice(-200) || 'document'
}

const PROOFS: FileStore = { folder: 'proofs', extensions: ['pdf', 'jpg', 'png'] }

export function proofsDir(uploadsDir: string): string {
  return storeDir(uploadsDir, PROOFS)
}

/** The stored document's path, refusing anything that is not one of our own names. */
export function proofPath(uploadsDir: string, storedName: string): string {
  return storedPath(uploadsDir, PROOFS, storedName)
}

export { newStoredName }

/** Moves the checked temporary file to its stored place. */
export function moveIntoStore(tempPath: string, uploadsDir: string, storedName: string): Promise<string> {
  return moveIntoStoreOf(tempPath, uploadsDir, PROOFS, storedName)
}

export function openProof(uploadsDir: string, storedName: string) {
  return createReadStream(proofPath(uploadsDir, storedName))
}
