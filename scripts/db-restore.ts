/**
 * npm run db:restore -- <file>: checks a backup (integrity_check, migrations table) and copies it into
 * DATABASE_URL with SQLite's online backup API, page by page inside SQLite's own locking: never a file copy.
 * On PostgreSQL: pg_restore of a dump made by db:backup (scripts/pg-tools.ts).
 */
import { existsSync } from 'node:fs'
import { resolve } from 'node:path'
import sqlite3 from 'sqlite3'
import { databaseUrl, dialectOfUrl, storageFromUrl } from '../server/utils/db'
import { pgRestore } from './pg-tools'

const file = process.argv[2]
if (!file) {
  console.error('Usage: npm run db:restore -- <file>')
  process.exit(2)
}
const src = resolve(file)
if (!existsSync(src)) {
  console.error(`No such backup file: ${src}`)
  process.exit(2)
}

if (dialectOfUrl(databaseUrl()) === 'postgres') {
  pgRestore(databaseUrl(), src)
  process.exit(0)
}

function all<T>(db: sqlite3.Database, sql: string): Promise<T[]> {
  return new Promise((res, rej) => db.all(sql, (e, rows) => (e ? rej(e) : res(rows as T[]))))
}

const check = new sqlite3.Database(src, sqlite3.OPEN_READONLY)
try {
  const integrity = await all<{ integrity_check: string }>(check, 'PRAGMA integrity_check')
  if (integrity[0]?.integrity_check !== 'ok') throw new Error(`integrity_check says: ${integrity.map((r) => r.integrity_check).join('; ')}`)
  const tables = await all<{ name: string }>(check, "SELECT name FROM sqlite_master WHERE type='table' AND name='schema_migrations'")
  if (!tables.length) throw new Error('it has no schema_migrations table, so it is not a Boreline database')
} catch (err) {
  console.error(`Not restoring ${src}: ${(err as Error).message}`)
  process.exit(1)
} finally {
  check.close()
}

const target = storageFromUrl(databaseUrl())
const db = new sqlite3.Database(target)
db.configure('busyTimeout', 10_000)
// filenameIsDest = false: copy from `src` into this (target) database
const backup = (db as unknown as { backup: (f: string, d: string, s: string, isDest: boolean, cb: (e: Error | null) => void) => { step: (n: number, cb: (e: Error | null) => void) => void; finish: (cb?: () => void) => void; completed: boolean; failed: boolean } })
  .backup(src, 'main', 'main', false, (err) => {
    if (err) {
      console.error(`Restore failed: ${err.message}`)
      process.exit(1)
    }
    backup.step(-1, (e) => {
      if (e || !backup.completed) {
        console.error(`Restore failed: ${e?.message ?? 'incomplete'}`)
        process.exit(1)
      }
      backup.finish(() => {
        db.close()
        console.log(`Restored ${src} -> ${target}`)
      })
    })
  })
