/** The order lists, a page at a time: a garage's own orders (newest first) and a branch's queue for the counter. */
import { Op, type Order as OrderBy, type WhereOptions } from 'sequelize'
import { Branch, Organisation } from '../../models/accounts'
import { Order, OrderLine } from '../../models/orders'
import { pageOf } from '../../utils/page'
import type { CounterOrderListQuery, OrderListQuery } from '../../../shared/schemas/orders'
import type { BranchView, OrderSummary } from '../../../shared/types/orders'
import type { PageQuery } from '../../../shared/schemas/page'
import type { Page } from '../../../shared/types/page'
import { branchView, orderSummary } from './views'

/** Everything the counter still has to work on. */
const OPEN_STATUSES = ['confirmed', 'picking', 'dispatched']
const NEWEST_FIRST: OrderBy = [['createdAt', 'DESC'], ['id', 'DESC']]

function orderPage(query: PageQuery, where: WhereOptions<Order>, order: OrderBy, withGarage: boolean): Promise<Page<OrderSummary>> {
  return pageOf(query, (window) => Order.findAndCountAll({
    where,
    include: [
      { model: Branch, as: 'branch' },
      ...(withGarage ? [{ model: Organisation, as: 'organisation', attributes: ['id', 'name'] }] : []),
      { model: OrderLine, as: 'lines', attributes: ['id'] },
    ],
    order,
    distinct: true,
    ...window,
  }), (rows) => rows.map((o) => orderSummary(o)))
}

export function garageOrders(organisationId: number, query: OrderListQuery): Promise<Page<OrderSummary>> {
  return orderPage(query, { organisationId, ...(query.status ? { status: query.status } : {}) }, NEWEST_FIRST, false)
}

export interface CounterQueue extends Page<OrderSummary> { branches: BranchView[]; branch: BranchView | null }

/** The branch's orders (the caller's home branch unless chosen): still to be worked oldest first, or one state newest first. */
export async function counterQueue(homeBranchId: number | null | undefined, query: CounterOrderListQuery): Promise<CounterQueue> {
  const branches = await Branch.findAll({ order: [['name', 'ASC']] })
  const branch = branches.find((b) => b.id === (query.branchId ?? homeBranchId)) ?? branches[0]
  if (!branch) return { data: [], meta: { page: 1, pageSize: query.pageSize, total: 0, pages: 1 }, branches: [], branch: null }
  const open = query.status === 'open'
  const page = await orderPage(
    query, { branchId: branch.id, status: open ? { [Op.in]: OPEN_STATUSES } : query.status },
    open ? [['createdAt', 'ASC'], ['id', 'ASC']] : NEWEST_FIRST, true,
  )
  return { ...page, branches: branches.map(branchView), branch: branchView(branch) }
}
