/**
 * The rows of a CSV price file as text cells: which delimiter it uses, and the rows themselves parsed by papaparse's
 * parser fed chunk by chunk, never the whole file in memory. Plain Node: the rows worker runs this.
 */
import { isUtf8 } from 'node:buffer'
import { createReadStream } from 'node:fs'
import { open } from 'node:fs/promises'
import Papa from 'papaparse'
import { PriceFileError, assertRowWidth, type FileRow, type RowSource } from './file-rows'
import { encodingError } from './utf8'

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
      for (let i = 0; i < res.data.length; i++) {
        const cells = res.data[i] as string[]
        assertRowWidth(cells.length, n + 1)
        out[i] = { rowNumber: ++n, cells }
      }
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
