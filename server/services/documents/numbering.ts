/**
 * Document numbers without gaps, per series (INV, CRN), unique under any number of concurrent issues.
 *
 * How: a counter row per series (`document_series.next_number`), read and advanced with a guarded UPDATE
 * (`… WHERE next_number = :read`) inside the same write transaction that inserts the document. Why this and not
 * a unique index with retry: a number is only ever taken by a transaction that also writes its document, so a
 * failure after taking it rolls the counter back with it and the number is used by the next issue: no gaps.
 * With an index and MAX(number) + 1 the same holds, but concurrent issuers collide and must retry; here the
 * writers queue instead (SQLite has one writer, through `withWrite`; PostgreSQL locks the counter row), and the
 * guard turns any unexpected interleaving into an error rather than a duplicate. UNIQUE (series, number) on
 * `documents` is the last line of defence. Plain Node.
 */
import { QueryTypes, type Transaction } from 'sequelize'
import { getDb } from '../../utils/db'
import { changedRows, forUpdate } from '../../utils/sql'

export type Series = 'INV' | 'CRN'

/** "INV-000042". */
export function documentReference(series: Series, number: number): string {
  return `${series}-${String(number).padStart(6, '0')}`
}

/** Takes the next number of the series inside the caller's write transaction. */
export async function takeNumber(t: Transaction, series: Series): Promise<number> {
  // PostgreSQL: the row stays locked until this transaction ends, so a concurrent issuer waits for the next number
  const [row] = await getDb().query<{ next: number }>(`SELECT next_number AS next FROM document_series WHERE series = :series${forUpdate()}`,
    { replacements: { series }, type: QueryTypes.SELECT, transaction: t })
  if (!row) throw new Error(`document series ${series} is missing`)
  const changed = await changedRows('UPDATE document_series SET next_number = next_number + 1 WHERE series = :series AND next_number = :n',
    { replacements: { series, n: row.next }, transaction: t })
  if (changed !== 1) throw new Error(`document series ${series} moved while numbering: the write was not serialised`)
  return Number(row.next)
}
