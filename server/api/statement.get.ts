/**
 * GET /api/statement -> Statement: the caller's garage's ledger (orders, deposits, payments, refunds, credits,
 * core credits) with the running balance and, on account terms, what is left of the credit limit.
 * 401; 403 without `statement.view`.
 */
import { statementOf } from '../services/statement'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'statement.view')
  return statementOf(org.id)
})
