/**
 * Reading a price file without trusting it: what kind of file it is (from its bytes, never its name), whether
 * an XLSX is safe to inflate (zip entry count and sizes from the central directory, then proven while
 * inflating), whether CSV text is UTF-8 (and where it is not), which delimiter it uses, and the rows
 * themselves as streams of text cells (papaparse's parser fed chunk by chunk / exceljs streaming reader), never the whole file in memory.
 *
 * Plain Node (no Nitro auto-imports): unit-tested directly.
 */
import { isUtf8 } from 'node:buffer'
import { createReadStream } from 'node:fs'
import { open, stat } from 'node:fs/promises'
import { createInflateRaw } from 'node:zlib'
import { Transform, type TransformCallback } from 'node:stream'
import { pipeline } from 'node:stream/promises'
import Papa from 'papaparse'
import { PRICE_FILE_LIMITS } from '../../../shared/types/price-files'

/** A problem with the file itself: shown to the person as it is. */
export class PriceFileError extends Error {
  constructor(message: string, public readonly code = 'unreadable') {
    super(message)
    this.name = 'PriceFileError'
  }
}

// ---------------------------------------------------------------------------------------------- file kind

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

// ---------------------------------------------------------------------------------------------- zip safety

export interface ZipEntry {
  name: string
  method: number
  flags: number
  compressedSize: number
  uncompressedSize: number
  localHeaderOffset: number
}

/**
 * Lists the entries of a zip from its central directory (APPNOTE.TXT 4.3.12 / 4.3.16) and refuses, before
 * anything is inflated: too many entries, too many inflated bytes in total, a suspicious compression ratio,
 * ZIP64, encryption, or entries whose data lie outside the file or overlap (the "overlapping files" bomb).
 */
export async function inspectZip(path: string, limits = PRICE_FILE_LIMITS): Promise<ZipEntry[]> {
  const { size } = await stat(path)
  const fh = await open(path, 'r')
  try {
    const tailLen = Math.min(size, 22 + 0xffff)
    const tail = Buffer.alloc(tailLen)
    await fh.read(tail, 0, tailLen, size - tailLen)
    let eocd = -1
    for (let i = tailLen - 22; i >= 0; i--) {
      if (tail.readUInt32LE(i) === 0x06054b50) { eocd = i; break }
    }
    if (eocd < 0) throw new PriceFileError('This XLSX file is damaged: its zip directory is missing.', 'damaged')
    const total = tail.readUInt16LE(eocd + 10)
    const cdSize = tail.readUInt32LE(eocd + 12)
    const cdOffset = tail.readUInt32LE(eocd + 16)
    if (total === 0xffff || cdSize === 0xffffffff || cdOffset === 0xffffffff) {
      throw new PriceFileError('This XLSX file uses ZIP64, which price files never need. Save it again from the spreadsheet program.', 'zip64')
    }
    if (total > limits.maxZipEntries) {
      throw new PriceFileError(`This XLSX file holds ${total} zip entries (at most ${limits.maxZipEntries} are accepted): it is not a plain workbook.`, 'zip_bomb')
    }
    if (cdOffset + cdSize > size) throw new PriceFileError('This XLSX file is damaged: its zip directory points outside the file.', 'damaged')
    const cd = Buffer.alloc(cdSize)
    await fh.read(cd, 0, cdSize, cdOffset)

    const entries: ZipEntry[] = []
    let p = 0
    let inflated = 0
    for (let n = 0; n < total; n++) {
      if (p + 46 > cd.length || cd.readUInt32LE(p) !== 0x02014b50) {
        throw new PriceFileError('This XLSX file is damaged: its zip directory is cut short.', 'damaged')
      }
      const e: ZipEntry = {
        flags: cd.readUInt16LE(p + 8),
        method: cd.readUInt16LE(p + 10),
        compressedSize: cd.readUInt32LE(p + 20),
        uncompressedSize: cd.readUInt32LE(p + 24),
        localHeaderOffset: cd.readUInt32LE(p + 42),
        name: '',
      }
      const nameLen = cd.readUInt16LE(p + 28)
      const extraLen = cd.readUInt16LE(p + 30)
      const commentLen = cd.readUInt16LE(p + 32)
      e.name = cd.toString('utf8', p + 46, p + 46 + nameLen)
      p += 46 + nameLen + extraLen + commentLen
      if (e.compressedSize === 0xffffffff || e.uncompressedSize === 0xffffffff || e.localHeaderOffset === 0xffffffff) {
        throw new PriceFileError('This XLSX file uses ZIP64, which price files never need. Save it again from the spreadsheet program.', 'zip64')
      }
      if (e.flags & 0x1) throw new PriceFileError('This XLSX file is password-protected. Save an unprotected copy and upload that.', 'encrypted')
      if (e.method !== 0 && e.method !== 8) throw new PriceFileError(`This XLSX file uses an unusual zip compression (method ${e.method}).`, 'damaged')
      if (e.method === 0 && e.compressedSize !== e.uncompressedSize) throw new PriceFileError('This XLSX file is damaged: a stored entry has two sizes.', 'damaged')
      inflated += e.uncompressedSize
      if (inflated > limits.maxZipInflatedBytes) {
        throw new PriceFileError(`This XLSX file would inflate to more than ${Math.round(limits.maxZipInflatedBytes / 1024 / 1024)} MB: refused as a possible zip bomb.`, 'zip_bomb')
      }
      if (e.uncompressedSize > 1024 * 1024 && e.uncompressedSize > e.compressedSize * limits.maxZipRatio) {
        throw new PriceFileError(`The entry “${e.name}” of this XLSX file inflates ${Math.round(e.uncompressedSize / Math.max(1, e.compressedSize))} times: refused as a possible zip bomb.`, 'zip_bomb')
      }
      entries.push(e)
    }

    // Each entry's data must sit inside the file, after its own local header, without overlapping another.
    const ranges: [number, number, string][] = []
    const lh = Buffer.alloc(30)
    for (const e of entries) {
      if (e.localHeaderOffset + 30 > cdOffset) throw new PriceFileError('This XLSX file is damaged: an entry lies outside the file.', 'damaged')
      await fh.read(lh, 0, 30, e.localHeaderOffset)
      if (lh.readUInt32LE(0) !== 0x04034b50) throw new PriceFileError('This XLSX file is damaged: an entry header is missing.', 'damaged')
      const start = e.localHeaderOffset + 30 + lh.readUInt16LE(26) + lh.readUInt16LE(28)
      const end = start + e.compressedSize
      if (end > cdOffset) throw new PriceFileError('This XLSX file is damaged: an entry runs past its end.', 'damaged')
      ranges.push([e.localHeaderOffset, end, e.name])
    }
    ranges.sort((a, b) => a[0] - b[0])
    for (let i = 1; i < ranges.length; i++) {
      if (ranges[i]![0] < ranges[i - 1]![1]) {
        throw new PriceFileError('Two entries of this XLSX file share the same bytes: refused as a possible zip bomb.', 'zip_bomb')
      }
    }
    return entries
  } finally {
    await fh.close()
  }
}

