/**
 * The check of one price file (the queue runs one at a time, queue.ts). It reads the header and decides the
 * columns here; the rows are read and validated as a stream by a worker thread (CSV and XLSX; row-thread.ts),
 * arriving as packed batches (row-batches.ts) that this thread compares with the snapshot of the prices in use
 * (compare.ts, snapshot.ts). The findings stay in memory and are written at the end as a few JSON chunks per kind,
 * with the counts, in one short write transaction (findings.ts). The event loop is given back between batches, so
 * the server stays responsive. Nothing in parts, prices or stock changes here.
 */
import { setImmediate as yieldToLoop } from 'node:timers/promises'
import { withWrite } from '../../utils/db'
import { Branch } from '../../models/accounts'
import { PriceFile } from '../../models/price-files'
import type { ColumnMapping } from '../../../shared/types/price-files'
import { activePriceVersionId } from '../price-versions'
import { PriceFileError, type FileRow, type RowSource } from './file-rows'
import { csvRows, detectDelimiter, readFirstLine } from './csv-rows'
import { xlsxRows } from './xlsx-rows'
import { inspectZip, proveZipSizes } from './zip-safety'
import { blankRow, packRows, type RowBatch, type RowJob } from './row-batches'
import { rowsWorkerPath, workerBatches } from './row-thread'
import { autoMapping, checkMapping, displayHeaders, savedMappingFits } from './mapping'
import { savedMappingFor } from './supplier-mappings'
import { snapshotForCheck, type CatalogueSnapshot } from './snapshot'
import { Comparison, type ComparisonResult } from './compare'
import { fillRefusedCells } from './refused-cells'
import { deleteFindings, writeChunks } from './findings'
import { storedPath } from './storage'

/** Where a running check is, for the page that polls it (percent of the whole check). */
export type ReportProgress = (stage: 'reading' | 'comparing', percent: number) => void

/** Checks the price file `id` (status `parsing`); the outcome is written on its row (ready, uploaded or failed). */
export async function runCheck(id: number, report: ReportProgress): Promise<void> {
  const priceFile = await PriceFile.findByPk(id)
  if (!priceFile || priceFile.status !== 'parsing' || !priceFile.storedName) return
  report('reading', 0)
  const timing = stepTimes()
  const path = storedPath(priceFile.storedName)
  const branchCodes = (await Branch.findAll({ attributes: ['code'], order: [['id', 'ASC']] })).map((b) => b.code)
  const decimal = priceFile.decimalMark === ',' ? ',' : '.'
  let delimiter = priceFile.delimiter
  let source: RowSource | undefined
  let packed: AsyncGenerator<RowBatch> | undefined
  try {
    if (priceFile.fileFormat === 'xlsx') {
      await proveZipSizes(path, await inspectZip(path))
      source = xlsxRows(path, decimal)
    } else {
      if (!priceFile.delimiterChosen || !delimiter) delimiter = detectDelimiter(await readFirstLine(path))
      source = csvRows(path, delimiter)
    }
    const { header, pending } = await headerRow(source.rows)
    const headers = displayHeaders(header.cells)
    const mapping = await mappingFor(priceFile, headers, branchCodes)
    const problems = Object.values(checkMapping(mapping, headers, branchCodes).problems)
    if (problems.length) {
      await source.rows.return(undefined)
      await askForColumns(id, { headers, mapping, delimiter, problems })
      return
    }

    const baseId = await activePriceVersionId()
    timing.mark('header')
    // rows are read and validated by a worker thread while this one compares them (row-thread.ts), so a heavy file
    // never holds up the server's requests; where the worker bundle is missing they are packed here, the same way
    const format = priceFile.fileFormat === 'xlsx' ? 'xlsx' : 'csv'
    const job: RowJob = { format, path, delimiter: delimiter ?? ',', afterRow: header.rowNumber, mapping, headers, decimal }
    const workerFile = rowsWorkerPath()
    if (workerFile) {
      await source.rows.return(undefined)
      packed = workerBatches(workerFile, job)
    } else {
      const rest = source.rows
      packed = packRows((async function* () { yield pending; yield* rest })(), source.bytesRead, job)
    }
    const comparison = new Comparison(mapping)
    const { count, snap } = await compareAll(packed, comparison, { fileSize: priceFile.fileSize, report, timing })
    if (count === 0) throw new PriceFileError('The file has a header row but no data rows.', 'empty')
    timing.mark('rows read and checked')
    report('comparing', 92)
    await comparison.settle(snap)
    await fillRefusedCells(comparison.refusalsWithoutCells(),
      () => (priceFile.fileFormat === 'xlsx' ? xlsxRows(path, decimal) : csvRows(path, job.delimiter)), mapping, headers, decimal)
    timing.mark('repeats, missing, lists')
    report('comparing', 95)
    const result = await comparison.result()
    timing.mark('serialised')
    await writeCheck(id, result, { headers, mapping, delimiter, basePriceVersionId: baseId, rowsTotal: count })
    timing.mark('written')
    timing.log(id)
  } catch (err) {
    if (packed) await packed.return(undefined).catch(() => {})
    if (source) await source.rows.return(undefined).catch(() => {})
    if (err instanceof PriceFileError) {
      await failCheck(id, err.message, { delimiter })
    } else {
      console.error('[boreline] price file check failed:', err)
      await failCheck(id, 'The file could not be checked because of an unexpected error. Nothing has been changed; try again or contact support.', { delimiter })
    }
  }
}

