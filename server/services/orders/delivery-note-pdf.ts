/** The delivery note: what is in the box, no prices, with the old units due back (picking, the driver, the e-mail). */
import type { Order } from '../../models/orders'
import type { Formats } from '../../../shared/utils/format'
import { PDF_COLOURS, type PdfFonts } from '../pdf/document'
import { conflict } from '../errors'
import { hasDeliveryNote } from './rules'
import { addressAndFacts, orderDocument, printedOrder, table } from './paperwork'

export async function deliveryNotePdf(orderId: number, fmt: Formats, fonts: PdfFonts): Promise<Buffer> {
  const p = await printedOrder(orderId)
  const { order } = p
  const dispatched = fmt.day(order.dispatchedAt ?? new Date())
  const page = orderDocument(p, fonts, 'Delivery note', `Dispatched ${dispatched}`)
  const { doc, left, width } = page
  addressAndFacts(page, 'Deliver to', p.garage, [
    ['Order', p.reference],
    ...(order.garageReference ? [['Your reference', order.garageReference] as [string, string]] : []),
    ['From', p.branch?.name ?? ''],
    ['Dispatched', dispatched],
    ['Lines', String(p.lines.length)],
  ])

  page.heading('In this delivery')
  table(page, [
    { header: 'Part', width: 100 }, { header: 'Description', width: 250 }, { header: 'Qty', width: 45, align: 'right' },
    { header: 'Picked', width: 50, align: 'center' }, { header: 'Checked', width: 54, align: 'center' },
  ], p.lines.map((x) => [x.sku, x.description, String(x.quantity), '[  ]', '[  ]']))

  const due = p.cores.filter((c) => c.status === 'expected' || c.status === 'booked')
  if (due.length) {
    const skuOf = new Map(p.lines.map((x) => [x.id, x.sku]))
    page.heading('Old units to send back for the deposit')
    doc.font('body').fontSize(9).fillColor(PDF_COLOURS.ink)
    for (const c of due) {
      page.ensure(14)
      doc.text(`${c.quantityExpected} x ${skuOf.get(c.orderLineId) ?? ''}: book the return on the order page, then hand it to the driver.`, left, doc.y, { width })
    }
  }
  // room to sign by hand: low on the page when it fits, else after a gap
  page.ensure(60)
  doc.y = Math.max(doc.y + 36, Math.min(650, doc.page.height - doc.page.margins.bottom - 60))
  doc.font('body').fontSize(9.5).fillColor(PDF_COLOURS.ink).text('Received in good order by (name and signature): ______________________________', left, doc.y, { width })
  return page.finish(`${p.distributor?.name ?? 'Boreline'} · Delivery note ${p.reference}`)
}

/** The delivery note of an order; 409 before the order is confirmed. */
export function deliveryNoteOf(order: Order, fmt: Formats, fonts: PdfFonts): Promise<Buffer> {
  if (!hasDeliveryNote(order)) throw conflict('There is no delivery note for an order that is not confirmed.')
  return deliveryNotePdf(order.id, fmt, fonts)
}
