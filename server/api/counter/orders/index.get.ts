/**
 * GET /api/counter/orders?branchId=&status=&page=&pageSize= -> Page<OrderSummary> (with garage) & { branches, branch }
 * The branch's order queue for counter staff: by default everything still to be worked (confirmed, picking,
 * dispatched), oldest first; the branch defaults to the caller's home branch.
 * 401; 403 without `orders.work`; 422 bad query.
 */
import { CounterOrderListQuerySchema } from '#shared/schemas/orders'
import { counterQueue } from '../../../services/orders/lists'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'orders.work')
  const query = queryWith(event, CounterOrderListQuerySchema)
  return counterQueue(org.homeBranchId, query)
})
