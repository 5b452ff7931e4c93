/**
 * GET /api/counter/orders?branchId=&status=&page= -> { data: OrderSummary[] (with garage), meta, branches }
 * The branch's order queue for counter staff: by default everything still to be worked (confirmed, picking,
 * dispatched), oldest first; the branch defaults to the distributor's home branch.
 * 401; 403 without `orders.work`; 422 bad query.
 */
import { Op } from 'sequelize'
import { CounterOrderListQuerySchema } from '#shared/schemas/orders'
import { Branch, Organisation } from '../../../models/accounts'
import { Order, OrderLine } from '../../../models/orders'
import { branchView, orderSummary } from '../../../services/orders'

const PAGE_SIZE = 50

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'orders.work')
  const query = queryWith(event, CounterOrderListQuerySchema)
  const branches = await Branch.findAll({ order: [['name', 'ASC']] })
  const branch = branches.find((b) => b.id === (query.branchId ?? org.homeBranchId)) ?? branches[0]
  if (!branch) return { data: [], meta: { page: 1, pageSize: PAGE_SIZE, total: 0 }, branches: [], branch: null }
  const status = query.status === 'open' ? { [Op.in]: ['confirmed', 'picking', 'dispatched'] } : query.status
  const { rows, count } = await Order.findAndCountAll({
    where: { branchId: branch.id, status },
    include: [
      { model: Branch, as: 'branch' },
      { model: Organisation, as: 'organisation', attributes: ['id', 'name'] },
      { model: OrderLine, as: 'lines', attributes: ['id'] },
    ],
    order: query.status === 'open' ? [['createdAt', 'ASC'], ['id', 'ASC']] : [['createdAt', 'DESC'], ['id', 'DESC']],
    limit: PAGE_SIZE,
    offset: (query.page - 1) * PAGE_SIZE,
    distinct: true,
  })
  return {
    data: rows.map((o) => orderSummary(o)),
    meta: { page: query.page, pageSize: PAGE_SIZE, total: count },
    branches: branches.map(branchView),
    branch: branchView(branch),
  }
})
