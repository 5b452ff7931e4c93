/**
 * Photos of an inspection's findings: received through the one upload intake (multipart, one file field `photo`,
 * with the wheel and what it shows), recognised from the bytes (file-type: JPEG or PNG only), stripped of any
 * metadata left in it (image-metadata.ts), stored as `<uploads>/inspection-photos/<32 hex>.<jpg|png>`. Read only by
 * the garage that took them and through the owner's link of a quote drafted from that inspection. Plain Node.
 */
import { readFile, rm, writeFile } from 'node:fs/promises'
import type { IncomingMessage } from 'node:http'
import type { Transaction } from 'sequelize'
import { join } from 'node:path'
import { fileTypeFromFile } from 'file-type'
import { Inspection, InspectionPhoto } from '../models/inspections'
import type { User } from '../models/accounts'
import { withWrite } from '../utils/db'
import { audit } from '../utils/audit'
import { moveIntoStore, newStoredName, storedPath, type FileStore } from './stored-files'
import { receiveUpload, uploadRefusal, type ReceivedUpload, type UploadSpec } from './upload-intake'
import { stripImageMetadata } from './image-metadata'
import { conflict, invalidInput, notFound } from './errors'
import { fieldMessages } from '../../shared/utils/field-messages'
import {
  InspectionPhotoFieldsSchema, PHOTO_LIMITS, type InspectionPhotoView, type PhotoPosition, type PhotoSubject,
} from '../../shared/schemas/inspections'
import { plainFinding } from '../../shared/utils/quote-wording'

export const PHOTO_FIELD = 'photo'
const PHOTOS: FileStore = { folder: 'inspection-photos', extensions: ['jpg', 'png'] }
const EXT = { 'image/jpeg': 'jpg', 'image/png': 'png' } as const
const TOO_LARGE = `The photo must be smaller than ${PHOTO_LIMITS.maxBytes / 1024 / 1024} MB.`

const photoRefusal = (status: 413 | 415 | 422, message: string) => uploadRefusal(status, PHOTO_FIELD, message)

/** The garage's view of a photo. */
export function photoView(row: InspectionPhoto): InspectionPhotoView {
  return {
    id: row.id, position: row.position as PhotoPosition, subject: row.subject as PhotoSubject, caption: row.caption ?? '',
    bytes: row.bytes, createdAt: new Date(row.createdAt).toISOString(), url: `/api/inspections/${row.inspectionId}/photos/${row.id}`,
  }
}

/** The photos of one inspection, oldest first. */
export async function photosOf(inspectionId: number): Promise<InspectionPhotoView[]> {
  const rows = await InspectionPhoto.findAll({ where: { inspectionId }, order: [['id', 'ASC']] })
  return rows.map(photoView)
}

/** Checks the uploaded file by its bytes and returns it without metadata. */
async function checkedImage(file: ReceivedUpload['file']): Promise<{ data: Buffer; mime: 'image/jpeg' | 'image/png' }> {
  if (!file) throw photoRefusal(422, 'Take or choose a photo.')
  if (file.size === 0) throw photoRefusal(415, 'The file is empty. Take the photo again.')
  if (file.size > PHOTO_LIMITS.maxBytes) throw photoRefusal(413, TOO_LARGE)
  const detected = await fileTypeFromFile(file.path)
  if (!detected || (detected.mime !== 'image/jpeg' && detected.mime !== 'image/png')) {
    throw photoRefusal(415, `A photo must be a JPEG or PNG image${detected ? ` (this file is ${detected.ext.toUpperCase()})` : ''}.`)
  }
  const data = stripImageMetadata(await readFile(file.path), detected.mime)
  if (!data) throw photoRefusal(415, 'The photo could not be read. Take it again.')
  return { data, mime: detected.mime }
}

/** The intake's limits and messages for a photo: a phone's camera file and a few short fields beside it. */
const photoIntake = (uploadsDir: string): UploadSpec => ({
  field: PHOTO_FIELD, tempDir: join(uploadsDir, '.incoming'), maxBytes: PHOTO_LIMITS.maxBytes, maxFields: 6, maxFieldsBytes: 4 * 1024,
  messages: {
    tooLarge: TOO_LARGE, notMultipart: 'Send the photo as multipart/form-data.', oneFileOnly: 'Send one photo at a time.',
    incomplete: 'The photo arrived incomplete. Please try again.',
  },
})

/**
 * Receives, checks and stores a photo of one of the garage's inspections. The inspection is loaded by the route
 * first (404 when it is not this garage's). On every path the temporary file is gone; nothing is stored when the
 * photo is refused, and a failed write removes the stored file again.
 */
export async function addInspectionPhoto(inspection: Inspection, author: User, req: IncomingMessage, uploadsDir: string): Promise<InspectionPhotoView> {
  let upload: ReceivedUpload | undefined
  try {
    upload = await receiveUpload(req, photoIntake(uploadsDir))
    const fields = InspectionPhotoFieldsSchema.safeParse(upload.fields)
    if (!fields.success) throw invalidInput(fieldMessages(fields.error.issues))
    const image = await checkedImage(upload.file)
    const count = await InspectionPhoto.count({ where: { inspectionId: inspection.id } })
    if (count >= PHOTO_LIMITS.perInspection) throw conflict(`An inspection keeps at most ${PHOTO_LIMITS.perInspection} photos: remove one first.`, undefined, { [PHOTO_FIELD]: 'Too many photos on this inspection.' })
    const storedName = newStoredName(EXT[image.mime])
    await writeFile(upload.file!.path, image.data)
    const target = await moveIntoStore(upload.file!.path, uploadsDir, PHOTOS, storedName)
    try {
      const row = await withWrite(async (t) => {
        const created = await InspectionPhoto.create({
          inspectionId: inspection.id, organisationId: inspection.organisationId, authorUserId: author.id,
          position: fields.data.position, subject: fields.data.subject, caption: fields.data.caption,
          storedName, mime: image.mime, bytes: image.data.length,
        }, { transaction: t })
        await audit(t, {
          actorUserId: author.id, organisationId: inspection.organisationId, action: 'inspection.photo.add', entity: 'inspection', entityId: inspection.id,
          changes: { photoId: created.id, position: created.position, subject: created.subject },
        })
        return created
      })
      return photoView(row)
    } catch (err) {
      await rm(target, { force: true })
      throw err
    }
  } finally {
    await upload?.cleanup()
  }
}

