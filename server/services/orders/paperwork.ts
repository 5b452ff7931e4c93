/**
 * What the invoice and the delivery note share: the order as printed (lines in order, the garage, the
 * distributor, the branch) and the blocks both draw on the one PDF layout (server/services/pdf/document.ts):
 * the distributor's letterhead, who it is for beside the order's facts, and a ruled table.
 */
import { Branch, Organisation } from '../../models/accounts'
import { CoreReturn, Order, OrderLine } from '../../models/orders'
import { orderReference } from '../../../shared/types/orders'
import { PDF_COLOURS, newPdf, type PdfFonts, type PdfPage } from '../pdf/document'

const { ink: INK, soft: SOFT, line: LINE, accent: ACCENT } = PDF_COLOURS

export interface PrintedOrder {
  order: Order
  reference: string
  garage: Organisation
  distributor: Organisation | null
  branch: Branch | null
  lines: OrderLine[]
  cores: CoreReturn[]
}

export async function printedOrder(orderId: number): Promise<PrintedOrder> {
  const order = await Order.findByPk(orderId, { include: [{ model: OrderLine, as: 'lines' }, { model: Branch, as: 'branch' }, { model: CoreReturn, as: 'coreReturns' }] })
  if (!order) throw new Error(`order ${orderId} not found`)
  const [garage, distributor] = await Promise.all([
    Organisation.findByPk(order.organisationId),
    Organisation.findOne({ where: { kind: 'distributor' } }),
  ])
  const lines = [...(order.lines ?? [])].sort((a, b) => a.position - b.position || a.id - b.id)
  return { order, reference: orderReference(order.id), garage: garage!, distributor, branch: order.branch ?? null, lines, cores: order.coreReturns ?? [] }
}

/** A new document for the order, its letterhead drawn: the distributor on the left, the title and reference on the right. */
export function orderDocument(p: PrintedOrder, fonts: PdfFonts, title: string, dated: string): PdfPage {
  const d = p.distributor
  const page = newPdf(fonts, { title: `${title} ${p.reference}`, author: d?.name ?? 'Boreline', subject: p.garage.name })
  const { doc, left, width } = page
  const top = doc.y
  doc.font('bold').fontSize(16).fillColor(INK).text(d?.name ?? 'Distributor', left, top, { width: 260 })
  doc.font('body').fontSize(8.5).fillColor(SOFT)
  const contact = [
    p.branch ? `${p.branch.name} branch · ${p.branch.address}` : '',
    d?.taxNumber ? `VAT no. ${d.taxNumber}` : '',
    [d?.phone, d?.email].filter(Boolean).join(' · '),
  ]
  for (const line of contact) if (line) doc.text(line, left, doc.y, { width: 260 })
  const leftBottom = doc.y
  doc.font('bold').fontSize(14).fillColor(ACCENT).text(title, left + width - 180, top, { width: 180, align: 'right' })
  doc.font('body').fontSize(9).fillColor(INK).text(p.reference, left + width - 180, doc.y, { width: 180, align: 'right' })
  if (dated) doc.text(dated, { width: 180, align: 'right' })
  doc.y = Math.max(leftBottom, doc.y, top + 56) + 14
  return page
}

/** Who the document is for (left) beside the order's facts (right, label and value). */
export function addressAndFacts(page: PdfPage, heading: string, g: Organisation, facts: [string, string][]): void {
  const { doc, left, width } = page
  const top = doc.y
  doc.font('bold').fontSize(8).fillColor(SOFT).text(heading.toUpperCase(), left, top, { width: 240 })
  doc.font('bold').fontSize(10.5).fillColor(INK).text(g.name, left, doc.y + 2, { width: 240 })
  doc.font('body').fontSize(9).text(g.tradingAddress || '', { width: 240 })
  if (g.taxNumber) doc.text(`VAT no. ${g.taxNumber}`, { width: 240 })
  const leftBottom = doc.y
  let y = top
  for (const [label, value] of facts) {
    doc.font('body').fontSize(8.5).fillColor(SOFT).text(label, left + width - 230, y, { width: 100 })
    doc.font('body').fontSize(9).fillColor(INK).text(value, left + width - 130, y, { width: 130, align: 'right' })
    y = doc.y + 3
  }
  doc.x = left
  doc.y = Math.max(leftBottom, y)
}

export interface Column { header: string; width: number; align?: 'left' | 'right' | 'center' }

/** A ruled table across the page; the header row is drawn again on each new page. */
export function table(page: PdfPage, cols: Column[], rows: string[][]): void {
  const { doc, left, width, ensure } = page
  const cells = (values: string[], font: 'body' | 'bold', size: number, colour: string) => {
    doc.font(font).fontSize(size).fillColor(colour)
    const y = doc.y
    let x = left
    let bottom = y
    values.forEach((v, i) => {
      const c = cols[i]!
      doc.text(v, x, y, { width: c.width - 6, align: c.align ?? 'left' })
      bottom = Math.max(bottom, doc.y)
      x += c.width
    })
    doc.x = left
    doc.y = bottom + 3
    doc.moveTo(left, doc.y - 1.5).lineTo(left + width, doc.y - 1.5).lineWidth(font === 'bold' ? 0.6 : 0.3).strokeColor(LINE).stroke()
    doc.y += 2
  }
  const head = () => cells(cols.map((c) => c.header), 'bold', 8, SOFT)
  ensure(40)
  head()
  for (const r of rows) {
    doc.font('body').fontSize(9)
    const h = Math.max(...r.map((v, i) => doc.heightOfString(v, { width: cols[i]!.width - 6 }))) + 6
    if (doc.y + h > doc.page.height - doc.page.margins.bottom - 24) {
      doc.addPage()
      head()
    }
    cells(r, 'body', 9, INK)
  }
}

/** A short paragraph under the figures. */
export function note(page: PdfPage, text: string): void {
  page.ensure(30)
  page.doc.moveDown(0.8).font('body').fontSize(8.5).fillColor(SOFT).text(text, page.left, page.doc.y, { width: page.width })
}
