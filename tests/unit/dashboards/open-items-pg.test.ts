/**
 * The open items kept as the ledger is written against the statement's ageing, on PostgreSQL (open-items-scenario.ts):
 * the triggers there run as each transaction commits. Runs only when BORELINE_TEST_PG_URL names a server (it makes
 * and drops its own database).
 */
import { describe, it } from 'vitest'

const pgServer = process.env.BORELINE_TEST_PG_URL
if (pgServer) {
  const { freshPgDatabase } = await import('../../support/pg-database')
  const fresh = await freshPgDatabase(pgServer, `boreline_open_items_${process.pid}`)
  process.env.DATABASE_URL = fresh.url
  const { openItemsScenario } = await import('./open-items-scenario')
  await openItemsScenario(fresh.drop)
} else {
  describe.skip('open items on PostgreSQL (BORELINE_TEST_PG_URL not set)', () => { it('needs a server', () => {}) })
}