/** One of the garage's photos of one of its inspections (404 otherwise). */
async function ownPhoto(organisationId: number, inspectionId: number, photoId: number): Promise<InspectionPhoto> {
  const row = await InspectionPhoto.findOne({ where: { id: photoId, inspectionId, organisationId } })
  if (!row) throw notFound('Photo')
  return row
}

/** The bytes of a photo and its type. */
async function photoFile(uploadsDir: string, row: InspectionPhoto): Promise<{ data: Buffer; mime: string }> {
  try {
    return { data: await readFile(storedPath(uploadsDir, PHOTOS, row.storedName)), mime: row.mime }
  } catch {
    throw notFound('Photo')
  }
}

/** A garage's own photo for the garage's screens. */
export async function readInspectionPhoto(organisationId: number, inspectionId: number, photoId: number, uploadsDir: string) {
  return photoFile(uploadsDir, await ownPhoto(organisationId, inspectionId, photoId))
}

/** A photo of the inspection a quote was drafted from, for the owner's link (404 for any other photo). */
export async function readQuotePhoto(quote: { organisationId: number; inspectionId: number | null }, photoId: number, uploadsDir: string) {
  if (quote.inspectionId === null) throw notFound('Photo')
  return photoFile(uploadsDir, await ownPhoto(quote.organisationId, quote.inspectionId, photoId))
}

/** Removes a photo (the row, then the file). Audited. */
export async function removeInspectionPhoto(organisationId: number, author: User, inspectionId: number, photoId: number, uploadsDir: string): Promise<void> {
  const row = await ownPhoto(organisationId, inspectionId, photoId)
  await withWrite(async (t) => {
    await row.destroy({ transaction: t })
    await audit(t, { actorUserId: author.id, organisationId, action: 'inspection.photo.remove', entity: 'inspection', entityId: inspectionId, changes: { photoId } })
  })
  await rm(storedPath(uploadsDir, PHOTOS, row.storedName), { force: true })
}

/** Headers that keep a photo what it is: its own type, never sniffed, inert if opened on its own. */
export function photoHeaders(mime: string, cache: string): Record<string, string> {
  return {
    'content-type': mime,
    'x-content-type-options': 'nosniff',
    'content-security-policy': "default-src 'none'; sandbox",
    'content-disposition': 'inline; filename="photo"',
    'cache-control': cache,
  }
}

/** The garage's inspection (404 when it is not this garage's). */
export async function ownInspection(organisationId: number, id: number): Promise<Inspection> {
  const row = await Inspection.findOne({ where: { id, organisationId } })
  if (!row) throw notFound('Inspection')
  return row
}

/** A photo beside a line on the owner's page: where on the car, and the technician's caption. */
export interface LinePhoto { id: number; where: string; caption: string }

const WHERE: Record<string, string> = { 'front-left': 'Front left', 'front-right': 'Front right', 'rear-left': 'Rear left', 'rear-right': 'Rear right', system: 'Brake system' }

/**
 * The photos that explain each line of a quote drafted from an inspection: a line's reason is made of the plain
 * findings of the items it answers (quotes/inspection-lines.ts), and a photo belongs to the items of its wheel and
 * subject. Lines without such a photo are left out of the map.
 */
export async function photosForLines(
  quote: { organisationId: number; inspectionId: number | null },
  lines: readonly { id: number; reason: string | null }[],
  transaction?: Transaction,
): Promise<Map<number, LinePhoto[]>> {
  const out = new Map<number, LinePhoto[]>()
  if (quote.inspectionId === null || !lines.some((l) => l.reason)) return out
  const [inspection, photos] = await Promise.all([
    Inspection.findOne({ where: { id: quote.inspectionId, organisationId: quote.organisationId }, attributes: ['id', 'result'], transaction }),
    InspectionPhoto.findAll({ where: { inspectionId: quote.inspectionId, organisationId: quote.organisationId }, order: [['id', 'ASC']], transaction }),
  ])
  if (!inspection || photos.length === 0) return out
  const items = (inspection.result?.items ?? []).filter((i) => i.verdict !== 'ok')
  for (const line of lines) {
    if (!line.reason) continue
    const explained = items.filter((i) => line.reason!.includes(plainFinding(i)))
    // an item of one wheel takes that wheel's photos; an axle's (or the system's) takes those of its wheels too
    const shows = (i: (typeof items)[number], p: InspectionPhoto) => i.subject === p.subject
      && ((i.position ?? 'system') === p.position || (i.position === null && i.axle !== null && p.position.startsWith(i.axle)))
    const mine = photos.filter((p) => explained.some((i) => shows(i, p)))
    if (mine.length) out.set(line.id, mine.map((p) => ({ id: p.id, where: WHERE[p.position] ?? p.position, caption: p.caption ?? '' })))
  }
  return out
}
