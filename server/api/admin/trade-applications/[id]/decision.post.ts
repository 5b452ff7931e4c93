/**
 * POST /api/admin/trade-applications/:id/decision
 *   { decision: "approve", tierId, homeBranchId, terms: "card" | "account", creditLimitMinor?, paymentDays?, reason? }
 *   { decision: "reject", reason }
 * -> the updated TradeAccountDetail. Distributor admin only. 404 unknown garage; 409 when the application is no
 * longer pending (decided already, twice at once, or suspended); 422 for bad terms, an unknown tier or a missing or
 * unknown home branch (the branch that supplies the garage's orders).
 * The decision is audited; the garage is e-mailed after the commit either way.
 */
import { DecisionSchema, IdParamSchema } from '#shared/schemas/accounts'
import { garageOr404 } from '../../../../services/trade-accounts'
import { decideApplication } from '../../../../services/trade-applications'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'tradeAccounts.decide')
  const { id } = paramsWith(event, IdParamSchema)
  const body = await bodyWith(event, DecisionSchema)
  return decideApplication(await garageOr404(id, 'Application'), body, user.id)
})
