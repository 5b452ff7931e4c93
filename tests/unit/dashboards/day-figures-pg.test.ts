/**
 * The day figures kept as orders and lines are written, on PostgreSQL (day-figures-scenario.ts): the triggers there
 * run as each transaction commits. Runs only when BORELINE_TEST_PG_URL names a server (it makes and drops its own
 * database).
 */
import { describe, it } from 'vitest'

const pgServer = process.env.BORELINE_TEST_PG_URL
if (pgServer) {
  const { freshPgDatabase } = await import('../../support/pg-database')
  const fresh = await freshPgDatabase(pgServer, `boreline_day_figures_${process.pid}`)
  process.env.DATABASE_URL = fresh.url
  const { dayFiguresScenario } = await import('./day-figures-scenario')
  await dayFiguresScenario(fresh.drop)
} else {
  describe.skip('day figures on PostgreSQL (BORELINE_TEST_PG_URL not set)', () => { it('needs a server', () => {}) })
}
