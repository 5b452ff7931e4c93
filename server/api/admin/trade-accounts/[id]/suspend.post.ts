/**
 * POST /api/admin/trade-accounts/:id/suspend { reason } -> TradeAccountDetail. Approved -> suspended. Distributor
 * admin; 404 unknown; 409 when not approved; 422 without a reason. From the garage's next request on, every route
 * refuses its people with 403 (no new sign-in needed); they still read why on their status page. Audited, e-mailed.
 */
import { IdParamSchema, SuspendSchema } from '#shared/schemas/accounts'
import { garageOr404 } from '../../../../services/trade-accounts'
import { changeStanding } from '../../../../services/trade-account-changes'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'tradeAccounts.decide')
  const { id } = paramsWith(event, IdParamSchema)
  const { reason } = await bodyWith(event, SuspendSchema)
  return changeStanding(await garageOr404(id), { move: 'suspend', reason }, user.id)
})
