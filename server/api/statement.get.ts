/**
 * GET /api/statement[?month=YYYY-MM] -> Statement: the caller's garage's ledger (orders, deposits, payments,
 * refunds, credits, core credits, payments received) with the running balance and, on account terms, what is
 * left of the credit limit; with `month`, that month's entries and the balances brought in and carried out. Also, over
 * the whole ledger: `openItems` (charges not yet paid in full, payments settling the oldest first, each with its due
 * day from the garage's payment days), `ageing` { current, d1_30, d31_60, d61_90, over90 } (minor units), `asOf` and
 * the account `stop` (reasons and the amount that clears it).
 * A suspended garage may still read it (to settle what it owes). 401; 403 without `statement.view`; 422 (`data.fields.month`) for a malformed month.
 */
import { StatementQuerySchema } from '#shared/schemas/orders'
import { statementOf } from '../services/statement'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'statement.view', { allowSuspended: true })
  const { month } = queryWith(event, StatementQuerySchema)
  return statementOf(org.id, month, serverFormats(), requestClock(event))
})
