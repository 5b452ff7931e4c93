/**
 * An invoice or a credit note as a PDF, on the one layout (server/services/pdf/document.ts), printed from what was
 * stored when it was issued: both parties with their tax numbers, the date of issue and the tax point, each line
 * with its rate and tax, the tax analysed per rate, the totals, and the notes (payment terms, what happens to the
 * deposits). Plain Node.
 */
import { orderReference } from '../../../shared/types/orders'
import { CREDIT_REASON_LABELS, type DocumentDetail } from '../../../shared/types/documents'
import type { Formats } from '../../../shared/utils/format'
import type { PdfFonts } from '../pdf/document'
import { addressAndFacts, letterheadPage, note, table } from '../orders/paperwork'

const percent = (bp: number) => `${bp / 100} %`
/** A calendar day as stored (YYYY-MM-DD), read at midday so no time zone moves it to another day. */
const calendarDay = (d: string) => `${d}T12:00:00Z`

export function documentPdf(d: DocumentDetail, fmt: Formats, fonts: PdfFonts): Promise<Buffer> {
  const m = fmt.money
  const credit = d.kind === 'credit_note'
  const page = letterheadPage(fonts, {
    seller: d.seller.name, title: d.kindLabel, reference: d.reference, dated: `Issued ${fmt.day(d.issuedAt)}`, subject: d.buyer.name,
    contact: [d.seller.address, d.seller.taxNumber ? `VAT no. ${d.seller.taxNumber}` : '', d.branch ? `Sent from ${d.branch}` : ''],
  })
  const facts: [string, string][] = [
    ['Date of issue', fmt.day(d.issuedAt)],
    ['Tax point', fmt.day(calendarDay(d.taxPoint))],
    ['Order', orderReference(d.orderId)],
    ...(d.garageReference ? [['Your reference', d.garageReference] as [string, string]] : []),
    ...(d.invoice ? [['Credits invoice', d.invoice.reference] as [string, string]] : []),
    ...(d.reason ? [['Reason', CREDIT_REASON_LABELS[d.reason]] as [string, string]] : []),
  ]
  addressAndFacts(page, credit ? 'Credit to' : 'Invoice to', d.buyer, facts)

  page.heading(credit ? 'Credited' : 'Charged')
  table(page, [
    { header: 'Part', width: 84 }, { header: 'Description', width: 160 }, { header: 'Qty', width: 32, align: 'right' },
    { header: 'Unit', width: 62, align: 'right' }, { header: 'VAT rate', width: 46, align: 'right' },
    { header: 'VAT', width: 55, align: 'right' }, { header: 'Net', width: 60, align: 'right' },
  ], d.lines.map((l) => [l.sku, l.description, String(l.quantity), m(l.unitMinor), percent(l.taxBp), m(l.taxMinor), m(l.netMinor)]))

  page.heading('VAT analysis')
  table(page, [
    { header: 'Rate', width: 200 }, { header: 'Net', width: 150, align: 'right' }, { header: 'VAT', width: 149, align: 'right' },
  ], d.taxAnalysis.map((r) => [`${percent(r.taxBp)}${r.taxBp ? '' : ' (zero rate)'}`, m(r.netMinor), m(r.taxMinor)]))

  page.doc.moveDown(0.6)
  page.totalRow('Net', m(d.netMinor))
  page.totalRow('VAT', m(d.taxMinor))
  page.totalRow(credit ? 'Total credited' : 'Total', m(d.totalMinor), true)
  for (const n of d.notes) note(page, n)
  return page.finish(`${d.seller.name} · ${d.kindLabel} ${d.reference}`)
}
