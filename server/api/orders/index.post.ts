/**
 * POST /api/orders  { quoteId?, lines?: [{ sku, quantity, fulfilment? }], branchId?, fulfilment?: "ship_available" |
 *   "wait_for_all", collect?, payment: "card" | "account", garageReference? }
 * Header `Idempotency-Key` (optional): the same key returns the order it already made (200) instead of a second one.
 * Prices at the garage's current net prices from its home branch unless `branchId` names another; a line short on
 * the shelf is split (transfer from another branch, or back-order from the supplier) rather than refused. Holds
 * the stock in the same transaction, and for `account` checks the credit limit. Card orders are charged in full
 * at checkout, back-ordered lines included. -> 201 OrderDetail (card orders then go to POST /api/orders/:id/checkout).
 * 401 signed out; 403 not a garage manager or the account is not active; 404 quote not the caller's;
 * 402 over the credit limit (names limit and balance); 409 quote not approved or already ordered; 422 with `data.fields`.
 */
import { IdempotencyKeySchema, OrderCreateSchema } from '#shared/schemas/orders'
import { submitOrder } from '../../services/orders/place'

export default defineEventHandler(async (event) => {
  const { user, org } = requireAbility(event, 'orders.place')
  const rawKey = getRequestHeader(event, 'idempotency-key')
  const key = rawKey === undefined ? null : parseWith(IdempotencyKeySchema, rawKey)
  const input = await bodyWith(event, OrderCreateSchema)
  const { order, replayed } = await submitOrder(org.id, user, input, key, serverFormats(), requestNow(event))
  setResponseStatus(event, replayed ? 200 : 201)
  if (replayed) setResponseHeader(event, 'Idempotent-Replayed', 'true')
  return order
})
