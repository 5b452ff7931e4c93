import { spawnSync } from 'node:child_process'
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join, resolve } from 'node:path'
import sqlite3 from 'sqlite3'
import { afterAll, describe, expect, it } from 'vitest'

const root = resolve(import.meta.dirname, '../../..')
const dir = mkdtempSync(join(tmpdir(), 'boreline-catalogue-seed-'))
const db = join(dir, 'seed.sqlite')
const seed = () => spawnSync('npx', ['tsx', 'scripts/db-seed.ts'], { cwd: root, env: { ...process.env, DATABASE_URL: `sqlite:${db}` }, encoding: 'utf8', timeout: 120_000 })
function one<T>(sql: string): Promise<T> {
  const d = new sqlite3.Database(db, sqlite3.OPEN_READONLY)
  return new Promise((res, rej) => d.get(sql, (e, row) => { d.close(); if (e) rej(e); else res(row as T) }))
}
const counts = () => one<Record<string, number>>(`SELECT (SELECT COUNT(*) FROM vehicles) AS vehicles, (SELECT COUNT(*) FROM vehicle_options) AS options,
  (SELECT COUNT(*) FROM vehicle_brakes) AS brakes, (SELECT COUNT(*) FROM parts) AS parts, (SELECT COUNT(*) FROM part_oe_numbers) AS oe,
  (SELECT COUNT(*) FROM supersessions) AS supersessions, (SELECT COUNT(*) FROM fitments) AS fitments, (SELECT COUNT(*) FROM stock_levels) AS stock,
  (SELECT COUNT(*) FROM price_versions) AS lists, (SELECT COUNT(*) FROM part_prices) AS prices`)
afterAll(() => rmSync(dir, { recursive: true, force: true }))

describe('catalogue seed in a database', () => {
  it('writes the catalogue with stock in both branches and one active price version', async () => {
    const r = seed()
    expect(r.status, r.stderr).toBe(0)
    expect(r.stdout).toMatch(/seed catalogue: 7 makes, \d+ vehicles, \d+ parts/)
    const c = await counts()
    expect(c.vehicles).toBeGreaterThanOrEqual(60)
    expect(c.parts).toBeGreaterThanOrEqual(600)
    expect(c.stock).toBe(c.parts * 2)
    expect(c.prices).toBe(c.parts)
    expect(await one('SELECT version, status FROM price_versions WHERE status = \'active\'')).toEqual({ version: 1, status: 'active' })
    expect((await one<{ n: number }>("SELECT COUNT(*) AS n FROM stock_levels s JOIN branches b ON b.id = s.branch_id WHERE s.quantity = 0 AND b.code = 'RVS'")).n).toBeGreaterThan(0)
    expect(await one("SELECT technicians_see_prices AS t FROM organisations WHERE name = 'Tannery Yard Autos'")).toEqual({ t: 1 })
    expect(await one("SELECT technicians_see_prices AS t FROM organisations WHERE name = 'Millbrook Motor Works'")).toEqual({ t: 0 })
  })

  it('changes nothing when run again', async () => {
    const before = await counts()
    const r = seed()
    expect(r.status, r.stderr).toBe(0)
    expect(r.stdout).toContain('new rows: 0 vehicles, 0 parts, 0 fitments')
    expect(await counts()).toEqual(before)
  })
})
