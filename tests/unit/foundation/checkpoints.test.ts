import { mkdtempSync, rmSync, statSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'

const dir = mkdtempSync(join(tmpdir(), 'boreline-checkpoint-'))
const file = join(dir, 'unit.sqlite')
process.env.DATABASE_URL = `sqlite:${file}`

const { getDb, closeDb, withWrite, checkpointInBackground } = await import('../../../server/utils/db')

const sizeOf = (p: string) => { try { return statSync(p).size } catch { return 0 } }

describe('WAL checkpoints in the server', () => {
  afterAll(async () => { await closeDb(); rmSync(dir, { recursive: true, force: true }) })

  // SQLite's documentation (sqlite.org/wal.html, "Automatic Checkpoint"): by default the connection whose COMMIT takes
  // the WAL past 1,000 pages copies it back into the database file before the COMMIT returns. The server turns that
  // off and checkpoints on its own connection shortly after each write.
  it('a large write returns before its pages are copied into the database file, and they are copied soon after', async () => {
    checkpointInBackground()
    await getDb().query('CREATE TABLE filler (id INTEGER PRIMARY KEY, pad TEXT NOT NULL)')
    await new Promise((r) => setTimeout(r, 600)) // the table's own checkpoint
    const before = sizeOf(file)
    await withWrite((t) => getDb().query(
      `WITH RECURSIVE n(i) AS (SELECT 1 UNION ALL SELECT i + 1 FROM n WHERE i < 40000) INSERT INTO filler (pad) SELECT printf('%0200d', i) FROM n`,
      { transaction: t },
    ))
    // ~10 MB written: all of it still in the WAL (SQLite's default would have checkpointed past 1,000 pages = 4 MB)
    expect(sizeOf(`${file}-wal`)).toBeGreaterThan(8_000_000)
    expect(sizeOf(file)).toBe(before)
    await expect.poll(() => sizeOf(file), { timeout: 5_000, interval: 50 }).toBeGreaterThan(before + 8_000_000)
    const [[row]] = await getDb().query('SELECT COUNT(*) AS n FROM filler') as [[{ n: number }], unknown]
    expect(row!.n).toBe(40_000)
  })
})
