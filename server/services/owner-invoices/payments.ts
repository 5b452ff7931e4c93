/** Payments the garage takes at the desk against its invoice to the owner (cash, card on its own terminal, transfer). */
import { OwnerInvoicePayment, type OwnerInvoice } from '../../models/jobs'
import { withWrite } from '../../utils/db'
import { audit } from '../../utils/audit'
import type { OwnerPaymentInput } from '../../../shared/schemas/jobs'
import { invalidInput } from '../errors'

export async function recordOwnerPayment(inv: OwnerInvoice, actorUserId: number, input: OwnerPaymentInput): Promise<void> {
  await withWrite(async (t) => {
    const paid = (await OwnerInvoicePayment.sum('amountMinor', { where: { ownerInvoiceId: inv.id }, transaction: t })) || 0
    const due = inv.grossMinor - paid
    if (input.amountMinor > due) throw invalidInput({ amountMinor: due > 0 ? 'That is more than is still due on the invoice.' : 'This invoice is paid in full.' })
    const p = await OwnerInvoicePayment.create({ ownerInvoiceId: inv.id, method: input.method, amountMinor: input.amountMinor, reference: input.reference, recordedByUserId: actorUserId }, { transaction: t })
    await audit(t, { actorUserId, organisationId: inv.organisationId, action: 'ownerInvoice.payment', entity: 'owner_invoice', entityId: inv.id, changes: { payment: p.id, method: p.method, amountMinor: p.amountMinor } })
  })
}
