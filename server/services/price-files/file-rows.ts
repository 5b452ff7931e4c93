/**
 * What every reader of a price file gives (rows of text cells, a few hundred at a time, with the bytes read so
 * far) and the one error a problem with the file itself raises: its message is shown to the person as it is.
 * Plain Node: the rows worker bundle and the unit tests import this file.
 */

import { PRICE_FILE_LIMITS } from '../../../shared/types/price-files'

/** A problem with the file itself: shown to the person as it is. */
export class PriceFileError extends Error {
  constructor(message: string, public readonly code = 'unreadable') {
    super(message)
    this.name = 'PriceFileError'
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

/** A spreadsheet's name for a column number (1 = A, 27 = AA, 16384 = XFD). */
export function columnLetters(n: number): string {
  let out = ''
  for (let k = n; k > 0; k = Math.floor((k - 1) / 26)) out = String.fromCharCode(65 + ((k - 1) % 26)) + out
  return out
}

/**
 * Refuses a row wider than PRICE_FILE_LIMITS.maxColumns before its cells are walked: one cell in column XFD would
 * otherwise make every row 16,384 cells for the checks to go through.
 */
export function assertRowWidth(width: number, rowNumber: number): void {
  const max = PRICE_FILE_LIMITS.maxColumns
  if (width <= max) return
  throw new PriceFileError(
    `Row ${rowNumber} has a cell in column ${columnLetters(width)}; a price file may use columns A to ${columnLetters(max)} (${max} columns). Delete what lies further right and upload it again.`,
    'too_many_columns',
  )
}
