/**
 * One row of a price file: validated by its zod schemas (SKU well-formed, prices positive with at most two decimals,
 * pack quantity a positive integer, stock a whole number, no formulas; each cell first by a plain test with the same
 * verdict), then compared with the part's
 * current price (new, changed, unchanged, or refused when a new SKU lacks a type or description).
 * Plain functions: unit-tested without a database.
 */
import { z } from 'zod'
import { parseMoneyToMinor } from '../../../shared/utils/money'
import { LARGE_CHANGE_PERCENT, MAPPING_LABELS, PRICE_FILE_PART_TYPE_NAMES, PRICE_FILE_PART_TYPES, type ColumnMapping, type MappingField } from '../../../shared/types/price-files'
import { headerKey, type ColumnIndex } from './mapping'

export const SKU_PATTERN = /^[A-Za-z0-9][A-Za-z0-9._/-]{1,39}$/

/** A cell a spreadsheet would run as a formula (OWASP "CSV injection": = + - @ tab CR). */
function formulaLike(v: string, textColumn: boolean): boolean {
  if (/^[=+@\t\r]/.test(v)) return true
  return textColumn && /^-[^\d\s]/.test(v)
}
const FORMULA_MESSAGE = 'looks like a spreadsheet formula. Formulas are not accepted: enter the value itself.'

// ------------------------------------------------------------------------------------------------ the schema
//
// The zod schema decides, with patterns only: a zod transform per cell costs about ten times more, and a
// file has up to 200,000 rows × 9 cells. Values are converted after a row passed; the detailed reason for a
// refused cell (decimal mark, currency sign, formula, …) is worked out only for cells that failed.

const MONEY = { '.': String.raw`\d{1,12}(?:\.\d{1,2})?`, ',': String.raw`\d{1,12}(?:,\d{1,2})?` }
const NOT_ZERO = String.raw`(?!0+(?:[.,]0*)?$)`
const moneyPattern = (decimal: '.' | ',', opts: { required: boolean; allowZero: boolean }) =>
  new RegExp(`^${opts.required ? '' : '(?:$|'}${opts.allowZero ? '' : NOT_ZERO}${MONEY[decimal]}${opts.required ? '' : ')'}$`)
const TEXT_OK = /^(?![=+@\t\r]|-[^\d\s])/
const PACK = /^(?:|[1-9]\d{0,4}|100000)$/
const STOCK = /^(?:|\d{1,7}|10000000)$/

interface CellRule { label: string; explain: (v: string) => string }

function explainMoney(label: string, v: string, decimal: '.' | ',', opts: { required: boolean; allowZero: boolean }): string {
  const other = decimal === '.' ? ',' : '.'
  if (v === '') return `${label} is missing.`
  if (formulaLike(v, false)) return `${label} “${v.slice(0, 40)}” ${FORMULA_MESSAGE}`
  const minor = parseMoneyToMinor(v, decimal)
  if (minor !== null) {
    if (minor < 0) return `${label} must be positive (got “${v}”).`
    if (minor === 0 && !opts.allowZero) return `${label} must be more than zero.`
  }
  if (/^-/.test(v)) return `${label} must be positive (got “${v}”).`
  if (/^[£$€]|[£$€]$|\b(GBP|EUR|USD)\b/i.test(v)) return `${label} “${v}”: leave out the currency; give the amount only, e.g. 12${decimal}50.`
  if (/^\d+[.,]\d{3,}$/.test(v) && v.includes(decimal)) return `${label} “${v}” has more than two decimals.`
  if (parseMoneyToMinor(v, other) !== null && v.includes(other)) {
    return `${label} “${v}” uses a decimal ${other === ',' ? 'comma' : 'point'}, but this file is read with a decimal ${decimal === ',' ? 'comma' : 'point'}. Choose the other decimal mark and check again.`
  }
  return `${label} “${v.slice(0, 40)}” is not an amount: give a number with at most two decimals, e.g. 12${decimal}50.`
}

function explainWhole(label: string, v: string, min: number, max: number): string {
  if (formulaLike(v, false)) return `${label} “${v.slice(0, 40)}” ${FORMULA_MESSAGE}`
  return `${label} must be a whole number from ${min} to ${max.toLocaleString('en-GB')} (got “${v.slice(0, 20)}”).`
}

