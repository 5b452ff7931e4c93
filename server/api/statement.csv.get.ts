/**
 * GET /api/statement.csv[?month=YYYY-MM] -> the statement as a CSV download (formula-like cells neutralised; a month
 * starts with the balance brought forward). A suspended garage may still read it. 401; 403 without `statement.view`; 422 for a malformed month.
 */
import { StatementQuerySchema } from '#shared/schemas/orders'
import { statementCsv, statementFileName, statementOf } from '../services/statement'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'statement.view', { allowSuspended: true })
  const { month } = queryWith(event, StatementQuerySchema)
  const csv = statementCsv(await statementOf(org.id, month, serverFormats(), requestClock(event)))
  return sendDownload(event, csv, { name: statementFileName(month), type: 'text/csv; charset=utf-8' })
})
