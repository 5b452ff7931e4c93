/**
 * The check of an uploaded price file, run in the background one file at a time (a second upload waits its
 * turn: never two checks interleaved). It reads the header and decides the columns here; the rows are read and
 * validated as a stream by a worker thread (CSV; row-thread.ts) or here (XLSX), arriving as packed batches
 * (row-batches.ts) that this thread compares with the prices in use (a compact in-memory snapshot, kept warm). The
 * findings stay in memory and are written at the end as a few JSON chunks per kind, with the counts, in one short
 * write transaction (findings.ts). The event loop is given back between batches, so the server stays responsive.
 * Nothing in parts, prices or stock changes here.
 */
import { join } from 'node:path'
import { QueryTypes } from 'sequelize'
import { getDb, withWrite } from '../../utils/db'
import { Branch } from '../../models/accounts'
import { PriceColumnMapping, PriceFile } from '../../models/price-files'
import type { ColumnMapping } from '../../../shared/types/price-files'
import { PriceFileError, csvRows, detectDelimiter, inspectZip, proveZipSizes, readFirstLine, xlsxRows, type FileRow, type RowSource } from './read'
import { BatchReader, blankRow, packRows, rawCells, type RowBatch, type RowJob } from './row-batches'
import { rowsWorkerPath, workerBatches } from './row-thread'
import { autoMapping, checkMapping, displayHeaders, savedMappingFits } from './mapping'
import { classify, type CurrentPart } from './rows'
import { ChunkedList, F, deleteFindings, expandFinding, serialise, storedFinding, writeChunks, type PriceCheckFinding } from './findings'

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
  await withWrite(async (t) => {
    const [changed] = await PriceFile.update(
      { status: 'failed', stage: null, progress: 100, errorMessage: message, ...extra },
      { where: { id, status: 'parsing' }, transaction: t },
    )
    if (changed) await deleteFindings(t, id) // an earlier check's findings no longer describe this file
  })
}

export async function activePriceVersionId(): Promise<number | null> {
  const [row] = await getDb().query<{ id: number }>(`SELECT id FROM price_versions WHERE status = 'active' ORDER BY id DESC LIMIT 1`, { type: QueryTypes.SELECT })
  return row?.id ?? null
}

/**
 * The parts with their prices in use and stock per branch, held compactly (typed arrays indexed through one SKU
 * map: a few MB for 200,000 parts instead of 200,000 objects). Parts and prices are loaded in slices of 5,000
 * parts, each slice one JSON text built by SQLite (`json_group_array`) and parsed at once (much cheaper than 5,000
 * driver row objects), the next slice's query running while this one is unpacked. They are kept between checks
 * and built again in the background when the catalogue or the prices move (revision counters bumped by triggers,
 * whoever writes); stock moves with every order, so it is read afresh for each check.
 */
class CatalogueSnapshot {
  private readonly index = new Map<string, number>()
  private skus: string[] = []
  private ids = new Int32Array(1024)
  private money = new Float64Array(3 * 1024) // list, trade, core per part; NaN = none
  private packs = new Int32Array(1024) // 0 = none
  private flags = new Uint8Array(1024) // 1 = discontinued
  private setBy = new Int32Array(1024) // the version that set the price in use (0 = none)
  private stock = new Int32Array(0) // per part, one count per branch of `branchCodes` (-1 = no row)
  private branchCodes: string[] = []
  /** first file row that named each part (0 = not yet) */
  firstRow = new Int32Array(1024)
  /** the stock revision and branches the counts were read at (null = not read) */
  stockKey: string | null = null
  size = 0

  add(sku: string, id: number, status: string, l: number | null, t: number | null, c: number | null, k: number | null, by: number | null): void {
    if (this.size === this.ids.length) this.grow()
    const i = this.size++
    this.index.set(sku.toUpperCase(), i)
    this.skus.push(sku)
    this.ids[i] = id
    this.money[3 * i] = l ?? NaN
    this.money[3 * i + 1] = t ?? NaN
    this.money[3 * i + 2] = c ?? NaN
    this.packs[i] = k ?? 0
    this.flags[i] = status === 'discontinued' ? 1 : 0
    this.setBy[i] = by ?? 0
  }

