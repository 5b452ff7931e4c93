/**
 * The check of an uploaded price file, run in the background one file at a time (a second upload waits its
 * turn: never two checks interleaved). It reads the file as a stream, validates and compares each row with
 * the active price list, and stages the result in `price_upload_rows` in batches (each batch one short write
 * transaction through `withWrite`, so other writes keep flowing; one batch is written while the next is read).
 * The event loop is given back between batches, so the server stays responsive. Nothing in parts, prices or stock changes here.
 */
import { join } from 'node:path'
import { QueryTypes } from 'sequelize'
import { getDb, withWrite } from '../../utils/db'
import { Branch } from '../../models/accounts'
import { PriceColumnMapping, PriceUpload } from '../../models/price-lists'
import { PRICE_FILE_LIMITS, type ColumnMapping } from '../../../shared/types/price-lists'
import { PriceFileError, csvRows, detectDelimiter, inspectZip, proveZipSizes, readFirstLine, xlsxRows, type FileRow, type RowSource } from './read'
import { autoMapping, checkMapping, columnIndex, displayHeaders, savedMappingFits } from './mapping'
import { classify, rowValidator, type CurrentPart } from './rows'

// rows per staging transaction: each write transaction opens its own SQLite connection (~14 ms), so small batches
// cost more than their rows; much larger ones hold other writers (and reads on the shared connection) too long
const BATCH = 10_000

// ------------------------------------------------------------------------------------------- where files live

let uploadsRoot = './uploads'
/** Set once at start from runtimeConfig.uploadsDir. */
export function setUploadsRoot(dir: string): void { uploadsRoot = dir }
export function priceFilesDir(): string { return join(uploadsRoot, 'price-files') }
export function priceFileTmpDir(): string { return join(uploadsRoot, 'price-files', 'incoming') }
export function storedPath(storedName: string): string {
  if (!/^[a-z0-9-]+\.(csv|xlsx)$/.test(storedName)) throw new Error('bad stored name')
  return join(priceFilesDir(), storedName)
}

// ------------------------------------------------------------------------------------------- the queue

interface Live { progress: number; stage: string }
const live = new Map<number, Live>()
const waiting: number[] = []
let running: Promise<void> | null = null

/** Progress of a check that is queued or running in this process. */
export function liveProgress(id: number): Live | undefined {
  return live.get(id)
}
export function checksInFlight(): number[] {
  return [...live.keys()]
}

/** Queues a check (the upload must already be in status `parsing`). */
export function enqueueCheck(id: number): void {
  if (live.has(id)) return
  live.set(id, { progress: 0, stage: 'queued' })
  waiting.push(id)
  if (!running) running = drain()
}

async function drain(): Promise<void> {
  try {
    while (waiting.length) {
      const id = waiting.shift()!
      try {
        await runCheck(id)
      } catch (err) {
        console.error('[boreline] price file check crashed:', err)
      } finally {
        live.delete(id)
      }
    }
  } finally {
    running = null
  }
}

/** Resolves when every queued check has finished (tests, shutdown). */
export async function checksIdle(): Promise<void> {
  while (running) await running
}

const yieldToLoop = () => new Promise<void>((r) => setImmediate(r))

// ------------------------------------------------------------------------------------------- one check

function setLive(id: number, stage: string, progress: number): void {
  live.set(id, { stage, progress: Math.max(0, Math.min(100, Math.round(progress))) })
}

async function failCheck(id: number, message: string, extra: Partial<Record<string, unknown>> = {}): Promise<void> {
  await withWrite((t) => PriceUpload.update(
    { status: 'failed', stage: null, progress: 100, errorMessage: message, ...extra },
    { where: { id, status: 'parsing' }, transaction: t },
  ))
}

export async function activePriceListId(): Promise<number | null> {
  const [row] = await getDb().query<{ id: number }>(`SELECT id FROM price_lists WHERE status = 'active' ORDER BY id DESC LIMIT 1`, { type: QueryTypes.SELECT })
  return row?.id ?? null
}

/**
 * The parts and their prices in the compared version, held compactly (typed arrays indexed through one
 * SKU map: a few MB for 200,000 parts instead of 200,000 objects) and loaded in slices of 10,000 so neither the
 * event loop nor the shared connection is held for long.
 */
class CatalogueSnapshot {
  private readonly index = new Map<string, number>()
  private ids = new Int32Array(1024)
  private money = new Float64Array(3 * 1024) // list, trade, core per part; NaN = none
  private packs = new Int32Array(1024) // 0 = none
  private flags = new Uint8Array(1024) // 1 = discontinued
  /** first file row that named each part (0 = not yet) */
  firstRow = new Int32Array(1024)
  size = 0

