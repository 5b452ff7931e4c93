/**
 * The counter decides a booked core return: accepted returns the deposit with its tax (a credit note against the
 * invoice that charged it, credited on the ledger; for a card order also refunded to the card after the commit;
 * on the quote the order came from, the refund due to the vehicle owner when the garage passed the deposit on),
 * rejected keeps it with the reason. The garage is e-mailed either way.
 */
import type { Transaction } from 'sequelize'
import { Organisation, type User } from '../../models/accounts'
import { CoreReturn, LedgerEntry, Order, OrderLine } from '../../models/orders'
import { IssuedDocument } from '../../models/counter'
import { withWrite } from '../../utils/db'
import { audit } from '../../utils/audit'
import { orderReference, type CoreReturnView } from '../../../shared/types/orders'
import type { Formats } from '../../../shared/utils/format'
import { conflict, notFound } from '../errors'
import { runAfter, type After } from '../orders/after-commit'
import { mailCoreReturn } from '../orders/mail'
import { coreReturnView } from '../orders/views'
import { issueCoreRefund } from '../payments/refunds'
import { recordOwnerCoreRefunds } from '../quotes/core-refunds'
import { shareOfTax } from '../../../shared/utils/order-totals'
import { creditOf, creditable } from '../documents/creditable'
import { issueCreditNote } from '../documents/issue'
import { systemClock, type ViewClock } from '../orders/clock'

/**
 * The deposit of `quantity` old units with its tax, as a credit note against the invoice that charged it; an order
 * sent before invoices were issued is credited by the deposit and its share of the line's stated deposit tax.
 */
async function creditDeposit(t: Transaction, row: CoreReturn, quantity: number, clock: ViewClock, fmt: Formats): Promise<{ amount: number; note: IssuedDocument | null }> {
  const line = row.line!
  const invoice = line.dispatchId ? await IssuedDocument.findOne({ where: { dispatchId: line.dispatchId, kind: 'invoice' }, transaction: t }) : null
  const left = invoice ? await creditable(t, invoice.id, line.id, 'core_deposit') : null
  if (!invoice || !left) {
    return { amount: row.depositUnitMinor * quantity + shareOfTax(line.depositTaxMinor ?? 0, Math.min(quantity, line.quantity), line.quantity), note: null }
  }
  const note = await issueCreditNote(t, {
    invoice, order: row.order!, reason: 'core', pieces: [creditOf(left, quantity)], now: clock.now,
    notes: [`${quantity} old unit${quantity === 1 ? '' : 's'} for ${line.sku} accepted: the deposit and its VAT come back.`],
  }, fmt)
  return { amount: note.totalMinor, note }
}

export interface Decision { status: 'accepted' | 'rejected'; reason: string }

export async function decideCoreReturn(id: number, decision: Decision, actor: Pick<User, 'id'>, fmt: Formats, clock: ViewClock = systemClock(fmt.timeZone)): Promise<CoreReturnView> {
  const { status, reason } = decision
  const after: After = []
  await withWrite(async (t) => {
    const row = await CoreReturn.findByPk(id, { include: [{ model: Order, as: 'order' }, { model: OrderLine, as: 'line' }], transaction: t })
    if (!row || !row.order) throw notFound('Core return')
    if (row.status !== 'booked') {
      throw conflict(row.status === 'expected' ? 'The garage has not booked this old unit back yet.' : 'This core return has already been decided.')
    }
    row.status = status
    row.decidedAt = clock.now
    row.decidedByUserId = actor.id
    row.reason = reason || null
    if (status === 'accepted') {
      const quantity = row.quantityBooked ?? row.quantityExpected
      const { amount: credit, note } = await creditDeposit(t, row, quantity, clock, fmt)
      row.creditedMinor = credit
      row.creditNoteId = note?.id ?? null
      await LedgerEntry.create({
        organisationId: row.organisationId, orderId: row.orderId, coreReturnId: row.id, kind: 'core_credit', amountMinor: -credit,
        reference: orderReference(row.orderId), description: `${note ? `Credit note ${note.reference}: old` : 'Old'} unit accepted: ${quantity} x ${row.line?.sku ?? ''}`.trim(),
      }, { transaction: t })
      // a deposit the garage passed on to a vehicle owner is now theirs to get back
      await recordOwnerCoreRefunds(t, { order: row.order, sku: row.line?.sku ?? '', quantity, actorUserId: actor.id })
      if (row.order.paymentMethod === 'card' && credit > 0) {
        row.refundPending = true
        after.push(() => issueCoreRefund(row.id))
      }
    }
    await row.save({ transaction: t })
    await audit(t, { actorUserId: actor.id, organisationId: row.organisationId, action: `core_return.${status}`, entity: 'core_return', entityId: row.id, changes: { reason, creditedMinor: row.creditedMinor } })
    after.push(() => mailCoreReturn(row.id, fmt))
  })
  await runAfter(after)
  const cr = await CoreReturn.findByPk(id, { include: [{ model: OrderLine, as: 'line' }, { model: Organisation, as: 'organisation', attributes: ['name'] }] })
  const note = cr?.creditNoteId ? await IssuedDocument.findByPk(cr.creditNoteId, { attributes: ['id', 'reference'] }) : null
  return coreReturnView(cr!, cr!.line, cr!.organisation?.name, note ? { id: note.id, reference: note.reference } : null)
}
