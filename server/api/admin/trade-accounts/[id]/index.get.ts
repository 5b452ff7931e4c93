/**
 * GET /api/admin/trade-accounts/:id -> TradeAccountDetail (terms, people, document; the history for those who
 * read the audit log). Distributor staff; 404 unknown or not a garage.
 */
import { IdParamSchema } from '#shared/schemas/accounts'
import { can } from '#shared/utils/abilities'
import { garageOr404, tradeAccountDetail } from '../../../../services/trade-accounts'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'tradeAccounts.view')
  const { id } = paramsWith(event, IdParamSchema)
  return tradeAccountDetail(await garageOr404(id), can(user.role, 'audit.view'))
})