  add(sku: string, id: number, status: string, l: number | null, t: number | null, c: number | null, k: number | null): void {
    if (this.size === this.ids.length) this.grow()
    const i = this.size++
    this.index.set(sku.toUpperCase(), i)
    this.ids[i] = id
    this.money[3 * i] = l ?? NaN
    this.money[3 * i + 1] = t ?? NaN
    this.money[3 * i + 2] = c ?? NaN
    this.packs[i] = k ?? 0
    this.flags[i] = status === 'discontinued' ? 1 : 0
  }

  private grow(): void {
    const n = this.ids.length * 2
    const g = <T extends Int32Array | Float64Array | Uint8Array>(a: T, len: number): T => { const b = new (a.constructor as new (n: number) => T)(len); b.set(a); return b }
    this.ids = g(this.ids, n); this.money = g(this.money, 3 * n); this.packs = g(this.packs, n)
    this.flags = g(this.flags, n); this.firstRow = g(this.firstRow, n)
  }

  slot(sku: string): number | undefined { return this.index.get(sku) }

  part(i: number): CurrentPart {
    const v = (x: number) => (Number.isNaN(x) ? null : x)
    return {
      id: this.ids[i]!, status: this.flags[i] ? 'discontinued' : 'active',
      list: v(this.money[3 * i]!), trade: v(this.money[3 * i + 1]!), core: v(this.money[3 * i + 2]!), pack: this.packs[i] || null,
    }
  }

  static async load(baseId: number | null): Promise<CatalogueSnapshot> {
    const snap = new CatalogueSnapshot()
    let after = 0
    for (;;) {
      const rows = await getDb().query<{ id: number; sku: string; status: string; l: number | null; t: number | null; c: number | null; k: number | null }>(
        `SELECT p.id, p.sku, p.status, pr.list_price_minor AS l, pr.trade_cost_minor AS t, pr.core_deposit_minor AS c, pr.pack_quantity AS k
           FROM parts p LEFT JOIN prices pr ON pr.part_id = p.id AND pr.price_list_id = $1
          WHERE p.id > $2 ORDER BY p.id LIMIT 10000`,
        { bind: [baseId ?? -1, after], type: QueryTypes.SELECT, raw: true },
      )
      if (!rows.length) return snap
      for (const r of rows) snap.add(r.sku, r.id, r.status, r.l, r.t, r.c, r.k)
      after = rows[rows.length - 1]!.id
      await yieldToLoop()
    }
  }
}

// Staged rows travel as one JSON array per batch and SQLite unpacks them (json_each): one statement per
// 2,000 rows, no SQL text built from values, no per-row ORM work. (Measured here: as fast as, or faster
// than, multi-row INSERTs with 21,000 bound parameters.)
const STAGE_SQL = `INSERT INTO price_upload_rows (upload_id, kind, row_number, sku, part_id, part_type, description,
  old_list_minor, new_list_minor, old_trade_minor, new_trade_minor, old_core_minor, new_core_minor, old_pack, new_pack,
  change_pct, large, stock, columns, reason, raw)
  SELECT $1, v->>0, v->>1, v->>2, v->>3, v->>4, v->>5, v->>6, v->>7, v->>8, v->>9, v->>10, v->>11, v->>12, v->>13, v->>14, v->>15, v->>16, v->>17, v->>18, v->>19
  FROM (SELECT value AS v FROM json_each($2))`

type Staged = [
  kind: string, row: number | null, sku: string | null, partId: number | null, type: string | null, description: string | null,
  oldList: number | null, newList: number | null, oldTrade: number | null, newTrade: number | null, oldCore: number | null, newCore: number | null,
  oldPack: number | null, newPack: number | null, pct: number | null, large: 0 | 1, stock: string | null, columns: string | null, reason: string | null, raw: string | null,
]

async function stage(id: number, batch: Staged[]): Promise<void> {
  if (!batch.length) return
  const json = JSON.stringify(batch)
  await withWrite((t) => getDb().query(STAGE_SQL, { bind: [id, json], transaction: t, type: QueryTypes.INSERT }))
}

export async function savedMappingFor(supplierName: string): Promise<PriceColumnMapping | null> {
  const key = supplierName.trim().toLowerCase()
  if (!key) return null
  return PriceColumnMapping.findOne({ where: { supplierKey: key } })
}

