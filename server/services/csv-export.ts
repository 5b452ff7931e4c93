/**
 * The one way Boreline writes a CSV file people open in a spreadsheet: csv-stringify with `escape_formulas` (a cell
 * starting with = + - @ tab or CR gets a leading ', the OWASP "CSV injection" advice), and also a cell starting with
 * `;`, which a spreadsheet reading semicolon-separated files takes as the start of a new cell. Numbers are left alone.
 * Plain Node.
 */
import { stringify, type Options } from 'csv-stringify/sync'

const LEADING_SEPARATOR = /^[;\uFF1B]/

export function safeCsv(records: unknown[], options: Options = {}): string {
  return stringify(records as never[], {
    ...options,
    escape_formulas: true,
    cast: { ...options.cast, string: (value: string) => (LEADING_SEPARATOR.test(value) ? `'${value}` : value) },
  })
}
