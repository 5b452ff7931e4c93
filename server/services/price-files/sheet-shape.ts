/**
 * The shape of a worksheet read from its raw XML (ECMA-376 Part 1, 18.3.1.4 `c` and 18.3.1.73 `row`: a cell's `r`
 * attribute is its reference, `XFD2`), before any spreadsheet reader walks it: exceljs builds every row out to its
 * last cell, so one cell in column XFD on each of 20,000 rows held the server's thread for seconds. A regular
 * expression over the inflated bytes, a chunk at a time, finds a cell too far right or too many rows at the cost of
 * reading the text once, and the check refuses the file with the same message the row reader would give.
 * Plain Node: the rows worker bundle and the unit tests import this file.
 */
import { PRICE_FILE_LIMITS } from '../../../shared/types/price-files'
import { PriceFileError, assertRowWidth } from './file-rows'

// rows above the header (a title, a date) that are not data rows but still <row> elements
const ROWS_ABOVE_HEADER = 50
const TAG = /<(row|c)\b([^>]*)>/g
const REF = /\br="([A-Za-z]{1,3})(\d+)"/
const ROW_NUMBER = /\br="(\d+)"/

/** Column number of a spreadsheet's letters (A = 1, XFD = 16384). */
export function columnNumber(letters: string): number {
  let n = 0
  for (const ch of letters.toUpperCase()) n = n * 26 + (ch.charCodeAt(0) - 64)
  return n
}

/** Feeds a worksheet's XML to `push` chunk by chunk; throws a PriceFileError at the first cell or row over a limit. */
export function sheetShapeScan(limits = PRICE_FILE_LIMITS) {
  let carry = ''
  let rows = 0
  let rowNumber = 0
  let cellsInRow = 0

  function tag(name: string, attributes: string): void {
    if (name === 'row') {
      rows++
      rowNumber = Number(ROW_NUMBER.exec(attributes)?.[1] ?? rowNumber + 1)
      cellsInRow = 0
      if (rows > limits.maxRows + ROWS_ABOVE_HEADER) {
        throw new PriceFileError(`The file has more than ${limits.maxRows.toLocaleString('en-GB')} data rows. Split it into smaller files.`, 'too_many_rows')
      }
      return
    }
    cellsInRow++
    const ref = REF.exec(attributes)
    // a cell without a reference follows the one before it
    assertRowWidth(ref ? columnNumber(ref[1]!) : cellsInRow, ref ? Number(ref[2]) : rowNumber)
  }

  return {
    push(chunk: Buffer): void {
      // latin1 keeps every byte one character; tags and references are ASCII, and a tag cut by the chunk's end waits
      const text = carry + chunk.toString('latin1')
      const cut = text.lastIndexOf('<')
      const whole = cut < 0 ? text : text.slice(0, cut)
      carry = cut < 0 ? '' : text.slice(cut)
      for (const m of whole.matchAll(TAG)) tag(m[1]!, m[2]!)
    },
  }
}
