/**
 * GET /api/admin/trade-applications?status=pending|approved|rejected|suspended|all&q=&sort=&page=&pageSize=
 * -> Page<TradeAccountSummary>. The queue defaults to pending, oldest first. Distributor admin only; 422 bad query.
 */
import { TradeAccountListQuerySchema } from '#shared/schemas/accounts'
import { listTradeAccounts } from '../../../services/trade-accounts'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'tradeAccounts.decide')
  const query = queryWith(event, TradeAccountListQuerySchema)
  return listTradeAccounts(query, { status: 'pending', sort: 'submitted' })
})