  private grow(): void {
    const n = this.ids.length * 2
    const g = <T extends Int32Array | Float64Array | Uint8Array>(a: T, len: number): T => { const b = new (a.constructor as new (n: number) => T)(len); b.set(a); return b }
    this.ids = g(this.ids, n); this.money = g(this.money, 3 * n); this.packs = g(this.packs, n)
    this.flags = g(this.flags, n); this.firstRow = g(this.firstRow, n); this.setBy = g(this.setBy, n)
  }

  slot(sku: string): number | undefined { return this.index.get(sku) }
  id(i: number): number { return this.ids[i]! }
  sku(i: number): string { return this.skus[i]! }
  discontinued(i: number): boolean { return this.flags[i] === 1 }
  /** the version that set the part's price in use (null: no price) */
  pricedBy(i: number): number | null { return this.setBy[i] || null }

  /** The slot of a part id (ids are loaded in ascending order). */
  private slotOfId(id: number): number {
    let lo = 0, hi = this.size - 1
    while (lo <= hi) {
      const mid = (lo + hi) >> 1
      const v = this.ids[mid]!
      if (v === id) return mid
      if (v < id) lo = mid + 1; else hi = mid - 1
    }
    return -1
  }

  /** The counts of `stock` that differ from what the part holds now (null when none moves). */
  movedStock(i: number, stock: Record<string, number> | null): Record<string, number> | null {
    if (!stock) return null
    let moved: Record<string, number> | null = null
    const w = this.branchCodes.length
    for (const code in stock) {
      const b = this.branchCodes.indexOf(code)
      if (b < 0 || this.stock[i * w + b] !== stock[code]) (moved ??= {})[code] = stock[code]!
    }
    return moved
  }

  part(i: number): CurrentPart {
    const v = (x: number) => (Number.isNaN(x) ? null : x)
    return {
      id: this.ids[i]!, status: this.flags[i] ? 'discontinued' : 'active',
      list: v(this.money[3 * i]!), trade: v(this.money[3 * i + 1]!), core: v(this.money[3 * i + 2]!), pack: this.packs[i] || null,
    }
  }

  /** Parts and their prices in use. */
  static async load(): Promise<CatalogueSnapshot> {
    const snap = new CatalogueSnapshot()
    await inSlices(
      `SELECT json_group_array(json_array(p.id, p.sku, p.status, pr.list_price_minor, pr.trade_cost_minor, pr.core_deposit_minor, pr.pack_quantity, pr.price_version_id)) AS rows
         FROM parts p LEFT JOIN part_prices pr ON pr.part_id = p.id WHERE p.id > $1 AND p.id <= $2`,
      (rows) => {
        for (const r of rows as [number, string, string, number | null, number | null, number | null, number | null, number | null][]) {
          snap.add(r[1], r[0], r[2], r[3], r[4], r[5], r[6], r[7])
        }
      },
    )
    return snap
  }

  /** Stock per branch as it is now, for this check. */
  async loadStock(branches: { id: number; code: string }[]): Promise<void> {
    this.branchCodes = branches.map((b) => b.code)
    const w = branches.length
    const column = new Map(branches.map((b, i) => [b.id, i]))
    this.stock = new Int32Array(this.size * w).fill(-1)
    await inSlices(
      'SELECT json_group_array(json_array(part_id, branch_id, quantity)) AS rows FROM stock_levels WHERE part_id > $1 AND part_id <= $2',
      (rows) => {
        for (const [partId, branchId, quantity] of rows as [number, number, number][]) {
          const i = this.slotOfId(partId)
          const b = column.get(branchId)
          if (i >= 0 && b !== undefined) this.stock[i * w + b] = quantity
        }
      },
    )
  }
}

