/**
 * Which column of a price file means what. Headers come from the first row; obvious names map themselves,
 * stock columns are `stock_<branch code>` (also `qty_`/`on_hand_`), and a mapping saved for the supplier
 * is reused when its headers are all still there. Plain functions: unit-tested.
 */
import { MAPPING_FIELDS, MAPPING_LABELS, type ColumnMapping, type MappingCheck, type MappingField } from '../../../shared/types/price-files'

/** Header names as shown to people: trimmed, blanks named by position, repeats numbered. */
export function displayHeaders(raw: string[]): string[] {
  const seen = new Map<string, number>()
  return raw.map((h, i) => {
    let name = (h ?? '').replace(/\s+/g, ' ').trim().slice(0, 120) || `(column ${i + 1})`
    const key = name.toLowerCase()
    const n = (seen.get(key) ?? 0) + 1
    seen.set(key, n)
    if (n > 1) name = `${name} (${n})`
    return name
  })
}

/** `List Price (GBP)` -> `list_price_gbp` */
export function headerKey(h: string): string {
  return h.toLowerCase().normalize('NFKD').replace(/[^a-z0-9]+/g, '_').replace(/^_+|_+$/g, '')
}

const ALIASES: Record<MappingField, string[]> = {
  sku: ['sku', 'part_number', 'part_no', 'partno', 'part_num', 'part_code', 'part_ref', 'item', 'item_code', 'item_no', 'item_number',
    'article', 'article_no', 'article_number', 'product_code', 'code', 'ref', 'reference', 'stock_code'],
  description: ['description', 'desc', 'name', 'part_name', 'part_description', 'item_description', 'product_description', 'title'],
  type: ['type', 'part_type', 'category', 'kind', 'product_type', 'item_type'],
  listPrice: ['list_price', 'listprice', 'list', 'retail', 'retail_price', 'price', 'rrp', 'sell_price', 'selling_price', 'unit_price'],
  tradeCost: ['trade_cost', 'trade', 'cost', 'cost_price', 'net_cost', 'buy_price', 'buying_price', 'trade_price', 'unit_cost'],
  coreDeposit: ['core_deposit', 'core', 'deposit', 'core_charge', 'core_value', 'exchange_deposit', 'surrender_charge'],
  packQuantity: ['pack_quantity', 'pack_qty', 'pack', 'pack_size', 'qty_per_pack', 'units_per_pack', 'quantity_per_pack', 'per_pack'],
}

const CURRENCY_SUFFIX = /_(gbp|eur|usd|ex_vat|excl_vat|net)$/

/** Branch code of a stock column (`stock_NGT`, `qty-rvs`, `On hand NGT`), or null. */
export function stockBranchOf(header: string, branchCodes: string[]): string | null {
  const m = /^(?:stock|qty|quantity|on_hand|onhand)_([a-z0-9]+)$/.exec(headerKey(header))
  if (!m) return null
  const code = m[1]!.toUpperCase()
  return branchCodes.find((c) => c.toUpperCase() === code) ?? null
}

export function emptyMapping(): ColumnMapping {
  return { sku: null, description: null, type: null, listPrice: null, tradeCost: null, coreDeposit: null, packQuantity: null, stock: {} }
}

/** Maps obvious headers to fields; each field takes the first header that names it. */
export function autoMapping(headers: string[], branchCodes: string[]): ColumnMapping {
  const mapping = emptyMapping()
  const used = new Set<string>()
  for (const field of MAPPING_FIELDS) {
    for (const h of headers) {
      if (used.has(h)) continue
      const k = headerKey(h)
      if (ALIASES[field].includes(k) || ALIASES[field].includes(k.replace(CURRENCY_SUFFIX, ''))) {
        mapping[field] = h
        used.add(h)
        break
      }
    }
  }
  for (const h of headers) {
    if (used.has(h)) continue
    const code = stockBranchOf(h, branchCodes)
    if (code && !mapping.stock[code]) {
      mapping.stock[code] = h
      used.add(h)
    }
  }
  return mapping
}

/** A saved mapping fits this file when every header it names is present. */
export function savedMappingFits(saved: ColumnMapping, headers: string[]): boolean {
  const names = [...MAPPING_FIELDS.map((f) => saved[f]), ...Object.values(saved.stock ?? {})].filter((h): h is string => !!h)
  return names.length > 0 && names.every((h) => headers.includes(h)) && !!saved.sku
}

/** Blocking problems (keyed by field) and notes about a mapping for these headers. */
export function checkMapping(mapping: ColumnMapping | null, headers: string[], branchCodes: string[]): MappingCheck {
  const problems: MappingCheck['problems'] = {}
  const notes: string[] = []
  if (!mapping) return { problems: { sku: 'No column is chosen for the SKU.' }, notes }
  const uses = new Map<string, string[]>()
  for (const f of MAPPING_FIELDS) {
    const h = mapping[f]
    if (!h) continue
    if (!headers.includes(h)) problems[f] = `The file has no column “${h}”.`
    uses.set(h, [...(uses.get(h) ?? []), MAPPING_LABELS[f]])
  }
  for (const [code, h] of Object.entries(mapping.stock ?? {})) {
    if (!branchCodes.includes(code)) problems.stock = `There is no branch with code ${code}.`
    else if (!headers.includes(h)) problems.stock = `The file has no column “${h}” for stock at ${code}.`
    uses.set(h, [...(uses.get(h) ?? []), `stock at ${code}`])
  }
  for (const [h, fields] of uses) {
    if (fields.length > 1) notes.push(`The column “${h}” feeds ${fields.join(' and ')}.`)
  }
  if (!mapping.sku) problems.sku = 'No column is chosen for the SKU. Choose the column that holds the part numbers.'
  if (!mapping.listPrice) problems.listPrice = 'No column is chosen for the list price.'
  if (!mapping.description || !mapping.type) {
    notes.push('Without a description and a part type column, SKUs that are not in the catalogue yet are refused.')
  }
  if (!mapping.tradeCost) notes.push('No trade cost column: parts keep their current trade cost.')
  if (!mapping.coreDeposit) notes.push('No core deposit column: parts keep their current core deposit (new parts: none).')
  if (!mapping.packQuantity) notes.push('No pack quantity column: parts keep their current pack quantity (new parts: 1).')
  const mapped = new Set(uses.keys())
  for (const h of headers) {
    if (mapped.has(h)) continue
    if (/^(stock|qty|quantity|on_hand|onhand)_/.test(headerKey(h)) && !stockBranchOf(h, branchCodes)) {
      notes.push(`“${h}” looks like a stock column, but no branch has that code: it is ignored.`)
    }
  }
  return { problems, notes }
}

/** Column positions for a mapping (header names -> index in the row). */
export interface ColumnIndex {
  fields: Partial<Record<MappingField, number>>
  stock: [code: string, index: number][]
  width: number
}

export function columnIndex(mapping: ColumnMapping, headers: string[]): ColumnIndex {
  const fields: ColumnIndex['fields'] = {}
  for (const f of MAPPING_FIELDS) {
    const h = mapping[f]
    if (h && headers.includes(h)) fields[f] = headers.indexOf(h)
  }
  const stock: ColumnIndex['stock'] = []
  for (const [code, h] of Object.entries(mapping.stock ?? {})) {
    if (headers.includes(h)) stock.push([code, headers.indexOf(h)])
  }
  return { fields, stock, width: headers.length }
}
