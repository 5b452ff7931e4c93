/**
 * GET /api/statement.pdf[?month=YYYY-MM] -> the statement as a PDF download, the same figures as the screen and the
 * CSVs (terms, stop, ageing, open items with due days, entries with the running balance). A suspended garage may
 * still read it. 401; 403 without `statement.view`; 422 for a malformed month.
 */
import { StatementQuerySchema } from '#shared/schemas/orders'
import { statementFileName } from '../services/statement'
import { statementPdfOf } from '../services/statement-pdf'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'statement.view', { allowSuspended: true })
  const { month } = queryWith(event, StatementQuerySchema)
  const pdf = await statementPdfOf(org.id, month, serverFormats(), await pdfFonts(), requestClock(event))
  return sendDownload(event, pdf, { name: statementFileName(month).replace(/\.csv$/, '.pdf'), type: 'application/pdf' })
})
