/**
 * GET /api/orders?status=&page=  -> { data: OrderSummary[], meta: { page, pageSize, total } }
 * The caller's garage's orders, newest first. 401; 403 not a garage manager; 422 bad query.
 */
import { OrderListQuerySchema } from '#shared/schemas/orders'
import { Branch } from '../../models/accounts'
import { Order, OrderLine } from '../../models/orders'
import { orderSummary } from '../../services/orders'

const PAGE_SIZE = 25

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'orders.place')
  const query = queryWith(event, OrderListQuerySchema)
  const where = { organisationId: org.id, ...(query.status ? { status: query.status } : {}) }
  const { rows, count } = await Order.findAndCountAll({
    where,
    include: [{ model: Branch, as: 'branch' }, { model: OrderLine, as: 'lines', attributes: ['id'] }],
    order: [['createdAt', 'DESC'], ['id', 'DESC']],
    limit: PAGE_SIZE,
    offset: (query.page - 1) * PAGE_SIZE,
    distinct: true,
  })
  return { data: rows.map((o) => orderSummary(o)), meta: { page: query.page, pageSize: PAGE_SIZE, total: count } }
})
