/**
 * Goods in at a branch (a supplier delivery booked by the counter): the units go on the shelf and, in the same
 * write transaction, fill the waiting back-orders there, oldest order first (back-orders.ts); the garages are
 * told after the commit. Audited.
 */
import type { User } from '../../models/accounts'
import { Branch } from '../../models/accounts'
import { Part, StockLevel } from '../../models/catalogue'
import { withWrite } from '../../utils/db'
import { audit } from '../../utils/audit'
import type { StockReceiptInput } from '../../../shared/schemas/orders'
import { orderReference } from '../../../shared/types/orders'
import { invalidInput } from '../errors'
import { allocateBackOrders, tellBackOrdersFilled } from './back-orders'
import type { ViewClock } from './clock'
import { runAfter } from './after-commit'
import { putStock } from './stock'

export interface StockReceipt {
  sku: string
  branch: string
  received: number
  /** on the shelf after the back-orders took theirs */
  onShelf: number
  filled: { orderReference: string; quantity: number }[]
}

export async function receiveStock(input: StockReceiptInput, actor: Pick<User, 'id'>, clock: ViewClock): Promise<StockReceipt> {
  const { receipt, filled } = await withWrite(async (t) => {
    const part = await Part.findOne({ where: { sku: input.sku.toUpperCase() }, transaction: t }) ?? await Part.findOne({ where: { sku: input.sku }, transaction: t })
    if (!part) throw invalidInput({ sku: `There is no part ${input.sku} in the catalogue.` })
    const branch = await Branch.findByPk(input.branchId, { transaction: t })
    if (!branch) throw invalidInput({ branchId: 'There is no such branch.' })
    await putStock(t, branch.id, part.id, input.quantity, clock.now)
    const filled = await allocateBackOrders(t, { partIds: [part.id], now: clock.now, timeZone: clock.timeZone })
    const shelf = await StockLevel.findOne({ where: { partId: part.id, branchId: branch.id }, transaction: t })
    await audit(t, {
      actorUserId: actor.id, organisationId: null, action: 'stock.received', entity: 'part', entityId: part.id,
      changes: { branch: branch.code, quantity: input.quantity, note: input.note, backOrdersFilled: filled.map((f) => f.lineId) },
    })
    return {
      filled,
      receipt: {
        sku: part.sku, branch: branch.name, received: input.quantity, onShelf: shelf?.quantity ?? 0,
        filled: filled.map((f) => ({ orderReference: orderReference(f.orderId), quantity: f.quantity })),
      },
    }
  })
  await runAfter(filled.length ? [() => tellBackOrdersFilled(filled)] : [])
  return receipt
}