export async function runCheck(id: number): Promise<void> {
  const upload = await PriceUpload.findByPk(id)
  if (!upload || upload.status !== 'parsing' || !upload.storedName) return
  setLive(id, 'reading', 0)
  const path = storedPath(upload.storedName)
  const branchCodes = (await Branch.findAll({ attributes: ['code'] })).map((b) => b.code)
  const decimal = upload.decimalMark === ',' ? ',' : '.'
  let delimiter = upload.delimiter
  let source: RowSource | undefined
  let writing: Promise<void> = Promise.resolve()
  try {
    if (upload.fileFormat === 'xlsx') {
      const entries = await inspectZip(path)
      await proveZipSizes(path, entries)
      source = xlsxRows(path, decimal)
    } else {
      if (!upload.delimiterChosen || !delimiter) delimiter = detectDelimiter(await readFirstLine(path))
      source = csvRows(path, delimiter)
    }
    const batches = source.rows
    // a blank row (an empty line gives ['']); most rows are told apart by their first cell alone
    const blank = (cells: string[]) => {
      const first = cells[0] ?? ''
      if (first !== '' && first.trim() !== '') return false
      return cells.every((c) => c.trim() === '')
    }

    // the header: the first row that is not blank
    let pending: FileRow[] = []
    let header: FileRow | undefined
    while (!header) {
      const next = await batches.next()
      if (next.done) break
      const at = next.value.findIndex((r) => !blank(r.cells))
      if (at >= 0) { header = next.value[at]; pending = next.value.slice(at + 1) }
    }
    if (!header) throw new PriceFileError('The file is empty: it has no header row and no data rows.', 'empty')
    const headers = displayHeaders(header.cells)

    let mapping: ColumnMapping | null = upload.mapping
    if (!mapping) {
      const saved = await savedMappingFor(upload.supplierName)
      mapping = saved && savedMappingFits(saved.mapping, headers) ? saved.mapping : autoMapping(headers, branchCodes)
    }
    const mappingCheck = checkMapping(mapping, headers, branchCodes)
    const problems = Object.values(mappingCheck.problems)
    if (problems.length) {
      await batches.return(undefined)
      const found = headers.slice(0, 12).map((h) => `“${h}”`).join(', ')
      await withWrite((t) => PriceUpload.update({
        status: 'uploaded', stage: null, progress: 100, headers, mapping, delimiter,
        errorMessage: `${problems.join(' ')} The columns found are ${found}${headers.length > 12 ? ', …' : ''}.`,
      }, { where: { id, status: 'parsing' }, transaction: t }))
      return
    }

    const baseId = await activePriceListId()
    const current = await CatalogueSnapshot.load(baseId)
    await withWrite((t) => getDb().query('DELETE FROM price_upload_rows WHERE upload_id = $1', { bind: [id], transaction: t }))
    const validator = rowValidator(mapping, columnIndex(mapping, headers), decimal)
    const firstRowOfNew = new Map<string, number>() // repeated SKUs among the parts not yet in the catalogue
    const repeats = new Map<string, number[]>()
    let batch: Staged[] = []
    let count = 0
    const fileSize = Math.max(1, upload.fileSize)
    const skuHeader = mapping.sku

    const handle = (row: FileRow) => {
      if (blank(row.cells)) return
      count++
      if (count > PRICE_FILE_LIMITS.maxRows) {
        throw new PriceFileError(`The file has more than ${PRICE_FILE_LIMITS.maxRows.toLocaleString('en-GB')} data rows. Split it into smaller files.`, 'too_many_rows')
      }
      const r = validator.validate(row.cells)
      if (!r.ok) {
        const slot = r.sku ? current.slot(r.sku) : undefined
        batch.push(['rejected', row.rowNumber, r.sku, slot === undefined ? null : current.part(slot).id, null, null, null, null, null, null, null, null, null, null, null, 0, null,
          [...new Set(r.issues.map((i) => i.column))].join(', ').slice(0, 300), r.issues.map((i) => i.reason).join(' '), JSON.stringify(r.raw)])
        return
      }
      const v = r.values
      const slot = current.slot(v.sku)
      const earlier = slot === undefined ? firstRowOfNew.get(v.sku) : (current.firstRow[slot] || undefined)
      if (earlier !== undefined) {
        repeats.set(v.sku, [...(repeats.get(v.sku) ?? [earlier]), row.rowNumber])
        batch.push(['rejected', row.rowNumber, v.sku, slot === undefined ? null : current.part(slot).id, null, null, null, null, null, null, null, null, null, null, null, 0, null,
          skuHeader, `SKU ${v.sku} appears more than once in the file (first on row ${earlier}): keep one row per SKU.`, JSON.stringify(rawOf(mapping!, row.cells, headers))])
        return
      }
      if (slot === undefined) firstRowOfNew.set(v.sku, row.rowNumber)
      else current.firstRow[slot] = row.rowNumber
      const cur = slot === undefined ? undefined : current.part(slot)
      const c = classify(v, cur, mapping!)
      const note = c.kind !== 'rejected' && cur && cur.status === 'discontinued' ? 'Discontinued now: back in use when this list is applied.' : null
      batch.push([
        c.kind, row.rowNumber, v.sku, cur?.id ?? null, cur ? null : v.type ?? null, cur ? null : v.description ?? null,
        cur?.list ?? null, c.list, cur?.trade ?? null, c.trade, cur ? cur.core ?? 0 : null, c.core, cur?.pack ?? null, c.pack,
        c.changePct, c.large ? 1 : 0, v.stock ? JSON.stringify(v.stock) : null,
        c.issue?.column ?? null, c.issue?.reason ?? note, c.kind === 'rejected' ? JSON.stringify(rawOf(mapping!, row.cells, headers)) : null,
      ])
    }

    for (const row of pending) handle(row)
    for await (const rows of batches) {
      for (const row of rows) handle(row)
      if (batch.length >= BATCH) {
        // SQLite writes one batch (on its own thread) while the next is read and checked here: at most one
        // batch in flight, so memory stays flat and an error surfaces at the next batch
        await writing
        writing = stage(id, batch)
        writing.catch(() => {}) // awaited (and thrown) at the next batch or at the end
        batch = []
        setLive(id, 'reading', (source.bytesRead() / fileSize) * 92)
      }
      await yieldToLoop() // between batches of 500 rows, whatever else is waiting runs
    }
    await writing
    await stage(id, batch)
    batch = []
    if (count === 0) throw new PriceFileError('The file has a header row but no data rows.', 'empty')

    setLive(id, 'comparing', 94)
    await yieldToLoop()
    await withWrite(async (t) => {
      // the first row of a repeated SKU is refused too: which of the rows is right is the person's call
      for (const [sku, rowsOf] of repeats) {
        const [first] = await getDb().query<StagedValues>(
          `SELECT sku, description, part_type, new_list_minor, new_trade_minor, new_core_minor, new_pack, stock
             FROM price_upload_rows WHERE upload_id = $1 AND kind IN ('new', 'changed', 'unchanged') AND row_number = $3 AND sku = $2`,
          { bind: [id, sku, rowsOf[0]], type: QueryTypes.SELECT, transaction: t },
        )
        await getDb().query(
          `UPDATE price_upload_rows SET kind = 'rejected', columns = $3, reason = $4, large = 0, raw = $6
            WHERE upload_id = $1 AND kind IN ('new', 'changed', 'unchanged') AND row_number = $5 AND sku = $2`,
          {
            bind: [id, sku, skuHeader, `SKU ${sku} appears more than once in the file (rows ${rowsOf.join(', ')}): keep one row per SKU.`, rowsOf[0],
              first ? JSON.stringify(rawFromStaged(mapping!, first, decimal)) : null],
            transaction: t,
          },
        )
      }
      // active parts the file does not mention (refused rows of a known SKU count as mentioned)
      await getDb().query(
        `INSERT INTO price_upload_rows (upload_id, kind, sku, part_id, part_type, description, old_list_minor, old_trade_minor, old_core_minor, old_pack, large)
         SELECT $1, 'missing', p.sku, p.id, p.type, p.description, pr.list_price_minor, pr.trade_cost_minor, pr.core_deposit_minor, pr.pack_quantity, 0
           FROM parts p LEFT JOIN prices pr ON pr.part_id = p.id AND pr.price_list_id = $2
          WHERE p.status = 'active'
            AND NOT EXISTS (SELECT 1 FROM price_upload_rows r WHERE r.upload_id = $1 AND r.part_id = p.id)`,
        { bind: [id, baseId ?? -1], transaction: t },
      )
    })
    setLive(id, 'comparing', 98)
    const counts = await countsOf(id)
    await withWrite((t) => PriceUpload.update({
      status: 'ready', stage: null, progress: 100, headers, mapping, delimiter, errorMessage: null,
      basePriceListId: baseId, rowsTotal: count,
      countNew: counts.new, countChanged: counts.changed, countUnchanged: counts.unchanged,
      countMissing: counts.missing, countRejected: counts.rejected, countLarge: counts.large,
    }, { where: { id, status: 'parsing' }, transaction: t }))
  } catch (err) {
    if (source) await source.rows.return(undefined).catch(() => {})
    await writing.catch(() => {}) // a batch still being written must land before the staged rows are removed
    await withWrite((t) => getDb().query('DELETE FROM price_upload_rows WHERE upload_id = $1', { bind: [id], transaction: t })).catch(() => {})
    if (err instanceof PriceFileError) {
      await failCheck(id, err.message, { delimiter })
    } else {
      console.error('[boreline] price file check failed:', err)
      await failCheck(id, 'The file could not be checked because of an unexpected error. Nothing has been changed; try again or contact support.', { delimiter })
    }
  }
}

