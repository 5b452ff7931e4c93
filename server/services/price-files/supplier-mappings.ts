/**
 * Column mappings remembered per supplier (one per supplier name, case-insensitive), so the next file from the same
 * supplier is read the same way without asking.
 */
import { withWrite } from '../../utils/db'
import { PriceColumnMapping } from '../../models/price-files'
import type { ColumnMapping } from '../../../shared/types/price-files'

const supplierKey = (supplierName: string) => supplierName.trim().toLowerCase()

export async function savedMappingFor(supplierName: string): Promise<PriceColumnMapping | null> {
  const key = supplierKey(supplierName)
  if (!key) return null
  return PriceColumnMapping.findOne({ where: { supplierKey: key } })
}

/** Remembers a supplier's column mapping for their next file. */
export async function rememberMapping(supplierName: string, mapping: ColumnMapping, delimiter: string | null, decimal: '.' | ',', userId: number): Promise<void> {
  const key = supplierKey(supplierName)
  if (!key) return
  await withWrite(async (t) => {
    const existing = await PriceColumnMapping.findOne({ where: { supplierKey: key }, transaction: t })
    const values = { supplierName: supplierName.trim(), mapping, delimiter, decimalMark: decimal, updatedByUserId: userId }
    if (existing) await existing.update(values, { transaction: t })
    else await PriceColumnMapping.create({ supplierKey: key, ...values }, { transaction: t })
  })
}

/** Supplier names with a remembered mapping, for the upload form's suggestions. */
export async function supplierNames(): Promise<string[]> {
  return (await PriceColumnMapping.findAll({ attributes: ['supplierName'], order: [['supplierName', 'ASC']] })).map((m) => m.supplierName)
}