/** `BORELINE_PRICE_TIMING=1`: how long each step took, on the server's log (benchmarks). */
function stepTimes() {
  const t0 = performance.now()
  const marks: string[] = []
  return {
    mark(what: string) { if (process.env.BORELINE_PRICE_TIMING === '1') marks.push(`${what} ${Math.round(performance.now() - t0)} ms`) },
    log(id: number) { if (marks.length) console.log(`[boreline] price file ${id} checked: ${marks.join(', ')}`) },
  }
}

/** The header: the first row that is not blank, and the rows of its batch after it. */
async function headerRow(batches: AsyncGenerator<FileRow[]>): Promise<{ header: FileRow; pending: FileRow[] }> {
  for (;;) {
    const next = await batches.next()
    if (next.done) throw new PriceFileError('The file is empty: it has no header row and no data rows.', 'empty')
    const at = next.value.findIndex((r) => !blankRow(r.cells))
    if (at >= 0) return { header: next.value[at]!, pending: next.value.slice(at + 1) }
  }
}

/** The mapping chosen for this file, else the supplier's remembered one when it fits the headers, else a guess. */
async function mappingFor(priceFile: PriceFile, headers: string[], branchCodes: string[]): Promise<ColumnMapping> {
  if (priceFile.mapping) return priceFile.mapping
  const saved = await savedMappingFor(priceFile.supplierName)
  return saved && savedMappingFits(saved.mapping, headers) ? saved.mapping : autoMapping(headers, branchCodes)
}

/**
 * Compares every batch, in file order. The snapshot loads (its SQL on SQLite's thread) while the first rows are
 * read and validated; those batches wait in `early` and are compared once it is there, one batch behind the file
 * until they are caught up.
 */
async function compareAll(
  packed: AsyncGenerator<RowBatch>, comparison: Comparison,
  opts: { fileSize: number; report: ReportProgress; timing: ReturnType<typeof stepTimes> },
): Promise<{ count: number; snap: CatalogueSnapshot }> {
  let current: CatalogueSnapshot | undefined
  let snapshotError: unknown
  const loading = snapshotForCheck().then((snap) => { current = snap; opts.timing.mark('snapshot') }, (err) => { snapshotError = err })
  const early: RowBatch[] = []
  const fileSize = Math.max(1, opts.fileSize)
  let count = 0
  let sinceProgress = 0
  for await (const batch of packed) {
    count = batch.count
    if (snapshotError) throw snapshotError
    if (current) {
      if (early.length) comparison.compare(early.shift()!, current)
      if (early.length) early.push(batch)
      else comparison.compare(batch, current)
    } else {
      early.push(batch)
    }
    if (++sinceProgress >= 5) { sinceProgress = 0; opts.report('reading', (batch.bytesRead / Math.max(fileSize, batch.bytesRead)) * 90) }
    await yieldToLoop() // between batches of rows, whatever else is waiting runs
  }
  await loading
  if (snapshotError || !current) throw snapshotError ?? new Error('catalogue snapshot missing')
  while (early.length) { comparison.compare(early.shift()!, current); await yieldToLoop() }
  return { count, snap: current }
}

/** The mapping cannot be used as it is: the file waits for the person's column choices. */
async function askForColumns(id: number, found: { headers: string[]; mapping: ColumnMapping; delimiter: string | null; problems: string[] }): Promise<void> {
  const { headers, mapping, delimiter, problems } = found
  const names = headers.slice(0, 12).map((h) => `“${h}”`).join(', ')
  await withWrite(async (t) => {
    const [changed] = await PriceFile.update({
      status: 'uploaded', stage: null, progress: 100, headers, mapping, delimiter,
      errorMessage: `${problems.join(' ')} The columns found are ${names}${headers.length > 12 ? ', …' : ''}.`,
    }, { where: { id, status: 'parsing' }, transaction: t })
    if (changed) await deleteFindings(t, id)
  })
}

/** Writes the findings and the counts, unless the file was changed meanwhile (no longer `parsing`). */
async function writeCheck(id: number, result: ComparisonResult, read: {
  headers: string[]; mapping: ColumnMapping; delimiter: string | null; basePriceVersionId: number | null; rowsTotal: number
}): Promise<void> {
  const { counts } = result
  await withWrite(async (t) => {
    const still = await PriceFile.findOne({ where: { id, status: 'parsing' }, attributes: ['id'], transaction: t })
    if (!still) return
    await deleteFindings(t, id)
    for (const [kind, chunks] of result.lists) await writeChunks(t, id, kind, chunks)
    await PriceFile.update({
      status: 'ready', stage: null, progress: 100, errorMessage: null, ...read,
      countNew: counts.new, countChanged: counts.changed, countUnchanged: counts.unchanged,
      countMissing: counts.missing, countRejected: counts.rejected, countLarge: counts.large,
    }, { where: { id, status: 'parsing' }, transaction: t })
  })
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
