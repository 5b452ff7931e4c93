/**
 * POST /api/admin/trade-accounts/:id/reactivate { note? } -> TradeAccountDetail. Suspended -> approved.
 * Distributor admin; 404 unknown; 409 when not suspended. Audited, e-mailed.
 */
import { IdParamSchema, ReactivateSchema } from '#shared/schemas/accounts'
import { garageOr404 } from '../../../../services/trade-accounts'
import { changeStanding } from '../../../../services/trade-account-changes'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'tradeAccounts.decide')
  const { id } = paramsWith(event, IdParamSchema)
  const { note } = await bodyWith(event, ReactivateSchema)
  return changeStanding(await garageOr404(id), { move: 'reactivate', note }, user.id)
})
