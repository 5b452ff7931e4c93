/**
 * The counter receives returned parts and decides: all accepted, part accepted (with the reason the garage reads),
 * or none. What is accepted is credited on a credit note against the invoice that charged it, never more than it
 * charged (documents/creditable.ts): the parts with their tax; for an exchange part whose old unit was still only
 * expected, its deposit with its tax too (no old unit will come for a part sent back); less the restocking charge
 * fixed when the garage asked. Wrong and unneeded parts go back on the branch's shelf (where older back-orders may
 * take them); a faulty part is a warranty claim the distributor settles with its supplier, so it does not. The
 * credit lands on the ledger; a card order's is refunded to the card after the commit.
 */
import type { Transaction } from 'sequelize'
import type { User } from '../../models/accounts'
import { CoreReturn, LedgerEntry, Order, OrderLine } from '../../models/orders'
import { IssuedDocument, PartReturn } from '../../models/counter'
import { withWrite } from '../../utils/db'
import { audit } from '../../utils/audit'
import type { ReturnDecisionInput } from '../../../shared/schemas/returns'
import { orderReference } from '../../../shared/types/orders'
import { returnReference, type ReturnView } from '../../../shared/types/returns'
import type { Formats } from '../../../shared/utils/format'
import { divRoundHalfUp } from '../../../shared/utils/money'
import { conflict, invalidInput, notFound } from '../errors'
import { creditOf, creditable, type CreditPiece } from '../documents/creditable'
import { issueCreditNote } from '../documents/issue'
import { runAfter, type After } from '../orders/after-commit'
import { allocateBackOrders, tellBackOrdersFilled } from '../orders/back-orders'
import type { ViewClock } from '../orders/clock'
import { putStock } from '../orders/stock'
import { issueReturnRefund } from '../payments/refunds'
import { mailReturnDecision } from './mail'
import { findVisibleReturn, returnView } from './views'

type Piece = Omit<CreditPiece, 'orderLineId'> & { orderLineId: number | null }

/** The restocking charge as a line that takes from the credit: its share of the parts' net and of their tax. */
function restockingPiece(part: CreditPiece, bp: number): Piece {
  const net = divRoundHalfUp(part.netMinor * bp, 10_000)
  const tax = divRoundHalfUp(part.taxMinor * bp, 10_000)
  return {
    orderLineId: part.orderLineId, kind: 'restocking', sku: part.sku, description: `Restocking charge, ${bp / 100} % of the parts credited`,
    quantity: 1, unitMinor: -net, netMinor: -net, taxBp: part.taxBp, taxMinor: -tax,
  }
}

/** The deposit of the parts sent back, when their old units were still only expected (fewer now are). */
async function depositPiece(t: Transaction, invoiceId: number, line: OrderLine, quantity: number): Promise<CreditPiece | null> {
  if (line.coreDepositUnitMinor <= 0) return null
  const core = await CoreReturn.findOne({ where: { orderLineId: line.id }, transaction: t })
  if (!core || core.status !== 'expected' || core.quantityExpected < quantity) return null
  const left = await creditable(t, invoiceId, line.id, 'core_deposit')
  if (!left || left.quantity < quantity) return null
  if (core.quantityExpected === quantity) core.status = 'void'
  else core.quantityExpected -= quantity
  await core.save({ transaction: t })
  return creditOf(left, quantity)
}

async function accept(t: Transaction, r: PartReturn, quantity: number, reason: string, clock: ViewClock, fmt: Formats, after: After): Promise<void> {
  const line = (await OrderLine.findByPk(r.orderLineId, { transaction: t }))!
  const order = (await Order.findByPk(r.orderId, { transaction: t }))!
  const invoice = (await IssuedDocument.findByPk(r.invoiceId, { transaction: t }))!
  const left = await creditable(t, invoice.id, line.id, 'part')
  if (!left) throw conflict('The invoice for this part does not charge it: please check the order.')
  const part = creditOf(left, quantity)
  const pieces: Piece[] = [part]
  const deposit = await depositPiece(t, invoice.id, line, quantity)
  if (deposit) pieces.push(deposit)
  if (r.restockingBp > 0) pieces.push(restockingPiece(part, r.restockingBp))
  const warranty = r.reason === 'faulty'
  const note = await issueCreditNote(t, {
    invoice, order, reason: warranty ? 'warranty' : 'return', pieces, now: clock.now,
    notes: [
      `${quantity} of ${r.quantity} x ${line.sku} accepted back (return ${returnReference(r.id)}).${reason ? ` ${reason}` : ''}`,
      order.paymentMethod === 'card' ? 'Refunded to the card the order was paid with.' : 'Credited to your trade account.',
    ],
  }, fmt)
  await LedgerEntry.create({
    organisationId: r.organisationId, orderId: r.orderId, kind: 'return_credit', amountMinor: -note.totalMinor, reference: orderReference(r.orderId),
    description: `Credit note ${note.reference}: ${quantity} x ${line.sku} ${warranty ? 'warranty claim settled' : 'returned'}`.slice(0, 300),
  }, { transaction: t })
  r.set({ status: quantity === r.quantity ? 'accepted' : 'part_accepted', acceptedQuantity: quantity, creditedMinor: note.totalMinor, creditNoteId: note.id })
  if (order.paymentMethod === 'card' && order.paymentIntentId && note.totalMinor > 0) {
    r.refundPending = true
    after.push(() => issueReturnRefund(r.id))
  }
  if (!warranty) {
    await putStock(t, order.branchId, line.partId, quantity, clock.now)
    const filled = await allocateBackOrders(t, { partIds: [line.partId], now: clock.now, timeZone: clock.timeZone })
    if (filled.length) after.push(() => tellBackOrdersFilled(filled))
  }
}

export async function decideReturn(id: number, input: ReturnDecisionInput, actor: Pick<User, 'id'>, clock: ViewClock, fmt: Formats): Promise<ReturnView> {
  const after: After = []
  await withWrite(async (t) => {
    const r = await PartReturn.findByPk(id, { transaction: t })
    if (!r) throw notFound('Return')
    if (r.status !== 'requested') throw conflict('This return has already been decided.')
    const quantity = input.status === 'rejected' ? 0 : input.quantity ?? r.quantity
    if (quantity > r.quantity) throw invalidInput({ quantity: `Only ${r.quantity} came back on this return.` })
    if (input.status === 'accepted' && quantity < r.quantity && input.reason.length < 3) {
      throw invalidInput({ reason: `Say why only ${quantity} of the ${r.quantity} are accepted (the garage reads this).` })
    }
    r.set({ decisionReason: input.reason || null, decidedAt: clock.now, decidedByUserId: actor.id })
    if (input.status === 'rejected') r.set({ status: 'rejected', acceptedQuantity: 0 })
    else await accept(t, r, quantity, input.reason, clock, fmt, after)
    await r.save({ transaction: t })
    await audit(t, {
      actorUserId: actor.id, organisationId: r.organisationId, action: `return.${r.status}`, entity: 'part_return', entityId: r.id,
      changes: { accepted: r.acceptedQuantity, of: r.quantity, reason: input.reason, creditedMinor: r.creditedMinor ?? null },
    })
    after.unshift(() => mailReturnDecision(r.id, fmt))
  })
  await runAfter(after)
  return returnView(await findVisibleReturn(id, null))
}
