/**
 * Idempotency keys for the calls we make to the payment service, derived from our own records (id and creation
 * time, so a database that starts again from id 1 never reuses one): a retried call never charges or refunds twice.
 */
import type { CoreReturn, Order } from '../../models/orders'
import type { PartReturn } from '../../models/counter'

export const orderKey = (o: Pick<Order, 'id' | 'createdAt'>) => `boreline-order-${o.id}-${o.createdAt.getTime()}`

export const coreReturnKey = (cr: Pick<CoreReturn, 'id' | 'createdAt'>) => `boreline-core-return-${cr.id}-${cr.createdAt.getTime()}`

export const returnKey = (r: Pick<PartReturn, 'id' | 'createdAt'>) => `boreline-return-${r.id}-${r.createdAt.getTime()}`
