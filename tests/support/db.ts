/**
 * Reading the e2e database from a test, whichever database the run uses (SQLite file or PostgreSQL): the
 * synchronous form through the command-line client (sqlite3 / psql), the asynchronous one through the driver.
 * Statements are written once; `?` placeholders are numbered for PostgreSQL.
 */
import { execFileSync } from 'node:child_process'
import pg from 'pg'
import sqlite3 from 'sqlite3'
import { quoteMixedCaseAliases } from '../../server/utils/db'
import { env } from './api'

export const onPostgres = (): boolean => env().databaseUrl.startsWith('postgres')

/** Rows of `sql`, read once with the database's command-line client (no driver left open). */
export function dbRowsSync<T = Record<string, unknown>>(sql: string): T[] {
  if (!onPostgres()) {
    const out = execFileSync('sqlite3', ['-readonly', '-json', env().dbPath, sql], { encoding: 'utf8' }).trim()
    return out ? JSON.parse(out) as T[] : []
  }
  const out = execFileSync('psql', ['-X', '-q', '-A', '-t', '-v', 'ON_ERROR_STOP=1', '-d', env().databaseUrl, '-c',
    `SELECT COALESCE(json_agg(t), '[]') FROM (${quoteMixedCaseAliases(sql)}) t`], { encoding: 'utf8' }).trim()
  return JSON.parse(out || '[]') as T[]
}

/** A read-only connection to the e2e database: `all(sql, params)` with `?` placeholders, then `close()`. */
export interface TestDb { all<T = Record<string, unknown>>(sql: string, params?: unknown[]): Promise<T[]>; close(): Promise<void> }

export function openTestDb(): TestDb {
  if (!onPostgres()) {
    const d = new sqlite3.Database(env().dbPath, sqlite3.OPEN_READONLY)
    return {
      all: <T>(sql: string, params: unknown[] = []) => new Promise<T[]>((res, rej) => d.all(sql, params, (e, rows) => (e ? rej(e) : res(rows as T[])))),
      close: () => new Promise<void>((res) => d.close(() => res())),
    }
  }
  // BIGINT (money, COUNT) and NUMERIC (SUM) as numbers, as the server reads them (server/utils/db.ts)
  const asNumber = (v: string) => Number(v)
  const types = { getTypeParser: ((oid: number, format?: 'text') => (oid === 20 || oid === 1700 ? asNumber : pg.types.getTypeParser(oid, format))) as typeof pg.types.getTypeParser }
  const pool = new pg.Pool({ connectionString: env().databaseUrl, max: 2, types })
  return {
    all: async <T>(sql: string, params: unknown[] = []) => {
      let n = 0
      return (await pool.query(quoteMixedCaseAliases(sql).replace(/\?/g, () => `$${++n}`), params)).rows as T[]
    },
    close: () => pool.end(),
  }
}

/** Rows of one statement through a connection opened for it. */
export async function dbAll<T = Record<string, unknown>>(sql: string, params: unknown[] = []): Promise<T[]> {
  const d = openTestDb()
  try { return await d.all<T>(sql, params) } finally { await d.close() }
}
