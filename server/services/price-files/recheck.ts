/**
 * Changing how a price file is read (which column means what, delimiter, decimal mark, supplier) and checking it
 * again. Only a file that is not in use may change; a mapping given with a supplier name is remembered for that
 * supplier unless the person says not to.
 */
import { withWrite } from '../../utils/db'
import { PriceFile } from '../../models/price-files'
import type { PriceFileStatus } from '../../../shared/types/price-files'
import { DELIMITER_CHOICES, type RecheckInput } from '../../../shared/schemas/price-files'
import { conflict, notFound } from '../errors'
import { rememberMapping } from './supplier-mappings'
import { enqueueCheck } from './queue'

/** Statuses in which a file may be read again (not being checked, applied or scheduled). */
export const RECHECKABLE: readonly PriceFileStatus[] = ['uploaded', 'ready', 'failed']

/** What a new check starts from: the last check's counts no longer describe the file. */
const FRESH_CHECK = {
  status: 'parsing', stage: 'queued', progress: 0, errorMessage: null, basePriceVersionId: null, rowsTotal: 0,
  countNew: 0, countChanged: 0, countUnchanged: 0, countMissing: 0, countRejected: 0, countLarge: 0,
} as const

export async function recheckPriceFile(priceFileId: number, body: RecheckInput, userId: number): Promise<{ id: number; status: PriceFileStatus }> {
  const priceFile = await withWrite(async (t) => {
    const found = await PriceFile.findByPk(priceFileId, { transaction: t })
    if (!found) throw notFound('Price file')
    if (!RECHECKABLE.includes(found.status)) {
      throw conflict(found.status === 'parsing' ? 'This file is being checked right now; wait for the check to finish.' : 'This price file has been applied or scheduled: it can no longer be changed.')
    }
    if (!found.storedName) throw conflict('The file itself is no longer kept: upload it again.')
    const changes: Partial<PriceFile> = { ...FRESH_CHECK }
    if (body.mapping) changes.mapping = body.mapping
    if (body.delimiter && found.fileFormat === 'csv') {
      changes.delimiter = DELIMITER_CHOICES[body.delimiter]
      changes.delimiterChosen = body.delimiter !== 'auto'
    }
    if (body.decimalMark) changes.decimalMark = body.decimalMark === 'comma' ? ',' : '.'
    if (body.supplierName !== undefined) changes.supplierName = body.supplierName
    await found.update(changes, { transaction: t })
    return found
  })
  if (body.mapping && priceFile.supplierName && body.rememberMapping !== false) {
    await rememberMapping(priceFile.supplierName, body.mapping, priceFile.delimiterChosen ? priceFile.delimiter : null, priceFile.decimalMark, userId)
  }
  enqueueCheck(priceFile.id)
  return { id: priceFile.id, status: priceFile.status }
}
