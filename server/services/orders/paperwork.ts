/**
 * What the order's paperwork (confirmation, delivery note) and the issued documents (invoices, credit notes)
 * share: the order as printed (lines in order, the garage, the distributor, the branch) and the blocks all of them
 * draw on the one PDF layout (server/services/pdf/document.ts): the seller's letterhead, who it is for beside the
 * facts, and a ruled table.
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

export interface Letterhead {
  /** the seller's name and the lines under it (branch, tax number, contact) */
  seller: string
  contact: string[]
  title: string
  reference: string
  dated: string
  /** the PDF's subject (the customer) */
  subject: string
}

/** A new document with its letterhead drawn: the seller on the left, the title and reference on the right. */
export function letterheadPage(fonts: PdfFonts, h: Letterhead): PdfPage {
  const page = newPdf(fonts, { title: `${h.title} ${h.reference}`, author: h.seller, subject: h.subject })
  const { doc, left, width } = page
  const top = doc.y
  doc.font('bold').fontSize(16).fillColor(INK).text(h.seller, left, top, { width: 260 })
  doc.font('body').fontSize(8.5).fillColor(SOFT)
  for (const line of h.contact) if (line) doc.text(line, left, doc.y, { width: 260 })
  const leftBottom = doc.y
  doc.font('bold').fontSize(14).fillColor(ACCENT).text(h.title, left + width - 180, top, { width: 180, align: 'right' })
  doc.font('body').fontSize(9).fillColor(INK).text(h.reference, left + width - 180, doc.y, { width: 180, align: 'right' })
  if (h.dated) doc.text(h.dated, { width: 180, align: 'right' })
  doc.y = Math.max(leftBottom, doc.y, top + 56) + 14
  return page
}

/** A new document for the order, its letterhead drawn: the distributor on the left, the title and reference on the right. */
export function orderDocument(p: PrintedOrder, fonts: PdfFonts, title: string, dated: string): PdfPage {
  const d = p.distributor
  return letterheadPage(fonts, {
    seller: d?.name ?? 'Distributor', title, reference: p.reference, dated, subject: p.garage.name,
    contact: [
      p.branch ? `${p.branch.name} branch · ${p.branch.address}` : '',
      d?.taxNumber ? `VAT no. ${d.taxNumber}` : '',
      [d?.phone, d?.email].filter(Boolean).join(' · '),
    ],
  })
}

/** Who a document is for, as printed. */
export interface Party { name: string; address: string; taxNumber: string }

export const partyOf = (o: Pick<Organisation, 'name' | 'tradingAddress' | 'taxNumber'>): Party => ({ name: o.name, address: o.tradingAddress ?? '', taxNumber: o.taxNumber ?? '' })

/** Who the document is for (left) beside its facts (right, label and value). */
export function addressAndFacts(page: PdfPage, heading: string, g: Party, facts: [string, string][]): void {
  const { doc, left, width } = page
  const top = doc.y
  doc.font('bold').fontSize(8).fillColor(SOFT).text(heading.toUpperCase(), left, top, { width: 240 })
  doc.font('bold').fontSize(10.5).fillColor(INK).text(g.name, left, doc.y + 2, { width: 240 })
  doc.font('body').fontSize(9).text(g.address || '', { width: 240 })
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
