/** An owner invoice as the garage reads it (and the PDF draws it): lines, tax per rate, paid and due. */
import { OwnerInvoice, OwnerInvoicePayment } from '../../models/jobs'
import type { OwnerInvoiceView } from '../../../shared/types/owner-invoices'
import { ownerInvoiceReference } from './numbering'

/** One of the garage's invoices with its payments, or null (another garage's, or none). */
export function findOwnerInvoice(organisationId: number, id: number): Promise<OwnerInvoice | null> {
  return OwnerInvoice.findOne({ where: { id, organisationId }, include: [{ model: OwnerInvoicePayment, as: 'payments' }], order: [[{ model: OwnerInvoicePayment, as: 'payments' }, 'id', 'ASC']] })
}

export function ownerInvoiceView(inv: OwnerInvoice): OwnerInvoiceView {
  const payments = inv.payments ?? []
  const paidMinor = payments.reduce((s, p) => s + p.amountMinor, 0)
  return {
    id: inv.id, number: inv.number, reference: ownerInvoiceReference(inv.number), quoteId: inv.quoteId,
    ownerName: inv.ownerName, ownerEmail: inv.ownerEmail, lines: inv.lines, taxByRate: inv.taxByRate,
    netMinor: inv.netMinor, taxMinor: inv.taxMinor, grossMinor: inv.grossMinor, paidMinor, dueMinor: Math.max(0, inv.grossMinor - paidMinor),
    currency: inv.currency, issuedAt: inv.issuedAt.toISOString(), mailed: !!inv.mailedAt,
    payments: payments.map((p) => ({ id: p.id, method: p.method, amountMinor: p.amountMinor, reference: p.reference ?? '', at: p.createdAt.toISOString() })),
  }
}
