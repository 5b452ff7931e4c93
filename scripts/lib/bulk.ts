/**
 * Raw bulk writes on either database, for scripts/catalogue-synthetic.ts: SQLite through sqlite3 (./sqlite-bulk.ts),
 * PostgreSQL through one `pg` client. Values are written as literals (booleans as 1/0 on SQLite, true/false on
 * PostgreSQL); each insertAll is one transaction of multi-row INSERTs.
 */
import pg from 'pg'
import sqlite3 from 'sqlite3'
import { all, esc, insertAll, insertRows, run } from './sqlite-bulk'

export interface Bulk {
  postgres: boolean
  run(sql: string): Promise<void>
  all<T>(sql: string): Promise<T[]>
  insertAll(table: string, columns: string[], rows: Iterable<unknown[]>, chunk?: number): Promise<number>
  close(): Promise<void>
}

/** A PostgreSQL literal: strings with quotes doubled (standard_conforming_strings is on by default since 9.1). */
export const pgEsc = (v: unknown): string => (typeof v === 'boolean' ? (v ? 'true' : 'false') : esc(v))

export async function openBulk(databaseUrl: string, sqlitePath: () => string): Promise<Bulk> {
  if (databaseUrl.startsWith('postgres')) {
    const client = new pg.Client({ connectionString: databaseUrl })
    await client.connect()
    const exec = async (sql: string) => { await client.query(sql) }
    return {
      postgres: true,
      run: exec,
      all: async <T>(sql: string) => (await client.query(sql)).rows as T[],
      insertAll: (table, columns, rows, chunk = 1000) => insertRows(exec, pgEsc, 'BEGIN', table, columns, rows, chunk),
      close: () => client.end(),
    }
  }
  const db = new sqlite3.Database(sqlitePath())
  return {
    postgres: false,
    run: (sql) => run(db, sql),
    all: <T>(sql: string) => all<T>(db, sql),
    insertAll: (table, columns, rows, chunk) => insertAll(db, table, columns, rows, chunk),
    close: () => new Promise<void>((res) => db.close(() => res())),
  }
}
