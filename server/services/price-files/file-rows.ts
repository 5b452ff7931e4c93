/**
 * What every reader of a price file gives (rows of text cells, a few hundred at a time, with the bytes read so
 * far) and the one error a problem with the file itself raises: its message is shown to the person as it is.
 * Plain Node: the rows worker bundle and the unit tests import this file.
 */

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
