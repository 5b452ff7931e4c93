import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { QueryTypes, type Transaction } from 'sequelize'

const dir = mkdtempSync(join(tmpdir(), 'boreline-db-'))
process.env.DATABASE_URL = `sqlite:${join(dir, 'unit.sqlite')}`

const { getDb, closeDb, foreignKeysChecked, withWrite, storageFromUrl } = await import('../../../server/utils/db')
const { migrateUp, appliedMigrationCount, pendingMigrationCount } = await import('../../../server/utils/migrate')
const { migrations } = await import('../../../server/migrations/index')

describe('database layer', () => {
  beforeAll(async () => { await migrateUp(getDb()) })
  afterAll(async () => { await closeDb(); rmSync(dir, { recursive: true, force: true }) })

  it('applies every migration to an empty database, and a second run changes nothing', async () => {
    expect(await appliedMigrationCount()).toBe(migrations.length)
    const schemaBefore = await getDb().query("SELECT name, sql FROM sqlite_master ORDER BY name", { plain: false, raw: true })
    expect(await migrateUp(getDb())).toEqual([])
    expect(await pendingMigrationCount()).toBe(0)
    const schemaAfter = await getDb().query("SELECT name, sql FROM sqlite_master ORDER BY name", { plain: false, raw: true })
    expect(schemaAfter).toEqual(schemaBefore)
  })

  it('runs with WAL, foreign keys and a busy timeout on every connection', async () => {
    const [[mode]] = await getDb().query('PRAGMA journal_mode') as [[{ journal_mode: string }], unknown]
    expect(mode!.journal_mode).toBe('wal')
    // inside a transaction Sequelize opens its own connection: it must be configured the same way
    await withWrite(async (t) => {
      const fk = await getDb().query<{ foreign_keys: number }>('PRAGMA foreign_keys', { transaction: t, type: QueryTypes.SELECT })
      expect(fk[0]!.foreign_keys).toBe(1)
      const busy = await getDb().query<{ timeout: number }>('PRAGMA busy_timeout', { transaction: t, type: QueryTypes.SELECT })
      expect(busy[0]!.timeout).toBeGreaterThanOrEqual(1000)
    })
  })

  it('checks no foreign keys only in the one transaction that proves its own references, and nowhere after it', async () => {
    const checked = (t?: Transaction) => getDb().query<{ foreign_keys: number }>('PRAGMA foreign_keys', { transaction: t, type: QueryTypes.SELECT }).then((r) => r[0]!.foreign_keys)
    const parent = `SELECT 1 FROM price_versions WHERE id = 999999` // no such version: a price row naming it points nowhere
    expect(await getDb().query(parent, { type: QueryTypes.SELECT })).toEqual([])
    await withWrite(async (t) => {
      expect(await checked(t)).toBe(0)
      expect(await foreignKeysChecked(t)).toBe(false)
    }, { referencesProvedByCaller: true })
    // the next transactions, the statements outside one, and a write that breaks a reference are checked again
    await withWrite(async (t) => { expect(await checked(t)).toBe(1); expect(await foreignKeysChecked(t)).toBe(true) })
    expect(await checked()).toBe(1)
    await getDb().query(`INSERT INTO parts (sku, type, description, created_at, updated_at) VALUES ('FK-UNIT-1', 'disc', 'Unit test disc', '2026-01-01', '2026-01-01')`)
    await expect(withWrite((t) => getDb().query(
      `INSERT INTO part_prices (part_id, list_price_minor, price_version_id) SELECT id, 100, 999999 FROM parts WHERE sku = 'FK-UNIT-1'`, { transaction: t },
    ))).rejects.toThrow(/FOREIGN KEY/)
  })

  it('serialises concurrent write transactions: 50 parallel increments all land (no SQLITE_BUSY)', async () => {
    await getDb().query('CREATE TABLE IF NOT EXISTS counter (id INTEGER PRIMARY KEY, n INTEGER NOT NULL)')
    await withWrite((t) => getDb().query('INSERT OR REPLACE INTO counter (id, n) VALUES (1, 0)', { transaction: t }))
    await Promise.all(Array.from({ length: 50 }, () => withWrite(async (t) => {
      const [[row]] = await getDb().query('SELECT n FROM counter WHERE id = 1', { transaction: t }) as [[{ n: number }], unknown]
      await new Promise((r) => setTimeout(r, 1)) // a read-modify-write that would lose updates if interleaved
      await getDb().query('UPDATE counter SET n = ? WHERE id = 1', { replacements: [row!.n + 1], transaction: t })
    })))
    const [[row]] = await getDb().query('SELECT n FROM counter WHERE id = 1') as [[{ n: number }], unknown]
    expect(row!.n).toBe(50)
  })

  it('rolls the whole transaction back when the work throws, and joins nested calls', async () => {
    await expect(withWrite(async (t) => {
      await getDb().query('UPDATE counter SET n = 999 WHERE id = 1', { transaction: t })
      await withWrite(async (inner) => { expect(inner).toBe(t) })
      throw new Error('simulated failure')
    })).rejects.toThrow('simulated failure')
    const [[row]] = await getDb().query('SELECT n FROM counter WHERE id = 1') as [[{ n: number }], unknown]
    expect(row!.n).toBe(50)
  })

  it('reads DATABASE_URL in the documented form and refuses others', () => {
    expect(storageFromUrl('sqlite::memory:')).toBe(':memory:')
    expect(storageFromUrl('sqlite:./data/x.sqlite')).toMatch(/\/data\/x\.sqlite$/)
    expect(() => storageFromUrl('postgres://x')).toThrow(/DATABASE_URL/)
  })
})
