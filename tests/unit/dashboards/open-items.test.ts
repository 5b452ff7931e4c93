/** The open items kept as the ledger is written against the statement's ageing, on SQLite (open-items-scenario.ts). */
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'

const dir = mkdtempSync(join(tmpdir(), 'boreline-open-items-'))
process.env.DATABASE_URL = `sqlite:${join(dir, 'unit.sqlite')}`
const { openItemsScenario } = await import('./open-items-scenario')
await openItemsScenario(async () => rmSync(dir, { recursive: true, force: true }))
