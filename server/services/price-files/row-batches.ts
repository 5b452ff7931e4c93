/**
 * Validated rows of a price file in batches, packed for the trip from the thread that reads and validates them
 * to the one that compares them with the catalogue: the numbers of a batch in one Float64Array, its SKUs,
 * descriptions and types as one joined string each, refused rows as objects (few). A batch of 2,000 rows is a
 * handful of transferable buffers and strings instead of 2,000 objects to clone, so the reading can run in a
 * worker thread (rows-worker.ts, CSV and XLSX files) while the server thread compares; with `BORELINE_PRICE_WORKER=0`
 * (or no worker bundle, `nuxi dev`) they are packed the same way on the server thread, so the comparing code has one
 * input.
 *
 * Plain functions and classes, no Nitro imports: the worker bundle and the unit tests import this file.
 */
import { PRICE_FILE_LIMITS, type ColumnMapping } from '../../../shared/types/price-files'
import { PriceFileError, type FileRow, type RowSource } from './file-rows'
import { csvRows } from './csv-rows'
import { xlsxRows } from './xlsx-rows'
import { columnIndex } from './mapping'
import { rowValidator, type RowIssue, type RowValidator, type RowValues } from './rows'

/** Numbers per row: list, trade, core, pack, then one per stock branch (NaN = blank in the file). */
export const FIXED_NUMS = 4

export interface RefusedRow { i: number; sku: string | null; issues: RowIssue[]; raw: Record<string, string> }

export interface RowBatch {
  n: number
  /** file row number of each row */
  rows: Int32Array
  /** 1 = the row passed validation */
  ok: Uint8Array
  /** n × width numbers (see FIXED_NUMS) */
  nums: Float64Array
  width: number
  /** stock branch codes, in the order of their numbers */
  stockCodes: string[]
  /** SKUs (valid rows, upper case; '' for refused rows) joined by '\n', which no valid SKU holds */
  skus: string
  /** descriptions and part types of valid rows joined by '\n' ('' = blank); null when the file has no such column */
  descs: string | null
  types: string | null
  refused: RefusedRow[]
  /** data rows read so far, this batch included */
  count: number
  bytesRead: number
}

/** What a reader needs to validate and pack a file's rows. */
export interface RowJob {
  /** CSV unless said otherwise */
  format?: 'csv' | 'xlsx'
  path: string
  delimiter: string
  /** rows up to and including this one (the header) are skipped */
  afterRow: number
  mapping: ColumnMapping
  headers: string[]
  decimal: '.' | ','
}

/** A row with no text in any cell (an empty line gives ['']); most rows are told apart by their first cell alone. */
export function blankRow(cells: string[]): boolean {
  const first = cells[0] ?? ''
  if (first !== '' && first.trim() !== '') return false
  return cells.every((c) => c.trim() === '')
}

/** The mapped cells of a row as the file wrote them (at most 200 characters each), keyed by header. */
export function rawCells(mapping: ColumnMapping, cells: string[], headers: string[]): Record<string, string> {
  const raw: Record<string, string> = {}
  const names = [mapping.sku, mapping.description, mapping.type, mapping.listPrice, mapping.tradeCost, mapping.coreDeposit, mapping.packQuantity, ...Object.values(mapping.stock)]
  for (const h of names) if (h && headers.includes(h)) raw[h] = (cells[headers.indexOf(h)] ?? '').slice(0, 200)
  return raw
}

/**
 * Validates file rows and packs them into batches of `size`. Counts data rows (blank rows skipped) and refuses a
 * file with more than PRICE_FILE_LIMITS.maxRows of them.
 */
export class RowPacker {
  private readonly validator: RowValidator
  private readonly stockCodes: string[]
  private readonly width: number
  private readonly hasDesc: boolean
  private readonly hasType: boolean
  private count = 0
  private b!: { rows: Int32Array; ok: Uint8Array; nums: Float64Array; skus: string[]; descs: string[]; types: string[]; refused: RefusedRow[] }
  private n = 0
  private size: number

  /**
   * Batches start small and double up to `maxSize`, so the comparing thread has its first rows while the rest of
   * the first chunk of the file is still being validated.
   */
  constructor(private readonly job: Pick<RowJob, 'mapping' | 'headers' | 'decimal'>, private readonly maxSize = 2000, firstSize = 250) {
    this.size = Math.min(firstSize, maxSize)
    const index = columnIndex(job.mapping, job.headers)
    this.validator = rowValidator(job.mapping, index, job.decimal)
    this.stockCodes = index.stock.map(([code]) => code)
    this.width = FIXED_NUMS + this.stockCodes.length
    this.hasDesc = index.fields.description !== undefined
    this.hasType = index.fields.type !== undefined
    this.reset()
  }

  private reset(): void {
    this.n = 0
    this.b = {
      rows: new Int32Array(this.size), ok: new Uint8Array(this.size), nums: new Float64Array(this.size * this.width),
      skus: [], descs: [], types: [], refused: [],
    }
  }

  /** Adds rows; returns the batches they filled. */
  add(rows: FileRow[], bytesRead: number): RowBatch[] {
    const out: RowBatch[] = []
    for (const row of rows) {
      if (blankRow(row.cells)) continue
      if (++this.count > PRICE_FILE_LIMITS.maxRows) {
        throw new PriceFileError(`The file has more than ${PRICE_FILE_LIMITS.maxRows.toLocaleString('en-GB')} data rows. Split it into smaller files.`, 'too_many_rows')
      }
      this.put(row)
      if (this.n === this.size) out.push(this.take(bytesRead))
    }
    return out
  }