/**
 * Inflates every entry once, discarding the output, and refuses the file as soon as an entry yields more
 * bytes than the directory declared: the declared sizes checked above are then true, whatever a crafted
 * file claims. Runs on streams (constant memory) and stops at the first excess.
 */
export async function proveZipSizes(path: string, entries: ZipEntry[]): Promise<void> {
  const fh = await open(path, 'r')
  const lh = Buffer.alloc(30)
  try {
    for (const e of entries) {
      if (e.method !== 8 || e.compressedSize === 0) continue
      await fh.read(lh, 0, 30, e.localHeaderOffset)
      const start = e.localHeaderOffset + 30 + lh.readUInt16LE(26) + lh.readUInt16LE(28)
      let produced = 0
      const counter = new Transform({
        transform(chunk: Buffer, _enc, cb: TransformCallback) {
          produced += chunk.length
          if (produced > e.uncompressedSize) cb(new PriceFileError(`The entry “${e.name}” of this XLSX file inflates beyond its declared size: refused as a possible zip bomb.`, 'zip_bomb'))
          else cb()
        },
      })
      try {
        await pipeline(createReadStream(path, { start, end: start + e.compressedSize - 1 }), createInflateRaw(), counter)
      } catch (err) {
        if (err instanceof PriceFileError) throw err
        throw new PriceFileError(`This XLSX file is damaged: the entry “${e.name}” cannot be inflated.`, 'damaged')
      }
    }
  } finally {
    await fh.close()
  }
}

// ---------------------------------------------------------------------------------------------- UTF-8

/**
 * Scans bytes as UTF-8 (RFC 3629 §4: no overlongs, no surrogates, nothing above U+10FFFF). Returns the offset
 * of the first bad byte (`bad`, -1 if none) and where an unfinished sequence at the very end starts (`tail`,
 * the length when there is none): with `final` false such a tail is left for the next chunk.
 */
