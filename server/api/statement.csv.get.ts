/**
 * GET /api/statement.csv -> the statement as a CSV download (formula-like cells neutralised).
 * 401; 403 without `statement.view`.
 */
import { statementCsv, statementOf } from '../services/statement'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'statement.view')
  const csv = statementCsv(await statementOf(org.id))
  const day = new Date().toISOString().slice(0, 10)
  setResponseHeaders(event, {
    'content-type': 'text/csv; charset=utf-8',
    'content-disposition': `attachment; filename="statement-${day}.csv"`,
    'x-content-type-options': 'nosniff',
    'cache-control': 'private, no-store',
  })
  return csv
})
