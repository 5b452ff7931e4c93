/**
 * The day figures kept as orders and lines are written, on SQLite (day-figures-scenario.ts; the same on PostgreSQL
 * in day-figures-pg.test.ts).
 */
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'

const dir = mkdtempSync(join(tmpdir(), 'boreline-day-figures-'))
process.env.DATABASE_URL = `sqlite:${join(dir, 'day-figures.sqlite')}`
const { dayFiguresScenario } = await import('./day-figures-scenario')
await dayFiguresScenario(async () => rmSync(dir, { recursive: true, force: true }))
