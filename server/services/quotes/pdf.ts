/**
 * Drawing the quote as a PDF (pdfkit) from the same view the owner's page uses: garage header and logo,
 * vehicle, findings, lines (before tax, rate, with tax), totals with tax per rate, the owner's decision with any
 * declined safety work and what was signed for it (pdf-sections.ts), validity, terms and the safety caution.
 * The fonts (pdfFonts()) and the formats (serverFormats()) are passed in, so this stays plain Node.
 */
import { formatsFor, type Formats } from '../../../shared/utils/format'
import { formatBp } from '../../../shared/utils/quote-totals'
import { QUOTE_STATUS_LABELS } from '../../../shared/utils/quote-states'
import { FINDING_WORDS, QUOTE_SAFETY_CAUTION } from '../../../shared/utils/quote-wording'
import type { OwnerQuoteView } from '../../../shared/types/quotes'
import { newPdf, PDF_COLOURS, type PdfFonts } from '../pdf/document'
import { drawLetterhead, type PdfGarage, type PdfLogo } from '../pdf/letterhead'
import { drawDecision, drawTotals, lineLabels } from './pdf-sections'

export type { PdfFonts, PdfGarage, PdfLogo }

const { ink: INK, soft: SOFT, line: LINE, accent: ACCENT, fail: FAIL } = PDF_COLOURS

/** Renders the quote; resolves with the PDF bytes. Money in the view's currency, dates as `formats` writes them. */
export function renderQuotePdf(view: OwnerQuoteView, garage: PdfGarage, fonts: PdfFonts, logo: PdfLogo | null, formats: Formats = formatsFor()): Promise<Buffer> {
  const f = formatsFor({ currency: view.currency, locale: formats.locale, timeZone: formats.timeZone })
  const { money, day: date } = f
  const page = newPdf(fonts, { title: `Quote ${view.reference} from ${garage.name}`, author: garage.name, subject: view.vehicle })
  const { doc, left, width, ensure, heading } = page
  const bottom = () => doc.page.height - doc.page.margins.bottom - 24

  // header: logo and garage on the left, the quote on the right
  drawLetterhead(page, garage, logo, 'Quote', [
    view.reference,
    view.sentAt ? `Issued ${date(view.sentAt)}` : '',
    view.expiresAt ? `Valid until ${date(view.expiresAt)}` : '',
    view.status !== 'sent' && view.status !== 'draft' ? QUOTE_STATUS_LABELS[view.status] : '',
  ].filter(Boolean))

  heading('Vehicle')
  doc.font('body').fontSize(9.5).fillColor(INK)
  doc.text(`${view.vehicle || 'Vehicle'}${view.registration ? `  ·  Registration ${view.registration}` : ''}${view.odometer ? `  ·  Odometer ${view.odometer}` : ''}`, left, doc.y, { width })
  doc.fillColor(SOFT).text(`Prepared for ${view.ownerName}`, { width })

  if (view.findings.length) {
    heading('What we found')
    for (const f of view.findings) {
      ensure(28)
      const y = doc.y
      doc.font('bold').fontSize(8.5).fillColor(f.verdict === 'fail' ? FAIL : ACCENT).text(FINDING_WORDS[f.verdict], left, y, { width: 90 })
      doc.font('body').fontSize(9).fillColor(INK).text(f.text, left + 96, y, { width: width - 96 })
      doc.moveDown(0.3)
    }
  }
  if (view.messageToOwner) {
    heading('Note from the garage')
    doc.font('body').fontSize(9.5).fillColor(INK).text(view.messageToOwner, left, doc.y, { width })
  }

  // lines
  heading('The work')
  const cols = { desc: left, qty: left + width - 275, unit: left + width - 235, amount: left + width - 165, tax: left + width - 100, gross: left + width - 60 }
  const head = () => {
    doc.font('bold').fontSize(8).fillColor(SOFT)
    const y = doc.y
    doc.text('Description', cols.desc, y, { width: cols.qty - cols.desc - 8 })
    doc.text('Qty', cols.qty, y, { width: 36, align: 'right' })
    doc.text('Unit', cols.unit, y, { width: 66, align: 'right' })
    doc.text('Before tax', cols.amount, y, { width: 62, align: 'right' })
    doc.text('Tax', cols.tax, y, { width: 36, align: 'right' })
    doc.text('With tax', cols.gross, y, { width: 60, align: 'right' })
    doc.moveDown(0.4)
  }
  head()
  const decided = view.state === 'decided'
  for (const l of view.lines) {
    const labels = lineLabels(l, decided, money, date)
    const descWidth = cols.qty - cols.desc - 8
    doc.font('body').fontSize(9)
    const h = doc.heightOfString(l.description, { width: descWidth }) + (labels.length ? 11 : 0) + (l.reason ? doc.heightOfString(l.reason, { width: descWidth }) : 0) + 6
    if (doc.y + h > bottom()) { doc.addPage(); head() }
    const y = doc.y
    doc.fillColor(decided && l.decidable && l.ownerDecision !== 'approved' ? SOFT : INK).text(l.description, cols.desc, y, { width: descWidth })
    if (labels.length) {
      doc.font('bold').fontSize(7.5).fillColor(l.recommendation === 'required' ? FAIL : ACCENT).text(labels.join(' · '), cols.desc, doc.y, { width: descWidth })
    }
    if (l.reason) doc.font('body').fontSize(7.5).fillColor(SOFT).text(l.reason, cols.desc, doc.y, { width: descWidth })
    const endY = doc.y
    doc.font('body').fontSize(9).fillColor(INK)
    const qty = l.kind === 'labour' ? `${l.hours} h` : l.kind === 'discount' ? '' : String(l.quantity)
    doc.text(qty, cols.qty, y, { width: 36, align: 'right' })
    doc.text(l.kind === 'discount' ? '' : `${money(l.unitPriceMinor)}${l.taxIncluded ? '*' : ''}`, cols.unit, y, { width: 66, align: 'right' })
    doc.text(money(l.amountMinor), cols.amount, y, { width: 62, align: 'right' })
    doc.fillColor(SOFT).text(l.taxShares.length > 1 ? 'split' : formatBp(l.taxBp), cols.tax, y, { width: 36, align: 'right' })
    doc.fillColor(INK).text(money(l.grossMinor), cols.gross, y, { width: 60, align: 'right' })
    doc.y = Math.max(endY, doc.y) + 4
    doc.moveTo(left, doc.y - 2).lineTo(left + width, doc.y - 2).lineWidth(0.3).strokeColor(LINE).stroke()
  }
  if (view.lines.some((l) => l.taxIncluded)) {
    doc.font('body').fontSize(7.5).fillColor(SOFT).text('* price stated with tax included', left, doc.y, { width })
  }
  if (view.lines.some((l) => l.taxShares.length > 1)) {
    doc.font('body').fontSize(7.5).fillColor(SOFT).text('A discount is split across the tax rates of the work it is taken off, in proportion to it.', left, doc.y, { width })
  }

  drawTotals(page, view, money)
  drawDecision(page, view, f)
  doc.x = left

  heading('Validity and terms')
  doc.font('body').fontSize(8.5).fillColor(INK)
  if (view.expiresAt) doc.text(`This quote is valid until ${date(view.expiresAt)}. Prices are in ${view.currency} and include the tax shown.`, left, doc.y, { width })
  if (view.terms) doc.moveDown(0.3).text(view.terms, { width })

  heading('Safety caution')
  doc.font('body').fontSize(8.5).fillColor(INK).text(QUOTE_SAFETY_CAUTION, left, doc.y, { width })

  return page.finish(`${garage.name} · ${view.reference}`)
}
