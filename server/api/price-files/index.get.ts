/**
 * GET /api/price-files?page=&pageSize= -> { data: PriceFileSummary[], meta, versions, activeVersion, suppliers }
 * Uploaded price files (newest first), the price-list versions, and supplier names with a saved mapping.
 */
import { ListQuerySchema } from '#shared/schemas/price-files'
import { PriceColumnMapping, PriceFile } from '../../models/price-files'
import { uploadSummaries, versionSummaries } from '../../services/price-files/present'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'priceFiles.manage')
  const { page, pageSize } = queryWith(event, ListQuerySchema)
  const { rows, count } = await PriceFile.findAndCountAll({ order: [['id', 'DESC']], limit: pageSize, offset: (page - 1) * pageSize })
  const versions = await versionSummaries()
  const suppliers = (await PriceColumnMapping.findAll({ attributes: ['supplierName'], order: [['supplierName', 'ASC']] })).map((m) => m.supplierName)
  return {
    data: await uploadSummaries(rows),
    meta: { page, pageSize, total: count, pages: Math.max(1, Math.ceil(count / pageSize)) },
    versions,
    activeVersion: versions.find((v) => v.status === 'active')?.version ?? null,
    suppliers,
  }
})
