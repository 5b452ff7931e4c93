/**
 * POST /api/counter/stock-receipts { sku, branchId, quantity, note? } -> { sku, branch, received, onShelf, filled }
 * Goods in from the supplier at a branch: the units go on the shelf and fill the back-orders waiting there, oldest
 * order first (whole lines); their garages are e-mailed. 401; 403 without `orders.work`; 422 unknown part or branch.
 */
import { StockReceiptSchema } from '#shared/schemas/orders'
import { receiveStock } from '../../services/orders/stock-receipts'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'orders.work')
  const input = await bodyWith(event, StockReceiptSchema)
  return receiveStock(input, user, requestClock(event))
})
