/**
 * POST /api/orders  { quoteId?, lines?: [{ sku, quantity }], branchId?, payment: "card" | "account", garageReference? }
 * Header `Idempotency-Key` (optional): the same key returns the order it already made (200) instead of a second one.
 * Prices at the garage's current net prices, reserves stock in the same transaction, and for `account` checks the
 * credit limit. -> 201 OrderDetail (card orders then go to POST /api/orders/:id/checkout).
 * 401 signed out; 403 not a garage manager or the account is not active; 404 quote not the caller's;
 * 402 over the credit limit (names limit and balance); 409 "Only N left…", quote not approved or already ordered;
 * 422 with `data.fields`.
 */
import { IdempotencyKeySchema, OrderCreateSchema } from '#shared/schemas/orders'
import { submitOrder } from '../../services/orders/place'

export default defineEventHandler(async (event) => {
  const { user, org } = requireAbility(event, 'orders.place')
  const rawKey = getRequestHeader(event, 'idempotency-key')
  const key = rawKey === undefined ? null : parseWith(IdempotencyKeySchema, rawKey)
  const input = await bodyWith(event, OrderCreateSchema)
  const { order, replayed } = await submitOrder(org.id, user, input, key, serverFormats())
  setResponseStatus(event, replayed ? 200 : 201)
  if (replayed) setResponseHeader(event, 'Idempotent-Replayed', 'true')
  return order
})
