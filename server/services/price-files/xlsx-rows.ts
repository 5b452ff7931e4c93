/**
 * The rows of the first worksheet of an XLSX price file as text cells, streamed by exceljs (call inspectZip and
 * proveZipSizes from zip-safety.ts first). Runs in the rows worker thread for the check (rows-worker.ts); a row
 * wider than the column limit is refused before its cells are read.
 */
import { createReadStream } from 'node:fs'
import { Transform } from 'node:stream'
import { PriceFileError, assertRowWidth, type FileRow, type RowSource } from './file-rows'

/** An exceljs cell value as the text a CSV would hold: formulas become "=..." so the checks refuse them. */
export function xlsxCellText(v: unknown, decimal: '.' | ','): string {
  if (v == null) return ''
  if (typeof v === 'string') return v
  if (typeof v === 'number') {
    const s = String(v)
    return decimal === ',' ? s.replace('.', ',') : s
  }
  if (typeof v === 'boolean') return v ? 'TRUE' : 'FALSE'
  if (v instanceof Date) return v.toISOString().slice(0, 10)
  if (typeof v === 'object') {
    const o = v as Record<string, unknown>
    if ('formula' in o || 'sharedFormula' in o) return `=${String(o.formula ?? o.sharedFormula ?? '')}`
    if (Array.isArray(o.richText)) return (o.richText as { text: string }[]).map((t) => t.text).join('')
    if ('text' in o) return String(o.text ?? '')
    if ('error' in o) return String(o.error)
    if ('result' in o) return xlsxCellText(o.result, decimal)
  }
  return String(v)
}

/** Rows of the first worksheet of an XLSX workbook, streamed by exceljs (call inspectZip/proveZipSizes first). */
export function xlsxRows(path: string, decimal: '.' | ','): RowSource {
  let bytes = 0
  const source = createReadStream(path, { highWaterMark: 256 * 1024 })
  // counts bytes on their way to exceljs (a 'data' listener would start the flow before exceljs reads)
  const counted = source.pipe(new Transform({ transform(chunk: Buffer, _enc, cb) { bytes += chunk.length; cb(null, chunk) } }))

  async function* rows(): AsyncGenerator<FileRow[]> {
    const ExcelJS = (await import('exceljs')).default
    const reader = new ExcelJS.stream.xlsx.WorkbookReader(counted, {
      sharedStrings: 'cache', hyperlinks: 'ignore', styles: 'ignore', worksheets: 'emit', entries: 'emit',
    })
    try {
      for await (const sheet of reader) {
        for await (const batch of sheet as AsyncIterable<unknown>) {
          const list = (Array.isArray(batch) ? batch : [batch]) as { number: number; values: unknown[] }[]
          const out: FileRow[] = []
          for (const row of list) {
            const values = row.values ?? []
            // a sparse array as long as the row's last cell: its length is known before any cell is looked at
            assertRowWidth(values.length - 1, row.number)
            const cells: string[] = []
            for (let i = 1; i < values.length; i++) cells.push(xlsxCellText(values[i], decimal).trim())
            out.push({ rowNumber: row.number, cells })
          }
          if (out.length) yield out
        }
        break // the first worksheet only
      }
    } catch (err) {
      if (err instanceof PriceFileError) throw err
      throw new PriceFileError(`This XLSX file cannot be read: ${(err as Error).message}. Save it again from the spreadsheet program; nothing has been changed.`, 'damaged')
    } finally {
      source.destroy()
      counted.destroy()
    }
  }
  return { rows: rows(), bytesRead: () => bytes }
}
