/**
 * The one Sequelize instance (lazily created) and the write helper every write transaction goes through.
 * Plain Node: no Nitro auto-imports here, so scripts (migrate, seed, backup) can import it with tsx.
 *
 * SQLite has one writer. Measured on this stack, concurrent write transactions fail with SQLITE_BUSY or
 * stall for minutes even with WAL + busy_timeout; an in-process mutex around write transactions makes
 * them all succeed quickly. So every write runs inside `withWrite`, which serialises them in this process.
 */
import { AsyncLocalStorage } from 'node:async_hooks'
import { mkdirSync } from 'node:fs'
import { dirname, resolve } from 'node:path'
import { Mutex } from 'async-mutex'
import { Sequelize, Transaction } from 'sequelize'
import sqlite3 from 'sqlite3'

const BUSY_TIMEOUT_MS = 5000

/** sqlite3 with every connection configured the same way (Sequelize opens one per transaction). */
class ConfiguredDatabase extends sqlite3.Database {
  constructor(filename: string, mode?: number, callback?: (err: Error | null) => void) {
    super(filename, mode as number, callback as (err: Error | null) => void)
    this.configure('busyTimeout', BUSY_TIMEOUT_MS)
    this.run('PRAGMA journal_mode=WAL')
    this.run('PRAGMA synchronous=NORMAL')
    this.run('PRAGMA foreign_keys=ON')
    if (checkpointsInBackground) this.run('PRAGMA wal_autocheckpoint=0')
  }
}

// ------------------------------------------------------------------------------------------------ checkpoints
//
// By default the connection that commits past 1,000 WAL pages copies the WAL back into the database file (a
// checkpoint, with its fsyncs) before its COMMIT returns: a large write (a price file applied) then pays for it
// while the person waits. The server instead turns that off and checkpoints on its own connection shortly after
// writes (PASSIVE: never blocks readers or the next writer). Scripts keep SQLite's default.
let checkpointsInBackground = false
let checkpointDb: sqlite3.Database | undefined
let checkpointTimer: NodeJS.Timeout | undefined
const CHECKPOINT_DELAY_MS = 250

/** The server calls this once at start, before its first query. */
export function checkpointInBackground(): void {
  checkpointsInBackground = true
}

function scheduleCheckpoint(): void {
  if (!checkpointsInBackground || checkpointTimer) return
  checkpointTimer = setTimeout(() => {
    checkpointTimer = undefined
    const storage = storageFromUrl(databaseUrl())
    if (storage === ':memory:') return
    checkpointDb ??= new sqlite3.Database(storage)
    checkpointDb.run('PRAGMA wal_checkpoint(PASSIVE)', (err) => { if (err) console.error('[boreline] checkpoint:', err.message) })
  }, CHECKPOINT_DELAY_MS)
  checkpointTimer.unref?.()
}

/** Runs a checkpoint now and closes the checkpoint connection (shutdown). */
async function finalCheckpoint(): Promise<void> {
  clearTimeout(checkpointTimer)
  checkpointTimer = undefined
  const db = checkpointDb
  checkpointDb = undefined
  if (!db) return
  await new Promise<void>((res) => db.run('PRAGMA wal_checkpoint(PASSIVE)', () => db.close(() => res())))
}
const dialectModule = { ...sqlite3, Database: ConfiguredDatabase }

/** `sqlite:./data/boreline.sqlite` -> absolute path; `sqlite::memory:` -> ':memory:'. */
export function storageFromUrl(url: string): string {
  const m = /^sqlite:(.*)$/.exec(url.trim())
  if (!m) throw new Error(`DATABASE_URL must look like sqlite:./data/boreline.sqlite (got "${url}")`)
  const p = m[1]!.replace(/^\/\//, '')
  return p === ':memory:' ? p : resolve(p)
}

export function databaseUrl(): string {
  return process.env.DATABASE_URL || process.env.NUXT_DATABASE_URL || 'sqlite:./data/boreline.sqlite'
}

let instance: Sequelize | undefined

/** The lazily created Sequelize instance for `DATABASE_URL`. */
export function getDb(): Sequelize {
  if (instance) return instance
  const storage = storageFromUrl(databaseUrl())
  if (storage !== ':memory:') mkdirSync(dirname(storage), { recursive: true })
  instance = new Sequelize({
    dialect: 'sqlite',
    storage,
    dialectModule,
    // DB_LOG=1: every statement with its time in ms (diagnostics, benchmarks)
    logging: process.env.DB_LOG === '1' ? (sql: string, ms?: number) => console.log(`[db ${ms ?? '?'} ms] ${sql.slice(0, 300)}`) : false,
    benchmark: process.env.DB_LOG === '1',
    define: { underscored: true, timestamps: true },
    pool: { max: 1, min: 0, idle: 10_000 },
    retry: { max: 3 },
  })
  return instance
}

export async function closeDb(): Promise<void> {
  await finalCheckpoint()
  if (instance) await instance.close()
  instance = undefined
}

const writeMutex = new Mutex()
const currentTx = new AsyncLocalStorage<Transaction>()

/**
 * Runs `fn` in one IMMEDIATE write transaction, serialised with every other write in this process.
 * Nested calls join the outer transaction (so helpers can call each other without deadlocking).
 * Anything thrown rolls the whole transaction back.
 */
export async function withWrite<T>(fn: (t: Transaction) => Promise<T>): Promise<T> {
  const outer = currentTx.getStore()
  if (outer) return fn(outer)
  return writeMutex.runExclusive(async () => {
    try {
      return await getDb().transaction({ type: Transaction.TYPES.IMMEDIATE }, (t) => currentTx.run(t, () => fn(t)))
    } finally {
      scheduleCheckpoint()
      for (const listener of afterWriteListeners) listener()
    }
  })
}

const afterWriteListeners = new Set<() => void>()
/** Called after every write transaction ends (committed or rolled back), before the next one starts. */
export function afterEveryWrite(listener: () => void): void {
  afterWriteListeners.add(listener)
}

/** How many write transactions are queued or running (for diagnostics and the benchmarks). */
export function writeQueueBusy(): boolean {
  return writeMutex.isLocked()
}
