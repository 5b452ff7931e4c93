/**
 * GET /api/statement[?month=YYYY-MM] -> Statement: the caller's garage's ledger (orders, deposits, payments,
 * refunds, credits, core credits, payments received) with the running balance and, on account terms, what is
 * left of the credit limit; with `month`, that month's entries and the balances brought in and carried out.
 * 401; 403 without `statement.view`; 422 (`data.fields.month`) for a malformed month.
 */
import { StatementQuerySchema } from '#shared/schemas/orders'
import { statementOf } from '../services/statement'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'statement.view')
  const { month } = queryWith(event, StatementQuerySchema)
  return statementOf(org.id, month, serverFormats())
})
