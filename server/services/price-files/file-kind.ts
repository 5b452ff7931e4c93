/**
 * What kind of file a price file is, from its bytes, never its name: XLSX (recognised by `file-type`) or text that
 * will be proven to be CSV by parsing; anything else is named in the refusal ("a PDF document").
 */
import { open, stat } from 'node:fs/promises'
import { extname } from 'node:path'
import { detectDelimiter, readFirstLine } from './csv-rows'
import { PriceFileError } from './file-rows'

const XLSX_MIME = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet'

const KIND_NAMES: Record<string, string> = {
  pdf: 'a PDF document', png: 'a PNG image', jpg: 'a JPEG image', gif: 'a GIF image', webp: 'a WebP image',
  zip: 'a zip archive', gz: 'a gzip archive', docx: 'a Word document', pptx: 'a PowerPoint file', xls: 'an old-style Excel (.xls) workbook',
  cfb: 'an old-style Office file (.xls/.doc)', exe: 'a program', elf: 'a program', ods: 'an OpenDocument spreadsheet',
  '7z': 'a 7-Zip archive', rar: 'a RAR archive', mp4: 'a video', mp3: 'an audio file', sqlite: 'a database file',
}

export interface SniffResult {
  format: 'csv' | 'xlsx'
  /** CSV only */
  bom?: boolean
}

/**
 * Decides CSV or XLSX from the first bytes. `file-type` recognises XLSX (and everything binary); it cannot
 * recognise CSV, so anything it does not know must look like text here and is proven to be CSV by parsing.
 */
export async function sniffPriceFile(path: string): Promise<SniffResult> {
  const { size } = await stat(path)
  if (size === 0) throw new PriceFileError('The file is empty.', 'empty')
  const head = Buffer.alloc(Math.min(size, 8192))
  const fh = await open(path, 'r')
  try { await fh.read(head, 0, head.length, 0) } finally { await fh.close() }

  if ((head[0] === 0xff && head[1] === 0xfe) || (head[0] === 0xfe && head[1] === 0xff)) {
    throw new PriceFileError('This file is UTF-16 text. Save it as “CSV UTF-8” (comma or semicolon separated) and upload it again.', 'encoding')
  }
  const { fileTypeFromFile } = await import('file-type')
  const type = await fileTypeFromFile(path)
  if (type) {
    if (type.ext === 'xlsx' || type.mime === XLSX_MIME) return { format: 'xlsx' }
    const what = KIND_NAMES[type.ext] ?? `a .${type.ext} file (${type.mime})`
    throw new PriceFileError(`This file is ${what}, going by its content, not a CSV or XLSX price file.`, 'wrong_type')
  }
  if (head.includes(0)) {
    throw new PriceFileError('This file holds binary data, going by its content, not CSV text or an XLSX workbook.', 'wrong_type')
  }
  const bom = head.length >= 3 && head[0] === 0xef && head[1] === 0xbb && head[2] === 0xbf
  if (size <= (bom ? 3 : 0) || head.subarray(bom ? 3 : 0).toString('latin1').trim() === '' && size <= head.length) {
    throw new PriceFileError('The file is empty.', 'empty')
  }
  return { format: 'csv', bom }
}

// names a text price file may carry (or none)
const TEXT_EXTENSIONS = new Set(['', 'csv', 'txt', 'tsv', 'tab'])

/**
 * Text that is to be read as a CSV price file must say so and look so, by its bytes: its name does not claim another
 * format (a text file named .docx or .xlsx is something else, whatever it holds), it is not markup or data (HTML,
 * XML, JSON), and its first line has at least two columns (a price file needs a SKU and a price).
 */
export async function proveCsvText(path: string, fileName: string): Promise<void> {
  const ext = extname(fileName).slice(1).toLowerCase()
  if (!TEXT_EXTENSIONS.has(ext)) {
    throw new PriceFileError(`This file is named .${ext} but holds plain text, going by its content: it is neither a spreadsheet nor a CSV price file. Save the prices as CSV or XLSX and upload that.`, 'wrong_type')
  }
  const first = (await readFirstLine(path)).trim()
  if (/^[<{[]/.test(first)) {
    throw new PriceFileError('This file holds markup or data (HTML, XML or JSON), going by its content, not a CSV price file.', 'wrong_type')
  }
  if (columnsIn(first, detectDelimiter(first)) < 2) {
    throw new PriceFileError('This text is not a CSV price file: its first line has no columns separated by commas, semicolons or tabs.', 'wrong_type')
  }
}

/** Cells in one CSV line, quotes respected. */
function columnsIn(line: string, delimiter: string): number {
  let n = 1
  let quoted = false
  for (const ch of line) {
    if (ch === '"') quoted = !quoted
    else if (!quoted && ch === delimiter) n++
  }
  return n
}
