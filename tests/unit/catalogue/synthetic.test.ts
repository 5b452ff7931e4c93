import { spawnSync } from 'node:child_process'
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join, resolve } from 'node:path'
import sqlite3 from 'sqlite3'
import { afterAll, describe, expect, it } from 'vitest'

const root = resolve(import.meta.dirname, '../../..')
const dir = mkdtempSync(join(tmpdir(), 'boreline-synthetic-'))
const db = join(dir, 'syn.sqlite')
const run = (args: string[]) => spawnSync('npx', ['tsx', 'scripts/catalogue-synthetic.ts', ...args], { cwd: root, env: { ...process.env, DATABASE_URL: '' }, encoding: 'utf8', timeout: 120_000 })
function query<T>(sql: string): Promise<T[]> {
  const d = new sqlite3.Database(db, sqlite3.OPEN_READONLY)
  return new Promise((res, rej) => d.all(sql, (e, rows) => { d.close(); if (e) rej(e); else res(rows as T[]) }))
}
afterAll(() => rmSync(dir, { recursive: true, force: true }))

describe('catalogue:synthetic', () => {
  it('writes the asked-for numbers of parts, vehicles and fitments with valid rows around them', async () => {
    const r = run(['--parts', '2000', '--vehicles', '200', '--fitments', '5000', '--database', db])
    expect(r.status, r.stderr).toBe(0)
    const [c] = await query<{ parts: number; vehicles: number; fitments: number; prices: number; stock: number; rev: number }>(`SELECT
      (SELECT COUNT(*) FROM parts WHERE sku LIKE 'SY-%') AS parts, (SELECT COUNT(*) FROM vehicles WHERE make NOT IN (SELECT make FROM vehicles WHERE id <= 75)) AS vehicles,
      (SELECT COUNT(*) FROM fitments f JOIN parts p ON p.id = f.part_id WHERE p.sku LIKE 'SY-%') AS fitments,
      (SELECT COUNT(*) FROM part_prices pr JOIN parts p ON p.id = pr.part_id WHERE p.sku LIKE 'SY-%') AS prices,
      (SELECT COUNT(*) FROM stock_levels s JOIN parts p ON p.id = s.part_id WHERE p.sku LIKE 'SY-%') AS stock,
      (SELECT catalogue FROM catalogue_revisions) AS rev`)
    expect(c).toMatchObject({ parts: 2000, vehicles: 200, fitments: 5000, prices: 2000, stock: 4000 })
    expect(c!.rev).toBeGreaterThan(0)
    // the triggers the load turned off are back after it: the catalogue revisions (7 catalogue tables and stock, insert,
    // update and delete: 24) and the part-search change log (parts, OE numbers, supersessions: 9)
    const [t] = await query<{ rev: number; search: number }>(`SELECT
      (SELECT COUNT(*) FROM sqlite_master WHERE type = 'trigger' AND (name GLOB '*_rev_insert' OR name GLOB '*_rev_update' OR name GLOB '*_rev_delete')) AS rev,
      (SELECT COUNT(*) FROM sqlite_master WHERE type = 'trigger' AND name GLOB '*_search_*') AS search`)
    expect(t).toEqual({ rev: 24, search: 9 })
  })

  it('refuses to write twice into the same database and explains bad options', () => {
    const again = run(['--parts', '10', '--vehicles', '2', '--fitments', '5', '--database', db])
    expect(again.status).toBe(1)
    expect(again.stderr).toMatch(/already holds 2000 synthetic parts/)
    expect(run(['--parts', 'many', '--database', db]).stderr).toMatch(/--parts needs a whole number/)
    expect(run(['--parts', '10']).stderr).toMatch(/--database/)
  })
})