/** Runs a `json_group_array` query over part id ranges of 5,000, the next range's query running while one is unpacked. */
async function inSlices(sql: string, take: (rows: unknown[]) => void): Promise<void> {
  const [{ top }] = await getDb().query<{ top: number | null }>('SELECT MAX(id) AS top FROM parts', { type: QueryTypes.SELECT }) as [{ top: number | null }]
  const slice = (from: number) => getDb().query<{ rows: string | null }>(sql, { bind: [from, from + SLICE], type: QueryTypes.SELECT, raw: true })
  let next = top ? slice(0) : null
  for (let from = 0; next; from += SLICE) {
    const [got] = await next
    next = from + SLICE < top! ? slice(from + SLICE) : null
    take(JSON.parse(got?.rows ?? '[]') as unknown[])
    await yieldToLoop()
  }
}

let kept: { key: string; snap: CatalogueSnapshot } | null = null
let warming: Promise<void> | null = null
let warmAgain = false

/** What the kept snapshot depends on: the catalogue and price revisions (triggers) and the version in use. */
async function snapshotKey(): Promise<string> {
  const [r] = await getDb().query<{ c: number; p: number; v: number | null }>(
    `SELECT catalogue AS c, prices AS p, (SELECT id FROM price_versions WHERE status = 'active' ORDER BY id DESC LIMIT 1) AS v FROM catalogue_revisions WHERE id = 1`,
    { type: QueryTypes.SELECT },
  )
  return `${r?.c}:${r?.p}:${r?.v}`
}

/** The stock revision (triggers on stock_levels) and the branches: what the snapshot's counts depend on. */
async function stockKeyNow(): Promise<{ key: string; branches: { id: number; code: string }[] }> {
  const branches = (await Branch.findAll({ attributes: ['id', 'code'], order: [['id', 'ASC']] })).map((b) => ({ id: b.id, code: b.code }))
  const [r] = await getDb().query<{ s: number }>('SELECT stock AS s FROM catalogue_revisions WHERE id = 1', { type: QueryTypes.SELECT })
  return { key: `${r?.s}:${branches.map((b) => `${b.id}=${b.code}`).join(',')}`, branches }
}

/** Reads the stock counts again if they moved since the snapshot last read them (an order, a credit, an apply). */
async function freshStock(snap: CatalogueSnapshot): Promise<void> {
  const { key, branches } = await stockKeyNow() // read before the load: a change during it leaves the key stale, never the data
  if (snap.stockKey === key) return
  snap.stockKey = null
  await snap.loadStock(branches)
  snap.stockKey = key
}

/**
 * Builds the kept snapshot in the background if the catalogue, prices or stock moved since it was built (at start,
 * after an apply or a roll back). `BORELINE_PRICE_SNAPSHOT=0` keeps none (each check then loads its own).
 */
export function warmSnapshot(): Promise<void> {
  if (process.env.BORELINE_PRICE_SNAPSHOT === '0') return Promise.resolve()
  // asked again while building (a roll back right after an apply): build once more when this one ends, or the
  // next check would find the kept snapshot stale and wait for its own
  if (warming) { warmAgain = true; return warming }
  warming = (async () => {
    do {
      warmAgain = false
      const key = await snapshotKey() // read before the load: a change during it leaves the key stale, never the data
      if (kept?.key !== key) kept = { key, snap: await CatalogueSnapshot.load() }
      await freshStock(kept.snap)
    } while (warmAgain)
  })().catch((err) => console.error('[boreline] price snapshot:', err?.message ?? err)).finally(() => { warming = null })
  return warming
}

/** The snapshot for a check: the kept one when nothing moved since it was built, stock read again if it moved. */
async function snapshotForCheck(): Promise<CatalogueSnapshot> {
  if (warming) await warming
  const key = await snapshotKey()
  let snap = kept?.key === key ? kept.snap : null
  if (!snap) {
    snap = await CatalogueSnapshot.load()
    if (process.env.BORELINE_PRICE_SNAPSHOT !== '0') kept = { key, snap }
  }
  snap.firstRow.fill(0)
  await freshStock(snap)
  return snap
}

const SLICE = 5_000

export async function savedMappingFor(supplierName: string): Promise<PriceColumnMapping | null> {
  const key = supplierName.trim().toLowerCase()
  if (!key) return null
  return PriceColumnMapping.findOne({ where: { supplierKey: key } })
}

