/**
 * POST /api/counter/orders/sweep -> SweepResult: runs now what the periodic sweep runs every few minutes
 * (checkouts paid or expired without their event reaching us, trade-account card payments likewise (counted in
 * `paid`), card orders never taken to checkout, refunds still to send). 401; 403 without `orders.work`.
 */
import { holdMinutesOf } from '../../../services/orders/rules'
import { sweepOrders } from '../../../services/payments/sweep'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'orders.work')
  return sweepOrders(serverFormats(), holdMinutesOf(useRuntimeConfig(event).orderHoldMinutes))
})
