/**
 * POST /api/admin/trade-accounts/:id/stop-lift { reason, days } -> 201 AccountStop: lets the garage order on account
 * despite a stop until the end of the day `days` from today (at most BORELINE_STOP_LIFT_MAX_DAYS), saying why;
 * audited. The stop comes back by itself when the lift ends, and ends by itself when the garage pays.
 * Distributor admin only (403 otherwise); 404 unknown or not a garage; 422 with `data.fields`.
 */
import { IdParamSchema } from '#shared/schemas/accounts'
import { StopLiftSchema } from '#shared/schemas/money-owed'
import { liftStop } from '../../../../services/account-stop'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'tradeAccounts.decide')
  const { id } = paramsWith(event, IdParamSchema)
  const body = await bodyWith(event, StopLiftSchema)
  const out = await liftStop(id, body, user.id, requestClock(event), serverFormats())
  setResponseStatus(event, 201)
  return out
})