function scanUtf8(buf: Uint8Array, final: boolean): { bad: number; tail: number } {
  let i = 0
  const n = buf.length
  while (i < n) {
    const b = buf[i]!
    if (b < 0x80) { i++; continue }
    let need: number
    let lo = 0x80
    let hi = 0xbf
    if (b >= 0xc2 && b <= 0xdf) need = 1
    else if (b === 0xe0) { need = 2; lo = 0xa0 }
    else if ((b >= 0xe1 && b <= 0xec) || b === 0xee || b === 0xef) need = 2
    else if (b === 0xed) { need = 2; hi = 0x9f }
    else if (b === 0xf0) { need = 3; lo = 0x90 }
    else if (b >= 0xf1 && b <= 0xf3) need = 3
    else if (b === 0xf4) { need = 3; hi = 0x8f }
    else return { bad: i, tail: n }
    for (let k = 1; k <= need; k++) {
      if (i + k >= n) return final ? { bad: i, tail: n } : { bad: -1, tail: i }
      const c = buf[i + k]!
      if (c < (k === 1 ? lo : 0x80) || c > (k === 1 ? hi : 0xbf)) return { bad: i, tail: n }
    }
    i += need + 1
  }
  return { bad: -1, tail: n }
}

/** Offset of the first byte that is not part of well-formed UTF-8, or -1. */
export function firstInvalidUtf8(buf: Uint8Array): number {
  return scanUtf8(buf, true).bad
}

/** Line (1-based) and byte offset of the first bad UTF-8 byte in a file, scanning it in chunks. */
export async function locateInvalidUtf8(path: string): Promise<{ line: number; offset: number; byte: number } | null> {
  let line = 1
  let base = 0
  let carry: Buffer = Buffer.alloc(0)
  for await (const chunk of createReadStream(path, { highWaterMark: 1 << 20 })) {
    const buf = carry.length ? Buffer.concat([carry, chunk as Buffer]) : (chunk as Buffer)
    const { bad, tail } = scanUtf8(buf, false)
    const end = bad >= 0 ? bad : tail
    for (let i = 0; i < end; i++) if (buf[i] === 0x0a) line++
    if (bad >= 0) return { line, offset: base + bad, byte: buf[bad]! }
    base += tail
    carry = Buffer.from(buf.subarray(tail))
    await new Promise((r) => setImmediate(r))
  }
  if (carry.length) return { line, offset: base, byte: carry[0]! }
  return null
}

export async function encodingError(path: string): Promise<PriceFileError> {
  const at = await locateInvalidUtf8(path)
  if (!at) return new PriceFileError('The file is not valid UTF-8 text.', 'encoding')
  const hex = at.byte.toString(16).toUpperCase().padStart(2, '0')
  const legacy = at.byte >= 0x80 ? ' It looks like text saved in an older encoding such as Windows-1252 or ISO-8859-1.' : ''
  return new PriceFileError(
    `The file is not valid UTF-8 text: line ${at.line} has the byte 0x${hex} (byte ${at.offset + 1} of the file), which UTF-8 does not allow.${legacy} Save the file as “CSV UTF-8” and upload it again; nothing has been changed.`,
    'encoding',
  )
}

// ---------------------------------------------------------------------------------------------- CSV

/** Picks the delimiter that splits the header line into the most cells, ignoring quoted text. */
export function detectDelimiter(firstLine: string): ',' | ';' | '\t' {
  const counts = { ',': 0, ';': 0, '\t': 0 }
  let quoted = false
  for (const ch of firstLine) {
    if (ch === '"') quoted = !quoted
    else if (!quoted && (ch === ',' || ch === ';' || ch === '\t')) counts[ch]++
  }
  if (counts['\t'] > counts[','] && counts['\t'] >= counts[';']) return '\t'
  if (counts[';'] > counts[',']) return ';'
  return ','
}

/** The first line of a text file (BOM removed), read without decoding the rest. */
export async function readFirstLine(path: string, maxBytes = 64 * 1024): Promise<string> {
  const fh = await open(path, 'r')
  try {
    const buf = Buffer.alloc(maxBytes)
    const { bytesRead } = await fh.read(buf, 0, maxBytes, 0)
    let text = new TextDecoder('utf-8', { fatal: false }).decode(buf.subarray(0, bytesRead))
    const nl = text.search(/\r?\n/)
    if (nl >= 0) text = text.slice(0, nl)
    return text
  } finally {
    await fh.close()
  }
}

export interface FileRow {
  /** the row number a spreadsheet shows (the header row is 1) */
  rowNumber: number
  cells: string[]
}

