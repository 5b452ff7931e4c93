/**
 * Where price files live on disk: `<uploads>/price-files/<uuid>.<csv|xlsx>` once received, and the temporary
 * folder beside them that the intake streams into (same disk, so storing is a rename). A stored name is ours,
 * never the client's, and is checked before it becomes a path.
 */
import { join } from 'node:path'

let uploadsRoot = './uploads'

/** Set once at start from runtimeConfig.uploadsDir. */
export function setUploadsRoot(dir: string): void { uploadsRoot = dir }

export function priceFilesDir(): string { return join(uploadsRoot, 'price-files') }

export function priceFileTmpDir(): string { return join(uploadsRoot, 'price-files', 'incoming') }

export function storedPath(storedName: string): string {
  if (!/^[a-z0-9-]+\.(csv|xlsx)$/.test(storedName)) throw new Error('bad stored name')
  return join(priceFilesDir(), storedName)
}
