/** Raw bulk writes for the synthetic-data scripts: values escaped for SQLite, multi-row INSERTs in one transaction. */
import type sqlite3 from 'sqlite3'

export const esc = (v: unknown): string => {
  if (v === null || v === undefined) return 'NULL'
  if (typeof v === 'number') return Number.isFinite(v) ? String(v) : 'NULL'
  if (typeof v === 'boolean') return v ? '1' : '0'
  return `'${String(v).replace(/'/g, "''")}'`
}

export function run(db: sqlite3.Database, sql: string): Promise<void> {
  return new Promise((res, rej) => db.exec(sql, (e) => (e ? rej(e) : res())))
}
export function all<T>(db: sqlite3.Database, sql: string): Promise<T[]> {
  return new Promise((res, rej) => db.all(sql, (e, rows) => (e ? rej(e) : res(rows as T[]))))
}

/** Inserts rows in multi-row statements of `chunk` rows inside one transaction. */
export function insertAll(db: sqlite3.Database, table: string, columns: string[], rows: Iterable<unknown[]>, chunk = 1000): Promise<number> {
  return insertRows((sql) => run(db, sql), esc, 'BEGIN IMMEDIATE', table, columns, rows, chunk)
}

/**
 * The multi-row INSERT loop, for any database: `exec` runs one statement, `escape` writes one value as that
 * database's literal, `begin` opens the transaction the rows go in.
 */
export async function insertRows(
  exec: (sql: string) => Promise<unknown>, escape: (v: unknown) => string, begin: string,
  table: string, columns: string[], rows: Iterable<unknown[]>, chunk: number,
): Promise<number> {
  let n = 0
  let buf: string[] = []
  await exec(begin)
  const flush = async () => {
    if (!buf.length) return
    await exec(`INSERT INTO ${table} (${columns.join(', ')}) VALUES ${buf.join(',')}`)
    buf = []
  }
  for (const r of rows) {
    buf.push(`(${r.map(escape).join(',')})`)
    n++
    if (buf.length >= chunk) await flush()
  }
  await flush()
  await exec('COMMIT')
  return n
}