export interface RowSource {
  /** rows in file order, a few hundred at a time (one promise per batch, not per row) */
  rows: AsyncGenerator<FileRow[]>
  /** bytes of the file read so far (for progress) */
  bytesRead: () => number
}

const BATCH_ROWS = 500
const MAX_RECORD = 64 * 1024

/** Where an unfinished UTF-8 sequence at the end of a chunk starts (the chunk length when there is none). */
function utf8Tail(buf: Buffer): number {
  for (let k = 1; k <= 3 && k <= buf.length; k++) {
    const b = buf[buf.length - k]!
    if (b < 0x80) return buf.length // ASCII: nothing pending
    if (b >= 0xc0) { // lead byte: complete only if it has all its continuation bytes
      const need = b >= 0xf0 ? 4 : b >= 0xe0 ? 3 : 2
      return need > k ? buf.length - k : buf.length
    }
  }
  return buf.length
}

/** The line ending of a file, from its first line ending outside quotes (as a spreadsheet program writes one throughout). */
function lineEnding(text: string): '\r\n' | '\n' | '\r' {
  const unquoted = text.slice(0, 1024 * 1024).replace(/"[^"]*"/g, '')
  const n = unquoted.indexOf('\n')
  const r = unquoted.indexOf('\r')
  if (r === -1) return '\n'
  if (n === -1) return '\r'
  if (n === r + 1) return '\r\n'
  return n < r ? '\n' : '\r'
}

/**
 * Rows of a CSV file as text cells (untrimmed), parsed by papaparse's parser chunk by chunk. Every chunk is
 * proven UTF-8 (`buffer.isUtf8`, native) before it is decoded; a bad byte, a quoted cell that never closes or
 * text after a closing quote ends the read with a message naming the row. A quote inside an unquoted cell
 * (12" disc) is text.
 */
export function csvRows(path: string, delimiter: string): RowSource {
  let bytes = 0
  const source = createReadStream(path, { highWaterMark: 64 * 1024 })

  async function* rows(): AsyncGenerator<FileRow[]> {
    let n = 0 // records so far: every record counts, blank lines too, so row numbers are the ones a spreadsheet shows
    let carry: Buffer | null = null
    let partial = ''
    let parser: Papa.Parser | undefined
    let first = true
    const take = (text: string, last: boolean): FileRow[] => {
      if (!parser) parser = new Papa.Parser({ delimiter, newline: lineEnding(text), quoteChar: '"' })
      const input = partial + text
      const res = parser.parse(input, 0, !last)
      const quote = (res.errors as Papa.ParseError[]).find((e) => e.type === 'Quotes')
      if (quote) {
        const what = quote.code === 'MissingQuotes' ? 'a quoted cell is never closed' : 'a quote closes a cell but more text follows it'
        throw new PriceFileError(`The file cannot be read as CSV at row ${n + (quote.row ?? 0) + 1}: ${what}. Check the quotes on that row; nothing has been changed.`, 'csv_syntax')
      }
      partial = last ? '' : input.slice(res.meta.cursor)
      if (partial.length > MAX_RECORD) {
        throw new PriceFileError(`The file cannot be read as CSV at row ${n + res.data.length + 1}: one row is longer than 64 KB (often a quote that is never closed). Check that row; nothing has been changed.`, 'csv_syntax')
      }
      const out: FileRow[] = new Array(res.data.length)
      for (let i = 0; i < res.data.length; i++) out[i] = { rowNumber: ++n, cells: res.data[i] as string[] }
      return out
    }
    try {
      for await (const chunk of source as AsyncIterable<Buffer>) {
        bytes += chunk.length
        const buf: Buffer = carry ? Buffer.concat([carry, chunk]) : chunk
        const tail = utf8Tail(buf)
        const whole = buf.subarray(0, tail)
        carry = tail < buf.length ? Buffer.from(buf.subarray(tail)) : null
        if (!isUtf8(whole)) throw await encodingError(path)
        let text = whole.toString('utf8')
        if (first) { first = false; if (text.charCodeAt(0) === 0xfeff) text = text.slice(1) }
        const out = take(text, false)
        for (let i = 0; i < out.length; i += BATCH_ROWS) yield out.slice(i, i + BATCH_ROWS)
      }
      if (carry) throw await encodingError(path)
      if (partial) yield take('', true) // the last row, when the file does not end with a line break
    } finally {
      source.destroy()
    }
  }
  return { rows: rows(), bytesRead: () => bytes }
}

// ---------------------------------------------------------------------------------------------- XLSX

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
