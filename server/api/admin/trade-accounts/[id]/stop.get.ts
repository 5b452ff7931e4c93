/**
 * GET /api/admin/trade-accounts/:id/stop -> AccountStop: whether the garage may order on account now, every reason
 * it may not, the amount that clears the stop and any lift in force. Distributor staff (403 otherwise); 404 unknown
 * or not a garage.
 */
import { IdParamSchema } from '#shared/schemas/accounts'
import { garageOr404 } from '../../../../services/trade-accounts'
import { accountStopOf } from '../../../../services/account-stop'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'tradeAccounts.view')
  const { id } = paramsWith(event, IdParamSchema)
  return accountStopOf(await garageOr404(id), requestClock(event), serverFormats())
})
