/**
 * Photos of a faulty part, added to the garage's own return while the counter has not decided it: one JPEG, PNG
 * or WebP per request through the one upload intake (multipart only, at most 8 MB, temporary files removed on
 * every path), checked by its bytes, kept under a name the server made; at most four per return. Served only to
 * the garage that sent them and to distributor staff. Plain Node.
 */
import { resolve } from 'node:path'
import type { IncomingMessage } from 'node:http'
import { readFile, rm } from 'node:fs/promises'
import { fileTypeFromFile } from 'file-type'
import { PartReturnPhoto } from '../../models/counter'
import { withWrite } from '../../utils/db'
import { RETURN_PHOTO_FIELD, RETURN_PHOTO_MAX_BYTES, RETURN_PHOTOS_MAX } from '../../../shared/schemas/returns'
import type { ReturnView } from '../../../shared/types/returns'
import { conflict, notFound } from '../errors'
import { cleanFileName } from '../proof-store'
import { moveIntoStore, newStoredName, storedPath, type FileStore } from '../stored-files'
import { receiveUpload, uploadRefusal } from '../upload-intake'
import { findVisibleReturn, returnView } from './views'

const PHOTOS: FileStore = { folder: 'return-photos', extensions: ['jpg', 'png', 'webp'] }
const TYPES: Record<string, string> = { 'image/jpeg': 'jpg', 'image/png': 'png', 'image/webp': 'webp' }
const TOO_BIG = `The photo is larger than ${RETURN_PHOTO_MAX_BYTES / 1024 / 1024} MB. Please send a smaller one.`

export async function addReturnPhoto(organisationId: number, returnId: number, req: IncomingMessage, uploadsDir: string): Promise<ReturnView> {
  const r = await findVisibleReturn(returnId, organisationId)
  if (r.status !== 'requested') throw conflict('The counter has decided this return: photos can no longer be added.')
  const upload = await receiveUpload(req, {
    field: RETURN_PHOTO_FIELD, tempDir: resolve(uploadsDir, '.incoming'), maxBytes: RETURN_PHOTO_MAX_BYTES, formField: RETURN_PHOTO_FIELD,
    messages: {
      tooLarge: TOO_BIG, notMultipart: 'Send the photo as multipart/form-data (a form with a file).',
      oneFileOnly: 'Add one photo at a time.', incomplete: 'The photo arrived incomplete. Please send it again.',
    },
  })
  let stored: string | null = null
  try {
    const f = upload.file
    if (!f) throw uploadRefusal(422, RETURN_PHOTO_FIELD, 'Choose a photo of the part.')
    if (f.size === 0) throw uploadRefusal(415, RETURN_PHOTO_FIELD, 'The photo is empty. Please choose it again.')
    const detected = await fileTypeFromFile(f.path)
    const ext = detected ? TYPES[detected.mime] : undefined
    if (!detected || !ext) throw uploadRefusal(415, RETURN_PHOTO_FIELD, 'The photo must be a JPEG, PNG or WebP image.')
    const storedName = newStoredName(ext)
    stored = await moveIntoStore(f.path, uploadsDir, PHOTOS, storedName)
    await withWrite(async (t) => {
      const count = await PartReturnPhoto.count({ where: { returnId }, transaction: t })
      if (count >= RETURN_PHOTOS_MAX) throw uploadRefusal(422, RETURN_PHOTO_FIELD, `At most ${RETURN_PHOTOS_MAX} photos per return.`)
      await PartReturnPhoto.create({ returnId, storedName, originalName: cleanFileName(f.originalName), mime: detected.mime, sizeBytes: f.size }, { transaction: t })
    })
    stored = null
  } finally {
    if (stored) await rm(stored, { force: true })
    await upload.cleanup()
  }
  return returnView(await findVisibleReturn(returnId, organisationId))
}

/** A photo of a return the caller may see (404 otherwise), read for sending. */
export async function readReturnPhoto(returnId: number, photoId: number, organisationId: number | null, uploadsDir: string): Promise<{ bytes: Buffer; mime: string; name: string }> {
  await findVisibleReturn(returnId, organisationId)
  const photo = await PartReturnPhoto.findOne({ where: { id: photoId, returnId } })
  if (!photo) throw notFound('Photo')
  return { bytes: await readFile(storedPath(uploadsDir, PHOTOS, photo.storedName)), mime: photo.mime, name: photo.originalName }
}
