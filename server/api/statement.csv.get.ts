/**
 * GET /api/statement.csv[?month=YYYY-MM] -> the statement as a CSV download (formula-like cells neutralised; a month
 * starts with the balance brought forward). 401; 403 without `statement.view`; 422 for a malformed month.
 */
import { StatementQuerySchema } from '#shared/schemas/orders'
import { statementCsv, statementOf } from '../services/statement'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'statement.view')
  const { month } = queryWith(event, StatementQuerySchema)
  const csv = statementCsv(await statementOf(org.id, month))
  const day = month ?? new Date().toISOString().slice(0, 10)
  setResponseHeaders(event, {
    'content-type': 'text/csv; charset=utf-8',
    'content-disposition': `attachment; filename="statement-${day}.csv"`,
    'x-content-type-options': 'nosniff',
    'cache-control': 'private, no-store',
  })
  return csv
})
