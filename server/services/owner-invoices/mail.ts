/** E-mails the owner the garage's invoice as a PDF (after the commit; false when it could not be sent). */
import { Organisation } from '../../models/accounts'
import type { OwnerInvoice } from '../../models/jobs'
import type { Quote } from '../../models/quotes'
import type { QuoteOutput } from '../quotes/document'
import { ownerInvoicePdf, ownerInvoicePdfName } from './document'
import { ownerInvoiceReference } from './numbering'

export async function mailOwnerInvoice(inv: OwnerInvoice, q: Quote, out: QuoteOutput): Promise<boolean> {
  const [org, pdf] = await Promise.all([Organisation.findByPk(inv.organisationId), ownerInvoicePdf(inv, q, out)])
  const garage = org?.name ?? 'Your garage'
  const reference = ownerInvoiceReference(inv.number)
  return out.sendMail({
    to: inv.ownerEmail,
    subject: `Invoice ${reference} from ${garage}${q.registration ? ` for ${q.registration}` : ''}`,
    text: [
      `Hello ${inv.ownerName},`,
      '',
      `Thank you: the work on your ${q.vehicleLabel}${q.registration ? ` (${q.registration})` : ''} is done and has been checked.`,
      `Invoice ${reference} is attached: ${out.formats.money(inv.grossMinor)} including tax.`,
      '',
      `${garage}${org?.phone ? ` · ${org.phone}` : ''}`,
    ].join('\n'),
    attachments: [{ filename: ownerInvoicePdfName(inv), content: pdf, contentType: 'application/pdf' }],
  })
}
