import { MAPPING_LABELS, type ColumnMapping, type MappingField } from '#shared/types/price-files'

/** The order a person reads a price file's columns in: what identifies the part, its money, then what describes it. */
const READING_ORDER: readonly MappingField[] = ['sku', 'listPrice', 'tradeCost', 'coreDeposit', 'packQuantity', 'description', 'type']

/**
 * Which column of the file feeds what, as one sentence: "SKU from “Part ref”, list price from “Sell each”, …, stock
 * at NGT from “Qty NGT”." Every column in use is named, stock branch by branch; columns not in use are left out.
 */
export function columnsReadText(mapping: ColumnMapping | null | undefined): string {
  if (!mapping) return ''
  const parts: string[] = []
  for (const field of READING_ORDER) {
    const column = mapping[field]
    if (!column) continue
    const label = field === 'sku' ? MAPPING_LABELS.sku : MAPPING_LABELS[field].toLowerCase()
    parts.push(`${label} from “${column}”`)
  }
  for (const [branch, column] of Object.entries(mapping.stock ?? {})) if (column) parts.push(`stock at ${branch} from “${column}”`)
  return parts.length ? `${parts.join(', ')}.` : ''
}
