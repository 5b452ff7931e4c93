/**
 * GET /api/admin/trade-accounts/:id/open-items[?page=&pageSize=] -> Page<OpenItem>: what the garage still owes, item
 * by item, oldest first (what the admin allocates a payment to). Distributor staff (403 otherwise); 404 unknown or not
 * a garage; 422 bad paging.
 */
import { IdParamSchema } from '#shared/schemas/accounts'
import { PageQuerySchema } from '#shared/schemas/page'
import { garageOr404 } from '../../../../services/trade-accounts'
import { owedNow } from '../../../../services/account-stop'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'tradeAccounts.view')
  const { id } = paramsWith(event, IdParamSchema)
  const query = queryWith(event, PageQuerySchema)
  const { items } = await owedNow(await garageOr404(id), requestClock(event))
  return pageOfList(query, items)
})