interface StagedValues {
  sku: string; description: string | null; part_type: string | null; new_list_minor: number | null; new_trade_minor: number | null
  new_core_minor: number | null; new_pack: number | null; stock: string | null
}

/** The cells of a row that was staged as valid, written back as the file had them (for the refused-rows list). */
function rawFromStaged(mapping: ColumnMapping, r: StagedValues, decimal: '.' | ','): Record<string, string> {
  const amount = (m: number | null) => (m == null ? '' : (m / 100).toFixed(2).replace('.', decimal))
  const raw: Record<string, string> = {}
  const put = (h: string | null, v: string) => { if (h) raw[h] = v }
  put(mapping.sku, r.sku)
  put(mapping.description, r.description ?? '')
  put(mapping.type, r.part_type ?? '')
  put(mapping.listPrice, amount(r.new_list_minor))
  put(mapping.tradeCost, amount(r.new_trade_minor))
  put(mapping.coreDeposit, amount(r.new_core_minor))
  put(mapping.packQuantity, r.new_pack == null ? '' : String(r.new_pack))
  const stock = r.stock ? JSON.parse(r.stock) as Record<string, number> : {}
  for (const [code, h] of Object.entries(mapping.stock)) put(h, stock[code] == null ? '' : String(stock[code]))
  return raw
}

