/**
 * GET /api/price-files?page=&pageSize= -> PriceFileList: { data: PriceFileSummary[], meta, versions, activeVersion, suppliers }
 * Price files (newest first), the latest price versions, and supplier names with a remembered mapping.
 * Errors: 401, 403, 422 (page or pageSize out of range).
 */
import { PageQuerySchema } from '#shared/schemas/page'
import { priceFilesPage } from '../../services/price-files/present'
import { warmSnapshotIfCold } from '../../services/price-files/snapshot'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'priceFiles.manage')
  warmSnapshotIfCold() // a file is likely to follow: its check then finds the compared catalogue built
  return priceFilesPage(queryWith(event, PageQuerySchema))
})
