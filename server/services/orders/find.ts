/** Loading an order with what its views need, scoped to the caller: another garage's order is a 404. */
import type { Transaction, WhereOptions } from 'sequelize'
import { Branch, Organisation } from '../../models/accounts'
import { CoreReturn, Order, OrderLine } from '../../models/orders'
import { notFound } from '../errors'

export const orderIncludes = () => [
  { model: OrderLine, as: 'lines' },
  { model: Branch, as: 'branch' },
  { model: CoreReturn, as: 'coreReturns' },
]

async function findOrder(where: WhereOptions<Order>, withGarage: boolean, t?: Transaction): Promise<Order> {
  const include = withGarage ? [...orderIncludes(), { model: Organisation, as: 'organisation' }] : orderIncludes()
  const order = await Order.findOne({ where, include, transaction: t })
  if (!order) throw notFound('Order')
  return order
}

/** The caller's own order, or 404 (another garage's order is reported exactly like a missing one). */
export function findGarageOrder(organisationId: number, id: number, t?: Transaction): Promise<Order> {
  return findOrder({ id, organisationId }, false, t)
}

/** Any order, with its garage (distributor staff). */
export function findAnyOrder(id: number, t?: Transaction): Promise<Order> {
  return findOrder({ id }, true, t)
}

/** An order as the caller may see it: `organisationId` null for distributor staff (any order), else the garage's own. */
export function findVisibleOrder(id: number, organisationId: number | null): Promise<Order> {
  return organisationId === null ? findAnyOrder(id) : findGarageOrder(organisationId, id)
}
