/**
 * The one PDF layout for every document Boreline prints (the quote, the invoice, the delivery note): A4, the
 * app's typeface in two weights (Inter regular and bold, from server/assets/fonts, passed in by the caller so
 * this stays plain Node), the same colours, section headings, page breaks and page footers.
 */
import PDFDocument from 'pdfkit'

export interface PdfFonts { regular: Buffer; bold: Buffer }

export const PDF_COLOURS = {
  ink: '#1b2430',
  soft: '#5b6878',
  line: '#d3cdc2',
  accent: '#9a5225',
  fail: '#b42318',
} as const

export interface PdfInfo { title: string; author: string; subject?: string }

export interface PdfPage {
  doc: PDFKit.PDFDocument
  /** left edge and usable width of the page */
  left: number
  width: number
  /** moves to a new page unless `height` points still fit above the footer */
  ensure: (height: number) => void
  /** a bold section heading with a rule under it */
  heading: (text: string) => void
  /** a label and a value on one line, right-aligned (totals) */
  totalRow: (label: string, value: string, strong?: boolean) => void
  /** writes "<footer> · page n of N" on every page and ends the document; resolves with the bytes */
  finish: (footer: string) => Promise<Buffer>
}

/** A new document: fonts registered as `body` and `bold`. */
export function newPdf(fonts: PdfFonts, info: PdfInfo): PdfPage {
  const doc = new PDFDocument({
    size: 'A4', margin: 48, bufferPages: true, font: fonts.regular as unknown as string,
    info: { Title: info.title, Author: info.author, Subject: info.subject, Creator: 'Boreline' },
  })
  doc.registerFont('body', fonts.regular)
  doc.registerFont('bold', fonts.bold)
  doc.font('body')
  const chunks: Buffer[] = []
  doc.on('data', (c: Buffer) => chunks.push(c))
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)))
    doc.on('error', reject)
  })

  const left = doc.page.margins.left
  const width = doc.page.width - doc.page.margins.left - doc.page.margins.right
  const bottom = () => doc.page.height - doc.page.margins.bottom - 24
  const ensure = (height: number) => { if (doc.y + height > bottom()) doc.addPage() }

  return {
    doc, left, width, ensure,
    heading(text) {
      ensure(40)
      doc.moveDown(0.8).font('bold').fontSize(11).fillColor(PDF_COLOURS.ink).text(text, left, doc.y, { width })
      doc.moveTo(left, doc.y + 2).lineTo(left + width, doc.y + 2).lineWidth(0.5).strokeColor(PDF_COLOURS.line).stroke()
      doc.moveDown(0.5)
    },
    totalRow(label, value, strong = false) {
      ensure(16)
      const y = doc.y
      doc.font(strong ? 'bold' : 'body').fontSize(strong ? 10.5 : 9.5).fillColor(PDF_COLOURS.ink)
      doc.text(label, left + width - 260, y, { width: 170, align: 'right' })
      const labelEnd = doc.y // a label long enough to wrap must push the next row down, not run under it
      doc.text(value, left + width - 90, y, { width: 90, align: 'right' })
      doc.y = Math.max(labelEnd, doc.y)
      doc.moveDown(0.25)
    },
    finish(footer) {
      const range = doc.bufferedPageRange()
      for (let i = range.start; i < range.start + range.count; i++) {
        doc.switchToPage(i)
        const y = doc.page.height - doc.page.margins.bottom - 10
        doc.font('body').fontSize(7.5).fillColor(PDF_COLOURS.soft)
          .text(`${footer} · page ${i + 1} of ${range.count}`, left, y, { width, align: 'center', lineBreak: false })
      }
      doc.end()
      return done
    },
  }
}
