/**
 * GET /api/health -> { status: "ok", database: "ok", migrations: <count applied> }
 * 503 with a reason when the database cannot be reached. Public: it reveals nothing else.
 */
import { getDb } from '../utils/db'

export default defineEventHandler(async (event) => {
  try {
    await databaseReady()
    await getDb().query('SELECT 1')
    const migrations = await appliedMigrationCount()
    return { status: 'ok', database: 'ok', migrations }
  } catch (err) {
    setResponseStatus(event, 503)
    return { status: 'unavailable', database: 'error', reason: (err as Error)?.message ?? String(err) }
  }
})
