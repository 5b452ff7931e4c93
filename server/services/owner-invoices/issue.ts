/**
 * Issuing the garage's invoice to the owner once the job is signed off: what the owner approved, counted by the
 * quote's money rule (tax per line, per rate, discounts split across rates), numbered from the garage's own
 * series in the same transaction, then e-mailed with its PDF after the commit (a failed send is reported on the
 * invoice, never undoes it). One invoice per job.
 */
import { JobCard, OwnerInvoice } from '../../models/jobs'
import type { Quote } from '../../models/quotes'
import { withWrite } from '../../utils/db'
import { audit } from '../../utils/audit'
import type { OwnerInvoiceLine } from '../../../shared/types/owner-invoices'
import { conflict } from '../errors'
import { approvedFigures, hoursOf, linesOf } from '../quotes/rows'
import type { QuoteOutput } from '../quotes/document'
import { assertApproved } from '../jobs/job-card'
import { nextOwnerInvoiceNumber } from './numbering'
import { findOwnerInvoice } from './view'
import { mailOwnerInvoice } from './mail'

export async function issueOwnerInvoice(q: Quote, actorUserId: number, out: QuoteOutput): Promise<OwnerInvoice> {
  assertApproved(q)
  const id = await withWrite(async (t) => {
    const card = await JobCard.findOne({ where: { quoteId: q.id, organisationId: q.organisationId }, transaction: t })
    if (!card?.signedOffAt) throw conflict('Sign the job off on its job card before invoicing the owner.')
    const existing = await OwnerInvoice.findOne({ where: { quoteId: q.id, organisationId: q.organisationId }, attributes: ['id'], transaction: t })
    if (existing) throw conflict('This job has been invoiced already.', { invoiceId: existing.id })
    const lines = await linesOf(q.id, t)
    const figures = approvedFigures(lines)
    const byId = new Map(lines.map((l) => [l.id, l]))
    const invoiceLines: OwnerInvoiceLine[] = figures.lines.filter((f) => f.grossMinor !== 0).map((f) => {
      const l = byId.get(Number(f.id))
      return { description: l?.description ?? '', quantity: l?.quantity ?? 1, hours: l ? hoursOf(l) : null, netMinor: f.amountMinor, taxBp: f.taxBp, taxMinor: f.taxMinor, grossMinor: f.grossMinor }
    })
    const inv = await OwnerInvoice.create({
      organisationId: q.organisationId, quoteId: q.id, number: await nextOwnerInvoiceNumber(t, q.organisationId),
      ownerName: q.ownerName, ownerEmail: q.ownerEmail, lines: invoiceLines,
      taxByRate: figures.byRate.map((r) => ({ taxBp: r.taxBp, netMinor: r.netMinor, taxMinor: r.taxMinor })),
      netMinor: figures.netMinor, taxMinor: figures.taxMinor, grossMinor: figures.grossMinor, currency: out.formats.currency,
      issuedByUserId: actorUserId, issuedAt: new Date(),
    }, { transaction: t })
    await audit(t, { actorUserId, organisationId: q.organisationId, action: 'ownerInvoice.issue', entity: 'owner_invoice', entityId: inv.id, changes: { quoteId: q.id, number: inv.number, grossMinor: inv.grossMinor } })
    return inv.id
  })
  const inv = (await findOwnerInvoice(q.organisationId, id))!
  if (await mailOwnerInvoice(inv, q, out)) {
    await withWrite((t) => OwnerInvoice.update({ mailedAt: new Date() }, { where: { id }, transaction: t }))
    inv.mailedAt = new Date()
  }
  return inv
}