function rawOf(mapping: ColumnMapping, cells: string[], headers: string[]): Record<string, string> {
  const raw: Record<string, string> = {}
  const names = [mapping.sku, mapping.description, mapping.type, mapping.listPrice, mapping.tradeCost, mapping.coreDeposit, mapping.packQuantity, ...Object.values(mapping.stock)]
  for (const h of names) if (h && headers.includes(h)) raw[h] = (cells[headers.indexOf(h)] ?? '').slice(0, 200)
  return raw
}

export async function countsOf(id: number): Promise<{ new: number; changed: number; unchanged: number; missing: number; rejected: number; large: number }> {
  const rows = await getDb().query<{ kind: string; n: number; l: number }>(
    'SELECT kind, COUNT(*) AS n, COALESCE(SUM(large), 0) AS l FROM price_upload_rows WHERE upload_id = $1 GROUP BY kind',
    { bind: [id], type: QueryTypes.SELECT },
  )
  const c = { new: 0, changed: 0, unchanged: 0, missing: 0, rejected: 0, large: 0 }
  for (const r of rows) {
    if (r.kind in c) c[r.kind as keyof typeof c] = Number(r.n)
    if (r.kind === 'changed') c.large = Number(r.l)
  }
  return c
}

/** Remembers a supplier's column mapping (one per supplier name, case-insensitive) for their next file. */
export async function rememberMapping(supplierName: string, mapping: ColumnMapping, delimiter: string | null, decimal: '.' | ',', userId: number): Promise<void> {
  const key = supplierName.trim().toLowerCase()
  if (!key) return
  await withWrite(async (t) => {
    const existing = await PriceColumnMapping.findOne({ where: { supplierKey: key }, transaction: t })
    const values = { supplierName: supplierName.trim(), mapping, delimiter, decimalMark: decimal, updatedByUserId: userId }
    if (existing) await existing.update(values, { transaction: t })
    else await PriceColumnMapping.create({ supplierKey: key, ...values }, { transaction: t })
  })
}

/** At start: checks cut short by a restart run again; an apply cut short was rolled back by SQLite. */
export async function recoverUploads(): Promise<void> {
  await withWrite((t) => PriceUpload.update(
    { status: 'ready', errorMessage: 'The server stopped while this file was being applied; nothing was changed. Apply it again.' },
    { where: { status: 'applying' }, transaction: t },
  ))
  const interrupted = await PriceUpload.findAll({ where: { status: 'parsing' }, order: [['id', 'ASC']] })
  for (const up of interrupted) enqueueCheck(up.id)
}