const CHECK_KINDS = ['new', 'changed', 'unchanged', 'missing', 'rejected'] as const
type CheckKind = typeof CHECK_KINDS[number]
const KIND_CODE: Record<CheckKind, number> = { new: 0, changed: 1, unchanged: 2, missing: 3, rejected: 4 }

function refusedFinding(row: number, sku: string | null, partId: number | null, columns: string | null, reason: string, raw: Record<string, string> | null): PriceCheckFinding {
  return [row, sku, partId, null, null, null, null, null, null, null, null, null, null, null, 0, null, (columns ?? "").slice(0, 300), reason, raw]
}

export async function runCheck(id: number): Promise<void> {
  const upload = await PriceFile.findByPk(id)
  if (!upload || upload.status !== 'parsing' || !upload.storedName) return
  setLive(id, 'reading', 0)
  // BORELINE_PRICE_TIMING=1: how long each step took, on the server's log (benchmarks)
  const t0 = performance.now()
  const marks: string[] = []
  const mark = (what: string) => { if (process.env.BORELINE_PRICE_TIMING === '1') marks.push(`${what} ${Math.round(performance.now() - t0)} ms`) }
  const path = storedPath(upload.storedName)
  const branches = (await Branch.findAll({ attributes: ['id', 'code'], order: [['id', 'ASC']] })).map((b) => ({ id: b.id, code: b.code }))
  const branchCodes = branches.map((b) => b.code)
  const decimal = upload.decimalMark === ',' ? ',' : '.'
  let delimiter = upload.delimiter
  let source: RowSource | undefined
  let packing: AsyncGenerator<RowBatch> | undefined
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
    // the header: the first row that is not blank
    let pending: FileRow[] = []
    let header: FileRow | undefined
    while (!header) {
      const next = await batches.next()
      if (next.done) break
      const at = next.value.findIndex((r) => !blankRow(r.cells))
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
      await withWrite(async (t) => {
        const [changed] = await PriceFile.update({
          status: 'uploaded', stage: null, progress: 100, headers, mapping, delimiter,
          errorMessage: `${problems.join(' ')} The columns found are ${found}${headers.length > 12 ? ', …' : ''}.`,
        }, { where: { id, status: 'parsing' }, transaction: t })
        if (changed) await deleteFindings(t, id)
      })
      return
    }

    const baseId = await activePriceVersionId()
    mark('header')
    // CSV rows are read and validated by a worker thread while this one compares them (row-thread.ts); XLSX rows,
    // or every file where the worker bundle is missing, are packed here, batch by batch, the same way
    const job: RowJob = { path, delimiter: delimiter ?? ',', afterRow: header.rowNumber, mapping, headers, decimal }
    const workerFile = upload.fileFormat === 'csv' ? rowsWorkerPath() : null
    let packed: AsyncGenerator<RowBatch>
    if (workerFile) {
      await batches.return(undefined)
      packed = workerBatches(workerFile, job)
    } else {
      const rest = batches
      packed = packRows((async function* () { yield pending; yield* rest })(), source.bytesRead, job)
    }
    packing = packed
    // The snapshot loads (its SQL on SQLite's thread) while the first rows are read and validated; those
    // batches wait in `early` and are compared, in file order, once it is there.
    let current: CatalogueSnapshot | undefined
    let snapshotError: unknown
    const loading = snapshotForCheck().then((snap) => { current = snap; mark('snapshot') }, (err) => { snapshotError = err })
    const early: RowBatch[] = []

    // findings per kind, in file order, kept as JSON chunks (refused rows as objects: they are sorted at the end);
    // a repeated SKU's first row is moved to the refused ones at the end
    const found = { new: new ChunkedList<unknown[]>(), changed: new ChunkedList<unknown[]>(), unchanged: new ChunkedList<unknown[]>(), missing: new ChunkedList<unknown[]>() }
    const rejected: PriceCheckFinding[] = []
    const prices = new ChunkedList<unknown[]>() // for the apply, beside `found.changed` (same indexes)
    let large = 0
    // where each SKU's first valid row went: catalogue parts by snapshot slot, new SKUs by name
    let kindOfSlot = new Uint8Array(0)
    let indexOfSlot = new Int32Array(0)
    let mentioned = new Uint8Array(0) // named by any row, refused ones too (not "missing")
    const firstOfNew = new Map<string, { row: number; index: number }>()
    const repeats = new Map<string, number[]>()
    // for the apply: stock counts that move ([partId, counts]) and discontinued parts the file prices again
    const stockMoves: unknown[] = []
    const revive: number[] = []
    let count = 0
    const fileSize = Math.max(1, upload.fileSize)
    const skuHeader = mapping.sku

    const compareBatch = (batch: RowBatch, snap: CatalogueSnapshot) => {
      if (kindOfSlot.length !== snap.size) {
        kindOfSlot = new Uint8Array(snap.size); indexOfSlot = new Int32Array(snap.size); mentioned = new Uint8Array(snap.size)
      }
      const rd = new BatchReader(batch)
      for (let i = 0; i < batch.n; i++) {
        const rowNumber = rd.row(i)
        if (!rd.ok(i)) {
          const r = rd.refused(i)
          const slot = r.sku ? snap.slot(r.sku) : undefined
          if (slot !== undefined) mentioned[slot] = 1
          rejected.push(refusedFinding(rowNumber, r.sku, slot === undefined ? null : snap.id(slot),
            [...new Set(r.issues.map((x) => x.column))].join(', '), r.issues.map((x) => x.reason).join(' '), r.raw))
          continue
        }
        const v = rd.values(i)
        const slot = snap.slot(v.sku)
        const earlier = slot === undefined ? firstOfNew.get(v.sku)?.row : (snap.firstRow[slot] || undefined)
        if (earlier !== undefined) {
          repeats.set(v.sku, [...(repeats.get(v.sku) ?? [earlier]), rowNumber])
          rejected.push(refusedFinding(rowNumber, v.sku, slot === undefined ? null : snap.id(slot), skuHeader,
            `SKU ${v.sku} appears more than once in the file (first on row ${earlier}): keep one row per SKU.`, null))
          continue
        }
        const cur = slot === undefined ? undefined : snap.part(slot)
        const c = classify(v, cur, mapping!)
        if (c.kind === 'rejected') {
          if (slot !== undefined) mentioned[slot] = 1
          rejected.push([rowNumber, v.sku, cur?.id ?? null, cur ? null : v.type ?? null, cur ? null : v.description ?? null,
            cur?.list ?? null, c.list, cur?.trade ?? null, c.trade, cur ? cur.core ?? 0 : null, c.core, cur?.pack ?? null, c.pack,
            null, 0, v.stock ?? null, c.issue?.column ?? null, c.issue?.reason ?? null, null])
          continue
        }
        const list = found[c.kind]
        if (slot === undefined) {
          firstOfNew.set(v.sku, { row: rowNumber, index: list.length })
        } else {
          snap.firstRow[slot] = rowNumber
          mentioned[slot] = 1
          kindOfSlot[slot] = KIND_CODE[c.kind]
          indexOfSlot[slot] = list.length
          const moved = snap.movedStock(slot, v.stock ?? null)
          if (moved) stockMoves.push([cur!.id, moved])
          if (cur!.status === 'discontinued') revive.push(cur!.id)
        }
        const note = cur && cur.status === 'discontinued' ? 'Discontinued now: back in use when this list is applied.' : null
        list.push(storedFinding(c.kind, [
          rowNumber, v.sku, cur?.id ?? null, cur ? null : v.type ?? null, cur ? null : v.description ?? null,
          cur?.list ?? null, c.list, cur?.trade ?? null, c.trade, cur ? cur.core ?? 0 : null, c.core, cur?.pack ?? null, c.pack,
          c.changePct, c.large ? 1 : 0, v.stock ?? null, null, note, null,
        ]))
        if (c.kind === 'changed') {
          // with the values they replace: the apply checks that the version compared with is still in use, and only
          // price files change prices, so these are exactly what a roll back must write back
          prices.push([cur!.id, c.list, c.trade, c.core, c.pack, cur!.list, cur!.trade, cur!.core, cur!.pack, snap.pricedBy(slot!)])
          if (c.large) large++
        }
      }
    }

    let sinceProgress = 0
    for await (const batch of packed) {
      count = batch.count
      if (snapshotError) throw snapshotError
      if (current) {
        if (early.length) compareBatch(early.shift()!, current) // catching up, one batch behind the file
        if (early.length) early.push(batch)
        else compareBatch(batch, current)
      } else {
        early.push(batch)
      }
      if (++sinceProgress >= 5) { sinceProgress = 0; setLive(id, 'reading', (batch.bytesRead / Math.max(fileSize, batch.bytesRead)) * 90) }
      await yieldToLoop() // between batches of rows, whatever else is waiting runs
    }
    await loading
    if (snapshotError || !current) throw snapshotError ?? new Error('catalogue snapshot missing')
    while (early.length) { compareBatch(early.shift()!, current); await yieldToLoop() }
    if (count === 0) throw new PriceFileError('The file has a header row but no data rows.', 'empty')
    mark('rows read and checked')
    setLive(id, 'comparing', 92)
    // the first row of a repeated SKU is refused too: which of the rows is right is the person's call
    const removed: Record<'new' | 'changed' | 'unchanged', number[]> = { new: [], changed: [], unchanged: [] }
    const removedIds = new Set<number>()
    for (const [sku, rowsOf] of repeats) {
      const slot = current.slot(sku)
      let kind: CheckKind | undefined
      let index = -1
      if (slot === undefined) {
        const first = firstOfNew.get(sku)
        if (first) { kind = 'new'; index = first.index }
      } else {
        kind = CHECK_KINDS[kindOfSlot[slot]!]
        index = indexOfSlot[slot]!
      }
      if (kind !== 'new' && kind !== 'changed' && kind !== 'unchanged') continue
      const stored = found[kind].get(index)
      if (!stored) continue
      const first = expandFinding(kind, stored)
      removed[kind].push(index)
      if (first[F.partId] != null) removedIds.add(first[F.partId]!)
      if (kind === 'changed' && first[F.large]) large--
      rejected.push(refusedFinding(first[F.row]!, sku, first[F.partId], skuHeader,
        `SKU ${sku} appears more than once in the file (rows ${rowsOf.join(', ')}): keep one row per SKU.`, null))
    }
    for (const k of ['new', 'changed', 'unchanged'] as const) if (removed[k].length) found[k].remove(removed[k])
    if (removed.changed.length) prices.remove(removed.changed)
    // active parts the file does not mention (refused rows of a known SKU count as mentioned)
    if (mentioned.length !== current.size) mentioned = new Uint8Array(current.size)
    for (let i = 0; i < current.size; i++) {
      if (mentioned[i] || current.discontinued(i)) continue
      const p = current.part(i)
      found.missing.push(storedFinding('missing', [null, current.sku(i), p.id, null, null, p.list, null, p.trade, null, p.core ?? 0, null, p.pack, null, null, 0, null, null, null, null]))
      if ((i & 4095) === 0) await yieldToLoop()
    }
    rejected.sort((a, b) => a[F.row]! - b[F.row]!)
    // refusals found while comparing (a repeated SKU, a new part without type or description) show the row's cells
    // as the file has them: the reading thread does not keep cells, so those few rows are read again
    const noRaw = rejected.filter((f) => f[F.raw] === null)
    if (noRaw.length) {
      // the file was read once already; should it not read again, the refusal shows the values as understood
      const cells = await cellsOfRows(upload.fileFormat === 'xlsx' ? xlsxRows(path, decimal) : csvRows(path, job.delimiter), new Set(noRaw.map((f) => f[F.row]!)), mapping, headers)
        .catch(() => new Map<number, Record<string, string>>())
      for (const f of noRaw) f[F.raw] = cells.get(f[F.row]!) ?? rawFromFinding(mapping, f, decimal)
    }
    for (const list of [...Object.values(found), prices]) list.flush()
    const counts = {
      new: found.new.length, changed: found.changed.length, unchanged: found.unchanged.length,
      missing: found.missing.length, rejected: rejected.length, large,
    }
    mark('repeats, missing, lists')
    setLive(id, 'comparing', 95)
    // what the apply writes, compact: prices of changed parts, stock counts that move, discontinued parts priced again
    const serialised: [string, { size: number; json: string }[]][] = [
      ['new', found.new.chunks], ['changed', found.changed.chunks], ['unchanged', found.unchanged.chunks],
      ['missing', found.missing.chunks], ['rejected', await serialise(rejected)],
      ['prices', prices.chunks],
      ['stock', await serialise(removedIds.size ? stockMoves.filter((x) => !removedIds.has((x as [number])[0])) : stockMoves)],
      ['revive', await serialise(removedIds.size ? revive.filter((x) => !removedIds.has(x)) : revive)],
    ]
    mark('serialised')
    await withWrite(async (t) => {
      const still = await PriceFile.findOne({ where: { id, status: 'parsing' }, attributes: ['id'], transaction: t })
      if (!still) return
      await deleteFindings(t, id)
      for (const [k, chunks] of serialised) await writeChunks(t, id, k, chunks)
      await PriceFile.update({
        status: 'ready', stage: null, progress: 100, headers, mapping, delimiter, errorMessage: null,
        basePriceVersionId: baseId, rowsTotal: count,
        countNew: counts.new, countChanged: counts.changed, countUnchanged: counts.unchanged,
        countMissing: counts.missing, countRejected: counts.rejected, countLarge: counts.large,
      }, { where: { id, status: 'parsing' }, transaction: t })
    })
    mark('written')
    if (marks.length) console.log(`[boreline] price file ${id} checked: ${marks.join(', ')}`)
  } catch (err) {
    if (packing) await packing.return(undefined).catch(() => {})
    if (source) await source.rows.return(undefined).catch(() => {})
    if (err instanceof PriceFileError) {
      await failCheck(id, err.message, { delimiter })
    } else {
      console.error('[boreline] price file check failed:', err)
      await failCheck(id, 'The file could not be checked because of an unexpected error. Nothing has been changed; try again or contact support.', { delimiter })
    }
  }
}