  /** The last, partly filled batch (null when there is none). */
  finish(bytesRead: number): RowBatch | null {
    return this.n ? this.take(bytesRead) : null
  }

  /** Data rows seen so far. */
  get rowCount(): number { return this.count }

  private put(row: FileRow): void {
    const b = this.b, i = this.n++, w = this.width
    b.rows[i] = row.rowNumber
    const r = this.validator.validate(row.cells)
    if (!r.ok) {
      b.ok[i] = 0
      b.skus.push('')
      if (this.hasDesc) b.descs.push('')
      if (this.hasType) b.types.push('')
      b.refused.push({ i, sku: r.sku, issues: r.issues, raw: r.raw })
      return
    }
    const v = r.values
    b.ok[i] = 1
    b.skus.push(v.sku)
    if (this.hasDesc) b.descs.push(v.description ?? '')
    if (this.hasType) b.types.push(v.type ?? '')
    const o = i * w
    b.nums[o] = v.listMinor
    b.nums[o + 1] = v.tradeMinor ?? NaN
    b.nums[o + 2] = v.coreMinor ?? NaN
    b.nums[o + 3] = v.pack ?? NaN
    for (let s = 0; s < this.stockCodes.length; s++) b.nums[o + FIXED_NUMS + s] = v.stock?.[this.stockCodes[s]!] ?? NaN
  }

  private take(bytesRead: number): RowBatch {
    const b = this.b, n = this.n
    const batch: RowBatch = {
      n,
      rows: n === b.rows.length ? b.rows : b.rows.slice(0, n),
      ok: n === b.ok.length ? b.ok : b.ok.slice(0, n),
      nums: n === b.rows.length ? b.nums : b.nums.slice(0, n * this.width),
      width: this.width,
      stockCodes: this.stockCodes,
      skus: b.skus.join('\n'),
      descs: this.hasDesc ? b.descs.join('\n') : null,
      types: this.hasType ? b.types.join('\n') : null,
      refused: b.refused,
      count: this.count,
      bytesRead,
    }
    this.size = Math.min(this.maxSize, this.size * 2)
    this.reset()
    return batch
  }
}

/** The buffers of a batch, to transfer (not copy) to another thread. */
export function transferables(b: RowBatch): ArrayBuffer[] {
  return [b.rows.buffer as ArrayBuffer, b.ok.buffer as ArrayBuffer, b.nums.buffer as ArrayBuffer]
}

/** File rows (after `afterRow`) validated and packed, batch by batch. */
export async function* packRows(source: AsyncIterable<FileRow[]>, bytesRead: () => number, job: Pick<RowJob, 'mapping' | 'headers' | 'decimal' | 'afterRow'>): AsyncGenerator<RowBatch> {
  const packer = new RowPacker(job)
  for await (const rows of source) {
    const after = rows.length && rows[0]!.rowNumber <= job.afterRow ? rows.filter((r) => r.rowNumber > job.afterRow) : rows
    for (const b of packer.add(after, bytesRead())) yield b
  }
  const last = packer.finish(bytesRead())
  if (last) yield last
}

/** Rows of a CSV file after its header, validated and packed. */
export function packedCsv(job: RowJob): AsyncGenerator<RowBatch> {
  return packedFrom(csvRows(job.path, job.delimiter), job)
}

/** Rows of a price file of either format after its header, validated and packed (what the worker runs). */
export function packedFile(job: RowJob): AsyncGenerator<RowBatch> {
  return packedFrom(job.format === 'xlsx' ? xlsxRows(job.path, job.decimal) : csvRows(job.path, job.delimiter), job)
}

async function* packedFrom(source: RowSource, job: RowJob): AsyncGenerator<RowBatch> {
  try {
    yield* packRows(source.rows, source.bytesRead, job)
  } finally {
    await source.rows.return(undefined)
  }
}

/** Reads batches back as rows: the comparing side's view of one batch. */
export class BatchReader {
  private readonly skus: string[]
  private readonly descs: string[] | null
  private readonly types: string[] | null
  private refusedAt = 0

  constructor(readonly batch: RowBatch) {
    this.skus = batch.skus.split('\n')
    this.descs = batch.descs === null ? null : batch.descs.split('\n')
    this.types = batch.types === null ? null : batch.types.split('\n')
  }

  ok(i: number): boolean { return this.batch.ok[i] === 1 }
  row(i: number): number { return this.batch.rows[i]! }

  /** The refusal of row i (call in row order, for refused rows only). */
  refused(i: number): RefusedRow {
    const r = this.batch.refused[this.refusedAt++]!
    if (r.i !== i) throw new Error('refused rows read out of order')
    return r
  }

  /** The values of valid row i. */
  values(i: number): RowValues {
    const { nums, width, stockCodes } = this.batch
    const o = i * width
    const num = (x: number) => (Number.isNaN(x) ? undefined : x)
    let stock: Record<string, number> | null = null
    for (let s = 0; s < stockCodes.length; s++) {
      const q = nums[o + FIXED_NUMS + s]!
      if (!Number.isNaN(q)) (stock ??= {})[stockCodes[s]!] = q
    }
    return {
      sku: this.skus[i]!,
      description: this.descs?.[i] || undefined,
      type: this.types?.[i] || undefined,
      listMinor: nums[o]!,
      tradeMinor: num(nums[o + 1]!),
      coreMinor: num(nums[o + 2]!),
      pack: num(nums[o + 3]!),
      stock,
    }
  }
}
