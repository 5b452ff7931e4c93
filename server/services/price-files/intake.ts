/**
 * Receiving a price file: the one upload intake (upload-intake.ts) streams it to a temporary file, its kind is
 * decided from its bytes (an XLSX's zip directory is looked at before anything is kept), then it is stored under a
 * name the server made and its check is queued. A refused file leaves nothing behind.
 */
import type { IncomingMessage } from 'node:http'
import { randomUUID } from 'node:crypto'
import { mkdir, rename } from 'node:fs/promises'
import { join } from 'node:path'
import { withWrite } from '../../utils/db'
import { PriceFile } from '../../models/price-files'
import { PRICE_FILE_LIMITS, type PriceFileStatus } from '../../../shared/types/price-files'
import { DELIMITER_CHOICES, UploadFieldsSchema } from '../../../shared/schemas/price-files'
import { fieldMessages } from '../../../shared/utils/field-messages'
import { invalidInput } from '../errors'
import { receiveUpload, type UploadSpec } from '../upload-intake'
import { PriceFileError } from './file-rows'
import { proveCsvText, sniffPriceFile } from './file-kind'
import { inspectZip } from './zip-safety'
import { priceFileTmpDir, priceFilesDir } from './storage'
import { enqueueCheck } from './queue'

const MB = 1024 * 1024

function intakeSpec(): UploadSpec {
  return {
    field: 'file',
    tempDir: priceFileTmpDir(),
    maxBytes: PRICE_FILE_LIMITS.maxBytes,
    maxFields: 12,
    maxFieldsBytes: 64 * 1024,
    messages: {
      tooLarge: `The file is larger than ${PRICE_FILE_LIMITS.maxBytes / MB} MB. Split it into smaller files.`,
      notMultipart: 'Send the price file as multipart/form-data, in a field named “file”.',
      oneFileOnly: 'Upload one price file at a time.',
      incomplete: 'The upload could not be read. Try again.',
      wrongField: 'Send the price file in the field named “file”.',
    },
  }
}

/**
 * CSV or XLSX from the bytes; the person sees what else it is (a PDF, an image, a zip bomb, text that is no CSV)
 * beside the file field.
 */
async function fileKind(path: string, fileName: string): Promise<{ format: 'csv' | 'xlsx'; bom: boolean }> {
  try {
    const sniff = await sniffPriceFile(path)
    if (sniff.format === 'xlsx') await inspectZip(path)
    else await proveCsvText(path, fileName)
    return { format: sniff.format, bom: !!sniff.bom }
  } catch (err) {
    if (err instanceof PriceFileError) throw invalidInput({ file: err.message }, err.message)
    throw err
  }
}

/** Receives, stores and queues a price file sent by `userId`; the check runs in the background. */
export async function receivePriceFile(req: IncomingMessage, userId: number): Promise<{ id: number; status: PriceFileStatus }> {
  const received = await receiveUpload(req, intakeSpec())
  try {
    const parsed = UploadFieldsSchema.safeParse(received.fields)
    if (!parsed.success) throw invalidInput(fieldMessages(parsed.error.issues))
    const fields = parsed.data
    const file = received.file
    if (!file) throw invalidInput({ file: 'Choose a price file (CSV or XLSX) to upload.' })
    const { format, bom } = await fileKind(file.path, file.originalName)
    const storedName = `${randomUUID()}.${format}`
    await mkdir(priceFilesDir(), { recursive: true })
    await rename(file.path, join(priceFilesDir(), storedName))
    const delimiter = DELIMITER_CHOICES[fields.delimiter]
    const priceFile = await withWrite((t) => PriceFile.create({
      status: 'parsing',
      stage: 'queued',
      fileName: file.originalName || 'price-file',
      storedName,
      fileSize: file.size,
      fileFormat: format,
      delimiter: format === 'csv' ? delimiter : null,
      delimiterChosen: format === 'csv' && delimiter !== null,
      decimalMark: fields.decimalMark === 'comma' ? ',' : '.',
      encoding: format === 'csv' ? (bom ? 'utf-8 with BOM' : 'utf-8') : null,
      mapping: fields.mapping ?? null,
      supplierName: fields.supplierName,
      createdByUserId: userId,
    }, { transaction: t }))
    enqueueCheck(priceFile.id)
    return { id: priceFile.id, status: priceFile.status }
  } finally {
    await received.cleanup() // the temporary file, unless it was stored (renamed) above
  }
}