/** The cells of a row that was found valid, written back as the file had them (for the refused-rows list). */
function rawFromFinding(mapping: ColumnMapping, f: PriceCheckFinding, decimal: '.' | ','): Record<string, string> {
  const amount = (m: number | null) => (m == null ? '' : (m / 100).toFixed(2).replace('.', decimal))
  const raw: Record<string, string> = {}
  const put = (h: string | null | undefined, v: string) => { if (h) raw[h] = v }
  put(mapping.sku, f[F.sku] ?? '')
  put(mapping.description, f[F.description] ?? '')
  put(mapping.type, f[F.type] ?? '')
  put(mapping.listPrice, amount(f[F.newList]))
  put(mapping.tradeCost, amount(f[F.newTrade]))
  put(mapping.coreDeposit, amount(f[F.newCore]))
  put(mapping.packQuantity, f[F.newPack] == null ? '' : String(f[F.newPack]))
  const stock = f[F.stock] ?? {}
  for (const [code, h] of Object.entries(mapping.stock)) put(h, stock[code] == null ? '' : String(stock[code]))
  return raw
}

/** The mapped cells of the given rows, read again from the file (for the few refusals found while comparing). */
async function cellsOfRows(source: RowSource, wanted: Set<number>, mapping: ColumnMapping, headers: string[]): Promise<Map<number, Record<string, string>>> {
  const out = new Map<number, Record<string, string>>()
  try {
    for await (const rows of source.rows) {
      for (const r of rows) if (wanted.has(r.rowNumber)) out.set(r.rowNumber, rawCells(mapping, r.cells, headers))
      if (out.size === wanted.size) break
      await yieldToLoop()
    }
  } finally {
    await source.rows.return(undefined)
  }
  return out
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
  await withWrite((t) => PriceFile.update(
    { status: 'ready', errorMessage: 'The server stopped while this file was being applied; nothing was changed. Apply it again.' },
    { where: { status: 'applying' }, transaction: t },
  ))
  const interrupted = await PriceFile.findAll({ where: { status: 'parsing' }, order: [['id', 'ASC']] })
  for (const up of interrupted) enqueueCheck(up.id)
}
