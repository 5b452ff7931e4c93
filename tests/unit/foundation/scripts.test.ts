import { spawnSync } from 'node:child_process'
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join, resolve } from 'node:path'
import sqlite3 from 'sqlite3'
import { afterAll, describe, expect, it } from 'vitest'

const root = resolve(import.meta.dirname, '../../..')
const dir = mkdtempSync(join(tmpdir(), 'boreline-scripts-'))
const db = join(dir, 'ops.sqlite')
const env = { ...process.env, DATABASE_URL: `sqlite:${db}` }
const run = (script: string, args: string[]) =>
  spawnSync('npx', ['tsx', `scripts/${script}.ts`, ...args], { cwd: root, env, encoding: 'utf8', timeout: 60_000 })

function query<T>(file: string, sql: string): Promise<T[]> {
  const d = new sqlite3.Database(file, sqlite3.OPEN_READONLY)
  return new Promise((res, rej) => d.all(sql, (e, rows) => { d.close(); if (e) rej(e); else res(rows as T[]) }))
}

afterAll(() => rmSync(dir, { recursive: true, force: true }))

describe('user:create', () => {
  const good = ['--email', 'first.admin@example.test', '--name', 'First Admin', '--role', 'distributor_admin', '--password', 'a-long-enough-secret']

  it('creates distributor staff on a fresh install', () => {
    const r = run('user-create', good)
    expect(r.status, r.stderr).toBe(0)
    expect(r.stdout).toContain('Created distributor_admin first.admin@example.test')
  })

  it.each([
    [['--email', 'not-an-email', '--name', 'X Y', '--role', 'counter_staff', '--password', 'a-long-enough-secret'], /valid e-mail/],
    [['--email', 'b@example.test', '--name', 'Bea Bell', '--role', 'counter_staff', '--password', 'short'], /at least 10 characters/],
    [['--email', 'c@example.test', '--name', 'C C', '--role', 'garage_manager', '--password', 'a-long-enough-secret'], /--role must be distributor_admin or counter_staff/],
    [['--email', 'd@example.test', '--role', 'counter_staff', '--password', 'a-long-enough-secret'], /--name is required/],
    [['--bogus', 'x'], /Unknown option/],
  ])('refuses bad input %#', async (args, message) => {
    const r = run('user-create', args as string[])
    expect(r.status).toBe(1)
    expect(r.stderr).toMatch(message)
  })

  it('refuses a duplicate e-mail and stores nothing more', async () => {
    const r = run('user-create', good)
    expect(r.status).toBe(1)
    expect(r.stderr).toMatch(/already exists/)
    const rows = await query<{ n: number }>(db, 'SELECT COUNT(*) AS n FROM users')
    expect(rows[0]!.n).toBe(1)
  })
})

describe('db:backup and db:restore', () => {
  it('copies the database consistently and puts it back after checking it', async () => {
    const backup = join(dir, 'copy.sqlite')
    const b = run('db-backup', [backup])
    expect(b.status, b.stderr).toBe(0)
    expect(existsSync(backup)).toBe(true)
    expect((await query<{ n: number }>(backup, 'SELECT COUNT(*) AS n FROM users'))[0]!.n).toBe(1)
    // change the live database, then restore the copy over it
    expect(run('user-create', ['--email', 'second@example.test', '--name', 'Second One', '--role', 'counter_staff', '--password', 'another-long-secret']).status).toBe(0)
    expect((await query<{ n: number }>(db, 'SELECT COUNT(*) AS n FROM users'))[0]!.n).toBe(2)
    const r = run('db-restore', [backup])
    expect(r.status, r.stderr).toBe(0)
    expect((await query<{ n: number }>(db, 'SELECT COUNT(*) AS n FROM users'))[0]!.n).toBe(1)
  })

  it('refuses to overwrite a backup, and refuses to restore a file that is not a Boreline database', () => {
    const existing = join(dir, 'exists.sqlite')
    writeFileSync(existing, 'x')
    expect(run('db-backup', [existing]).stderr).toMatch(/Refusing to overwrite/)
    const junk = join(dir, 'junk.sqlite')
    writeFileSync(junk, 'this is not sqlite')
    const r = run('db-restore', [junk])
    expect(r.status).toBe(1)
    expect(r.stderr).toMatch(/Not restoring/)
  })
})
