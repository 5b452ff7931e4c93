/**
 * The garage's invoice to the owner as a PDF: the garage's letterhead and logo, the owner and the car, the lines
 * before tax, tax and with tax, tax per rate, totals, payments taken and what is still due.
 */
import { formatsFor, type Formats } from '../../../shared/utils/format'
import { formatBp } from '../../../shared/utils/quote-totals'
import type { OwnerInvoiceView } from '../../../shared/types/owner-invoices'
import { newPdf, PDF_COLOURS, type PdfFonts } from '../pdf/document'
import { drawLetterhead, type PdfGarage, type PdfLogo } from '../pdf/letterhead'

const PAID_BY = { cash: 'cash', card: 'card', transfer: 'bank transfer' } as const

export interface InvoiceVehicle { vehicle: string; registration: string; odometer: string; quoteReference: string }

export function renderOwnerInvoicePdf(view: OwnerInvoiceView, car: InvoiceVehicle, garage: PdfGarage, logo: PdfLogo | null, fonts: PdfFonts, formats: Formats): Promise<Buffer> {
  const f = formatsFor({ currency: view.currency, locale: formats.locale, timeZone: formats.timeZone })
  const page = newPdf(fonts, { title: `Invoice ${view.reference} from ${garage.name}`, author: garage.name, subject: car.vehicle })
  const { doc, left, width, ensure, heading, totalRow } = page
  drawLetterhead(page, garage, logo, 'Invoice', [view.reference, `Date ${f.day(view.issuedAt)}`, `For quote ${car.quoteReference}`])

  heading('Invoice to')
  doc.font('body').fontSize(9.5).fillColor(PDF_COLOURS.ink).text(view.ownerName, left, doc.y, { width })
  doc.fillColor(PDF_COLOURS.soft).text(`${car.vehicle}${car.registration ? `  ·  Registration ${car.registration}` : ''}${car.odometer ? `  ·  Odometer ${car.odometer}` : ''}`, { width })

  heading('Work done')
  const cols = { qty: left + width - 250, amount: left + width - 190, tax: left + width - 120, gross: left + width - 70 }
  const row = (cells: [string, string, string, string, string], bold = false) => {
    ensure(16)
    const y = doc.y
    doc.font(bold ? 'bold' : 'body').fontSize(bold ? 8 : 9).fillColor(bold ? PDF_COLOURS.soft : PDF_COLOURS.ink)
    doc.text(cells[0], left, y, { width: cols.qty - left - 8 })
    const endY = doc.y
    doc.text(cells[1], cols.qty, y, { width: 50, align: 'right' })
    doc.text(cells[2], cols.amount, y, { width: 64, align: 'right' })
    doc.text(cells[3], cols.tax, y, { width: 44, align: 'right' })
    doc.text(cells[4], cols.gross, y, { width: 70, align: 'right' })
    doc.y = Math.max(endY, doc.y) + 3
    doc.moveTo(left, doc.y - 1).lineTo(left + width, doc.y - 1).lineWidth(0.3).strokeColor(PDF_COLOURS.line).stroke()
  }
  row(['Description', 'Qty', 'Before tax', 'Tax', 'With tax'], true)
  for (const l of view.lines) {
    row([l.description, l.hours != null ? `${l.hours} h` : String(l.quantity), f.money(l.netMinor), formatBp(l.taxBp), f.money(l.grossMinor)])
  }
  doc.moveDown(0.5)
  for (const r of view.taxByRate) totalRow(`Tax at ${formatBp(r.taxBp)} on ${f.money(r.netMinor)}`, f.money(r.taxMinor))
  totalRow('Total before tax', f.money(view.netMinor))
  totalRow('Tax', f.money(view.taxMinor))
  totalRow('Total', f.money(view.grossMinor), true)
  for (const p of view.payments) totalRow(`Paid by ${PAID_BY[p.method]} on ${f.day(p.at)}`, `- ${f.money(p.amountMinor)}`)
  totalRow(view.dueMinor > 0 ? 'Still to pay' : 'Paid in full', f.money(view.dueMinor), true)
  doc.x = left
  return page.finish(`${garage.name} · Invoice ${view.reference}`)
}
