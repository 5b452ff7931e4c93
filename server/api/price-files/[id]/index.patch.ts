/**
 * PATCH /api/price-files/:id { mapping?, delimiter?, decimalMark?, supplierName?, rememberMapping? }
 * -> 202 { id, status: "parsing" }
 * Changes how the file is read (which column means what, delimiter, decimal mark) and checks it again.
 * A mapping given with a supplier name is remembered for that supplier unless rememberMapping is false.
 */
import { RecheckSchema, UploadIdParamsSchema, DELIMITER_CHOICES } from '#shared/schemas/price-files'
import { PriceFile } from '../../../models/price-files'
import { enqueueCheck, rememberMapping } from '../../../services/price-files/check'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'priceFiles.manage')
  const { id } = paramsWith(event, UploadIdParamsSchema)
  const body = await bodyWith(event, RecheckSchema)
  const up = await withWrite(async (t) => {
    const up = await PriceFile.findByPk(id, { transaction: t })
    if (!up) throw notFound('Price file')
    if (!['uploaded', 'ready', 'failed'].includes(up.status)) {
      throw conflict(up.status === 'parsing' ? 'This file is being checked right now; wait for the check to finish.' : 'This price file has been applied or scheduled: it can no longer be changed.')
    }
    if (!up.storedName) throw conflict('The file itself is no longer kept: upload it again.')
    const changes: Partial<PriceFile> = { status: 'parsing', stage: 'queued', progress: 0, errorMessage: null }
    if (body.mapping) changes.mapping = body.mapping
    if (body.delimiter && up.fileFormat === 'csv') {
      changes.delimiter = DELIMITER_CHOICES[body.delimiter]
      changes.delimiterChosen = body.delimiter !== 'auto'
    }
    if (body.decimalMark) changes.decimalMark = body.decimalMark === 'comma' ? ',' : '.'
    if (body.supplierName !== undefined) changes.supplierName = body.supplierName
    Object.assign(changes, { countNew: 0, countChanged: 0, countUnchanged: 0, countMissing: 0, countRejected: 0, countLarge: 0, rowsTotal: 0, basePriceVersionId: null })
    await up.update(changes, { transaction: t })
    return up
  })
  if (body.mapping && up.supplierName && body.rememberMapping !== false) {
    await rememberMapping(up.supplierName, body.mapping, up.delimiterChosen ? up.delimiter : null, up.decimalMark, user.id)
  }
  enqueueCheck(up.id)
  setResponseStatus(event, 202)
  return { id: up.id, status: up.status }
})
