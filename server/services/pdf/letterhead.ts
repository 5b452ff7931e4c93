/**
 * The garage's letterhead on its documents to owners (the quote, the job card, the invoice): logo and garage on
 * the left, the document's name and its facts on the right; leaves the cursor under both.
 */
import { drawSvgLogo } from '../svg-to-pdf'
import { PDF_COLOURS, type PdfPage } from './document'

export interface PdfGarage { name: string; address: string; phone: string; email: string; taxNumber: string }
export interface PdfLogo { data: Buffer; mime: string }

export function drawLetterhead(page: PdfPage, garage: PdfGarage, logo: PdfLogo | null, title: string, facts: string[]): void {
  const { doc, left, width } = page
  const top = doc.y
  let textLeft = left
  if (logo) {
    try {
      if (logo.mime === 'image/png' || logo.mime === 'image/jpeg') {
        doc.image(logo.data, left, top, { fit: [110, 54] })
        textLeft = left + 122
      } else if (logo.mime === 'image/svg+xml' && drawSvgLogo(doc, logo.data.toString('utf8'), left, top, 110, 54)) {
        textLeft = left + 122
      }
    } catch { /* an unreadable image leaves the name alone in the header */ }
  }
  doc.font('bold').fontSize(16).fillColor(PDF_COLOURS.ink).text(garage.name, textLeft, top, { width: 260 })
  doc.font('body').fontSize(8.5).fillColor(PDF_COLOURS.soft)
  for (const line of [garage.address, [garage.phone, garage.email].filter(Boolean).join(' · '), garage.taxNumber ? `Tax number ${garage.taxNumber}` : '']) {
    if (line) doc.text(line, textLeft, doc.y, { width: 260 })
  }
  const leftBottom = doc.y
  doc.font('bold').fontSize(14).fillColor(PDF_COLOURS.accent).text(title, left + width - 180, top, { width: 180, align: 'right' })
  doc.font('body').fontSize(9).fillColor(PDF_COLOURS.ink)
  for (const f of facts) doc.text(f, left + width - 180, doc.y, { width: 180, align: 'right' })
  doc.y = Math.max(leftBottom, doc.y, top + 56) + 10
  doc.x = left
}
