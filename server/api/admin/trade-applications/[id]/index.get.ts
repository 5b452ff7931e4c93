/**
 * GET /api/admin/trade-applications/:id -> TradeAccountDetail (application fields, proof document, applicant,
 * decision history). Distributor admin only; 404 when no garage has this id.
 */
import { IdParamSchema } from '#shared/schemas/accounts'
import { garageOr404, tradeAccountDetail } from '../../../../services/trade-accounts'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'tradeAccounts.decide')
  const { id } = paramsWith(event, IdParamSchema)
  return tradeAccountDetail(await garageOr404(id, 'Application'))
})
