/**
 * POST /api/price-files (multipart/form-data: `file` = CSV or XLSX; optional text fields `delimiter`
 * auto|comma|semicolon|tab, `decimalMark` point|comma, `supplierName`, `mapping` (JSON ColumnMapping))
 * -> 202 { id, status: "parsing" }
 * The file type is decided from its bytes; the check then runs in the background (one file at a time:
 * a second upload waits its turn). Follow it with GET /api/price-files/:id. Distributor staff only.
 */
import { randomUUID } from 'node:crypto'
import { mkdir, rename, unlink } from 'node:fs/promises'
import { join } from 'node:path'
import { UploadFieldsSchema, DELIMITER_CHOICES } from '#shared/schemas/price-files'
import { PriceFile } from '../../models/price-files'
import { receivePriceFile } from '../../services/price-files/intake'
import { PriceFileError, inspectZip, sniffPriceFile } from '../../services/price-files/read'
import { enqueueCheck, priceFileTmpDir, priceFilesDir } from '../../services/price-files/check'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'priceFiles.manage')
  const received = await receivePriceFile(event.node.req, priceFileTmpDir())
  const tmp = received.file?.path
  try {
    const fields = parseWith(UploadFieldsSchema, received.fields)
    if (!received.file) throw invalidInput({ file: 'Choose a price file (CSV or XLSX) to upload.' })
    let format: 'csv' | 'xlsx'
    let bom = false
    try {
      const sniff = await sniffPriceFile(received.file.path)
      format = sniff.format
      bom = !!sniff.bom
      if (format === 'xlsx') await inspectZip(received.file.path)
    } catch (err) {
      if (err instanceof PriceFileError) throw invalidInput({ file: err.message }, err.message)
      throw err
    }
    const storedName = `${randomUUID()}.${format}`
    await mkdir(priceFilesDir(), { recursive: true })
    await rename(received.file.path, join(priceFilesDir(), storedName))
    const delimiter = DELIMITER_CHOICES[fields.delimiter]
    const upload = await withWrite((t) => PriceFile.create({
      status: 'parsing',
      stage: 'queued',
      fileName: received.file!.originalName,
      storedName,
      fileSize: received.file!.size,
      fileFormat: format,
      delimiter: format === 'csv' ? delimiter : null,
      delimiterChosen: format === 'csv' && delimiter !== null,
      decimalMark: fields.decimalMark === 'comma' ? ',' : '.',
      encoding: format === 'csv' ? (bom ? 'utf-8 with BOM' : 'utf-8') : null,
      mapping: fields.mapping ?? null,
      supplierName: fields.supplierName,
      createdByUserId: user.id,
    }, { transaction: t }))
    enqueueCheck(upload.id)
    setResponseStatus(event, 202)
    return { id: upload.id, status: upload.status }
  } finally {
    if (tmp) await unlink(tmp).catch(() => {}) // already moved when accepted
  }
})
