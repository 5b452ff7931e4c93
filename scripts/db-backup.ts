/**
 * npm run db:backup -- <file>: a consistent copy of the (possibly running) database with VACUUM INTO.
 * Copying the .sqlite file while the server runs can lose committed rows (WAL), so this never does that.
 * On PostgreSQL: pg_dump's custom format (scripts/pg-tools.ts).
 */
import { existsSync, mkdirSync } from 'node:fs'
import { dirname, resolve } from 'node:path'
import sqlite3 from 'sqlite3'
import { databaseUrl, dialectOfUrl, storageFromUrl } from '../server/utils/db'
import { pgBackup } from './pg-tools'

const target = process.argv[2]
if (!target) {
  console.error('Usage: npm run db:backup -- <file>')
  process.exit(2)
}
const dest = resolve(target)
if (existsSync(dest)) {
  console.error(`Refusing to overwrite ${dest}: choose a new file name.`)
  process.exit(2)
}
if (dialectOfUrl(databaseUrl()) === 'postgres') {
  mkdirSync(dirname(dest), { recursive: true })
  pgBackup(databaseUrl(), dest)
  process.exit(0)
}
const source = storageFromUrl(databaseUrl())
if (!existsSync(source)) {
  console.error(`No database at ${source}.`)
  process.exit(2)
}
mkdirSync(dirname(dest), { recursive: true })
const db = new sqlite3.Database(source, sqlite3.OPEN_READONLY)
db.configure('busyTimeout', 10_000)
db.run('VACUUM INTO ?', [dest], (err) => {
  db.close()
  if (err) {
    console.error(`Backup failed: ${err.message}`)
    process.exit(1)
  }
  console.log(`Backed up ${source} -> ${dest}`)
})