function explainText(label: string, v: string, max: number): string {
  if (formulaLike(v, true)) return `${label} “${v.slice(0, 40)}” ${FORMULA_MESSAGE}`
  return `${label} is longer than ${max} characters.`
}

function explainSku(v: string): string {
  if (v === '') return 'SKU is missing.'
  if (formulaLike(v, true)) return `SKU “${v.slice(0, 40)}” ${FORMULA_MESSAGE}`
  return `SKU “${v.slice(0, 40)}” is not well-formed: use 2 to 40 letters, digits and . _ / - (starting with a letter or digit).`
}

const TYPE_BY_KEY = new Map<string, string>(PRICE_FILE_PART_TYPES.map((t) => [t, t]))
/** "Pad set" / "PAD-SET" -> pad_set; a file repeats a handful of spellings, so they are remembered. */
const typeSpellings = new Map<string, string>()
function typeOf(raw: string): string {
  let t = typeSpellings.get(raw)
  if (t === undefined) {
    t = TYPE_BY_KEY.get(headerKey(raw)) ?? raw
    if (typeSpellings.size < 1000) typeSpellings.set(raw, t)
  }
  return t
}
const MULTI_SPACE = /\s\s|[\t\n\r\f\v]/
function explainType(v: string): string {
  if (formulaLike(v, true)) return `Part type “${v.slice(0, 40)}” ${FORMULA_MESSAGE}`
  return `Part type “${v.slice(0, 40)}” is not one of: ${PRICE_FILE_PART_TYPE_NAMES}.`
}

/** `pattern.test` as a function (a pattern without the g or y flag keeps no state between calls). */
function patternTest(pattern: RegExp): (v: string) => boolean {
  return (v) => pattern.test(v)
}

/** The values a valid row gives; `undefined` = not in the file or blank (the part keeps its current value). */
export interface RowValues {
  sku: string
  description?: string
  type?: string
  listMinor: number
  tradeMinor?: number
  coreMinor?: number
  pack?: number
  stock: Record<string, number> | null
}

export interface RowIssue { column: string; reason: string }

export type RowResult = { ok: true; values: RowValues } | { ok: false; sku: string | null; issues: RowIssue[]; raw: Record<string, string> }

export interface RowValidator {
  validate(cells: string[]): RowResult
}

