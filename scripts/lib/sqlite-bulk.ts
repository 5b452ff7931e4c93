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
export async function insertAll(db: sqlite3.Database, table: string, columns: string[], rows: Iterable<unknown[]>, chunk = 1000): Promise<number> {
  let n = 0
  let buf: string[] = []
  await run(db, 'BEGIN IMMEDIATE')
  const flush = async () => {
    if (!buf.length) return
    await run(db, `INSERT INTO ${table} (${columns.join(', ')}) VALUES ${buf.join(',')}`)
    buf = []
  }
  for (const r of rows) {
    buf.push(`(${r.map(esc).join(',')})`)
    n++
    if (buf.length >= chunk) await flush()
  }
  await flush()
  await run(db, 'COMMIT')
  return n
}
