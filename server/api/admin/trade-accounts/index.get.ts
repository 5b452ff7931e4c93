/**
 * GET /api/admin/trade-accounts?status=approved|suspended|pending|rejected|all&q=&sort=&page=&pageSize=
 * -> Page<TradeAccountSummary>. Every garage by default, by name. Distributor staff (counter staff read terms
 * when working orders; only the admin changes them); 422 bad query.
 */
import { TradeAccountListQuerySchema } from '#shared/schemas/accounts'
import { listTradeAccounts } from '../../../services/trade-accounts'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'tradeAccounts.view')
  const query = queryWith(event, TradeAccountListQuerySchema)
  return listTradeAccounts(query, { status: 'all', sort: 'name' })
})