/** Builds the zod schema for one file (its mapping and decimal mark) once, then validates each row with it. */
export function rowValidator(mapping: ColumnMapping, index: ColumnIndex, decimal: '.' | ','): RowValidator {
  const f = index.fields
  const listOpts = { required: true, allowZero: false }
  const tradeOpts = { required: false, allowZero: false }
  const coreOpts = { required: false, allowZero: true }
  const shape: Record<string, z.ZodType> = {
    sku: z.string().regex(SKU_PATTERN),
    listPrice: z.string().regex(moneyPattern(decimal, listOpts)),
  }
  // The same decisions as the zod schemas, as plain tests of the cell's text: what every row's cells go through
  // (zod's safeParse builds a result and walks its checks on each call; reading and packing a file of 200,000 new
  // parts in one thread took 385-450 ms with it, 320-350 ms with these). A row that fails is looked at again by the
  // zod schemas, which give its issues; tests/unit/price-files/rows.test.ts holds the two to the same verdicts.
  const tests: Record<string, (v: string) => boolean> = {
    sku: patternTest(SKU_PATTERN),
    listPrice: patternTest(moneyPattern(decimal, listOpts)),
  }
  const rules: Record<string, CellRule> = {
    sku: { label: 'SKU', explain: explainSku },
    listPrice: { label: MAPPING_LABELS.listPrice, explain: (v) => explainMoney(MAPPING_LABELS.listPrice, v, decimal, listOpts) },
    description: { label: 'Description', explain: (v) => explainText('Description', v, 300) },
    type: { label: 'Part type', explain: explainType },
    tradeCost: { label: MAPPING_LABELS.tradeCost, explain: (v) => explainMoney(MAPPING_LABELS.tradeCost, v, decimal, tradeOpts) },
    coreDeposit: { label: MAPPING_LABELS.coreDeposit, explain: (v) => explainMoney(MAPPING_LABELS.coreDeposit, v, decimal, coreOpts) },
    packQuantity: { label: 'Pack quantity', explain: (v) => explainWhole('Pack quantity', v, 1, 100_000) },
  }
  const types = new Set<string>(['', ...PRICE_FILE_PART_TYPES])
  if (f.description !== undefined) {
    shape.description = z.string().max(300).regex(TEXT_OK)
    // zod's max() counts a surrogate pair (an emoji) as one character once the text is longer in UTF-16 units
    tests.description = (v) => (v.length <= 300 || [...v].length <= 300) && TEXT_OK.test(v)
  }
  if (f.type !== undefined) {
    shape.type = z.enum(['', ...PRICE_FILE_PART_TYPES])
    tests.type = (v) => types.has(v)
  }
  if (f.tradeCost !== undefined) {
    shape.tradeCost = z.string().regex(moneyPattern(decimal, tradeOpts))
    tests.tradeCost = patternTest(moneyPattern(decimal, tradeOpts))
  }
  if (f.coreDeposit !== undefined) {
    shape.coreDeposit = z.string().regex(moneyPattern(decimal, coreOpts))
    tests.coreDeposit = patternTest(moneyPattern(decimal, coreOpts))
  }
  if (f.packQuantity !== undefined) {
    shape.packQuantity = z.string().regex(PACK)
    tests.packQuantity = patternTest(PACK)
  }
  for (const [code] of index.stock) {
    shape[`stock_${code}`] = z.string().regex(STOCK)
    tests[`stock_${code}`] = patternTest(STOCK)
    rules[`stock_${code}`] = { label: `Stock at ${code}`, explain: (v) => explainWhole(`Stock at ${code}`, v, 0, 10_000_000) }
  }
  // the cells this file maps, in one fixed order: the schema is a tuple over them (no object per row)
  const keys: string[] = ['sku', 'listPrice', ...Object.keys(shape).filter((k) => k !== 'sku' && k !== 'listPrice')]
  const cols: number[] = keys.map((k) => (k.startsWith('stock_') ? index.stock.find(([c]) => `stock_${c}` === k)![1] : f[k as MappingField] ?? -1))
  // Each cell is checked by its column's test (`tests`, the zod schema's decision); its zod schema runs only for a
  // row that failed. (The verdicts were remembered per column while each check was a zod call; a pattern test or a
  // set lookup costs about what a Map lookup of the text does, so nothing is remembered now.)
  const schemas = keys.map((k) => shape[k]!)
  const checks = keys.map((k) => tests[k]!)
  const at = (k: string) => keys.indexOf(k)
  const iDesc = at('description'), iType = at('type'), iTrade = at('tradeCost'), iCore = at('coreDeposit'), iPack = at('packQuantity')
  const stockAt = index.stock.map(([code]) => [code, at(`stock_${code}`)] as const)
  const n = keys.length

  const headerOf = (key: string): string => {
    if (key.startsWith('stock_')) return mapping.stock[key.slice(6)] ?? key
    return mapping[key as MappingField] ?? key
  }
  // the pattern has already proven the text is digits (at most 12), then perhaps the decimal mark and at most two
  // digits: read digit by digit (whole numbers below 2^53 throughout, so exact), no slices or Number() per cell
  const mark = decimal.charCodeAt(0)
  const minorOf = (v: string): number => {
    let whole = 0, i = 0
    for (; i < v.length; i++) {
      const c = v.charCodeAt(i)
      if (c === mark) break
      whole = whole * 10 + (c - 48)
    }
    const f1 = i + 1 < v.length ? v.charCodeAt(i + 1) - 48 : 0
    const f2 = i + 2 < v.length ? v.charCodeAt(i + 2) - 48 : 0
    return whole * 100 + f1 * 10 + f2
  }

  return {
    validate(cells: string[]): RowResult {
      const vals: string[] = new Array(n)
      for (let j = 0; j < n; j++) {
        const c = cols[j]!
        vals[j] = c < 0 ? '' : (cells[c] ?? '').trim()
      }
      const rawType = iType >= 0 ? vals[iType]! : ''
      if (rawType) vals[iType] = typeOf(rawType)
      if (iDesc >= 0) {
        const d = vals[iDesc]!
        if (d && MULTI_SPACE.test(d)) vals[iDesc] = d.replace(/\s+/g, ' ')
      }
      let valid = true
      for (let j = 0; j < n; j++) if (!checks[j]!(vals[j]!)) { valid = false; break }
      const extra = cells.length > index.width && cells.slice(index.width).some((c) => c.trim() !== '')
      if (valid && !extra) {
        let stock: Record<string, number> | null = null
        for (const [code, j] of stockAt) {
          const q = vals[j]!
          if (q) (stock ??= {})[code] = Number(q)
        }
        const opt = (j: number) => (j >= 0 && vals[j] ? vals[j] : undefined)
        const trade = opt(iTrade)
        const core = opt(iCore)
        const pack = opt(iPack)
        return {
          ok: true,
          values: {
            sku: vals[0]!.toUpperCase(),
            description: opt(iDesc),
            type: opt(iType),
            listMinor: minorOf(vals[1]!),
            tradeMinor: trade === undefined ? undefined : minorOf(trade),
            coreMinor: core === undefined ? undefined : minorOf(core),
            pack: pack === undefined ? undefined : Number(pack),
            stock,
          },
        }
      }
      const issues: RowIssue[] = []
      const failed = new Set<string>()
      if (!valid) {
        for (let j = 0; j < n; j++) {
          const r = schemas[j]!.safeParse(vals[j]!)
          if (r.success) continue
          const key = keys[j]!
          failed.add(key)
          const value = key === 'type' ? rawType : vals[j] ?? ''
          issues.push({ column: headerOf(key), reason: rules[key]?.explain(value) ?? r.error.issues[0]?.message ?? 'This cell is not valid.' })
        }
      }
      if (extra) {
        issues.push({
          column: `(after ${index.width} columns)`,
          reason: `This row has ${cells.length} cells but the header row has ${index.width}: a delimiter inside an unquoted cell (a decimal comma in a comma-separated file?).`,
        })
      }
      const raw: Record<string, string> = {}
      keys.forEach((k, j) => { if (cols[j]! >= 0) raw[headerOf(k)] = (cells[cols[j]!] ?? '').slice(0, 200) })
      const skuText = vals[0]!.slice(0, 60)
      return { ok: false, sku: skuText ? (failed.has('sku') ? skuText : skuText.toUpperCase()) : null, issues, raw }
    },
  }
}

