/** GET /api/admin/trade-accounts/:id -> TradeAccountDetail (terms, people, document, history). Distributor staff; 404 unknown. */
import { IdParamSchema } from '#shared/schemas/accounts'
import { can } from '#shared/utils/abilities'
import { findGarage, tradeAccountDetail } from '../../../../services/trade-accounts'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'tradeAccounts.view')
  const { id } = paramsWith(event, IdParamSchema)
  const org = await findGarage(id)
  if (!org) throw notFound('Trade account')
  return tradeAccountDetail(org, can(user.role, 'audit.view'))
})