/** What the catalogue has now for a SKU (prices from the active version; null = no price there). */
export interface CurrentPart {
  id: number
  status: string
  list: number | null
  trade: number | null
  core: number | null
  pack: number | null
}

export interface Classified {
  kind: 'new' | 'changed' | 'unchanged' | 'rejected'
  list: number
  trade: number | null
  core: number
  pack: number
  changePct: number | null
  large: boolean
  issue?: RowIssue
}

/** List-price change in percent (two decimals) and whether it is beyond the confirmation threshold. */
export function priceChange(oldMinor: number | null, newMinor: number): { changePct: number | null; large: boolean } {
  if (oldMinor == null || oldMinor <= 0) return { changePct: null, large: false }
  const changePct = Math.round(((newMinor - oldMinor) / oldMinor) * 10_000) / 100
  // integer comparison: |new - old| / old > 30 %  <=>  |new - old| * 100 > 30 * old
  const large = Math.abs(newMinor - oldMinor) * 100 > LARGE_CHANGE_PERCENT * oldMinor
  return { changePct, large }
}

/** Compares a valid row with the part as it is now. */
export function classify(v: RowValues, current: CurrentPart | undefined, mapping: ColumnMapping): Classified {
  if (!current) {
    if (!v.description || !v.type) {
      const missing = [!v.type && (mapping.type ?? 'part type'), !v.description && (mapping.description ?? 'description')].filter(Boolean).join(', ')
      return {
        kind: 'rejected', list: v.listMinor, trade: v.tradeMinor ?? null, core: v.coreMinor ?? 0, pack: v.pack ?? 1, changePct: null, large: false,
        issue: { column: missing, reason: `SKU ${v.sku} is not in the catalogue: a new part needs a part type and a description.` },
      }
    }
    return { kind: 'new', list: v.listMinor, trade: v.tradeMinor ?? null, core: v.coreMinor ?? 0, pack: v.pack ?? 1, changePct: null, large: false }
  }
  const trade = v.tradeMinor !== undefined ? v.tradeMinor : current.trade
  const core = v.coreMinor !== undefined ? v.coreMinor : (current.core ?? 0)
  const pack = v.pack !== undefined ? v.pack : (current.pack ?? 1)
  const same = current.list === v.listMinor && current.trade === trade && (current.core ?? 0) === core && (current.pack ?? 1) === pack
  const { changePct, large } = priceChange(current.list, v.listMinor)
  return { kind: same ? 'unchanged' : 'changed', list: v.listMinor, trade, core, pack, changePct, large }
}
