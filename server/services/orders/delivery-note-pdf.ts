/**
 * The delivery note: what is in the box (no prices) and what follows later, with the old units due back (picking,
 * the driver, the e-mail). Once something has left, it is the note of a dispatch (the latest unless one is named):
 * the lines that dispatch sent, then every line still to come with where it comes from and when.
 */
import { Dispatch } from '../../models/counter'
import type { Order } from '../../models/orders'
import { SUPPLY_SOURCE_LABELS, type SupplySource } from '../../../shared/types/orders'
import type { Formats } from '../../../shared/utils/format'
import { PDF_COLOURS, type PdfFonts } from '../pdf/document'
import { conflict } from '../errors'
import { hasDeliveryNote } from './rules'
import { addressAndFacts, orderDocument, partyOf, printedOrder, table } from './paperwork'
import { branchTimes } from './branches'
import { linePromises } from './line-promises'

const LIVE = ['reserved', 'waiting', 'picked']

export async function deliveryNotePdf(orderId: number, fmt: Formats, fonts: PdfFonts, dispatchId?: number): Promise<Buffer> {
  const p = await printedOrder(orderId)
  const { order } = p
  const dispatches = await Dispatch.findAll({ where: { orderId }, order: [['seq', 'ASC']] })
  const dispatch = dispatches.find((d) => d.id === dispatchId) ?? dispatches.at(-1) ?? null
  const sentAt = dispatch?.dispatchedAt ?? order.dispatchedAt ?? new Date()
  const inBox = dispatch ? p.lines.filter((l) => l.dispatchId === dispatch.id) : p.lines.filter((l) => LIVE.includes(l.state ?? 'reserved'))
  const later = p.lines.filter((l) => LIVE.includes(l.state ?? 'reserved') && !inBox.includes(l))
  const page = orderDocument(p, fonts, 'Delivery note', `${dispatch ? 'Dispatched' : 'Prepared'} ${fmt.day(sentAt)}`)
  const { doc, left, width } = page
  addressAndFacts(page, order.collect ? 'Collected by' : 'Deliver to', partyOf(p.garage), [
    ['Order', p.reference],
    ...(order.garageReference ? [['Your reference', order.garageReference] as [string, string]] : []),
    ['From', p.branch?.name ?? ''],
    ...(dispatches.length > 1 && dispatch ? [['Delivery', `${dispatch.seq} of the order`] as [string, string]] : []),
    ['Dispatched', dispatch ? fmt.day(sentAt) : 'not yet'],
    ['Lines', String(inBox.length)],
  ])

  page.heading('In this delivery')
  table(page, [
    { header: 'Part', width: 100 }, { header: 'Description', width: 250 }, { header: 'Qty', width: 45, align: 'right' },
    { header: 'Picked', width: 50, align: 'center' }, { header: 'Checked', width: 54, align: 'center' },
  ], inBox.map((x) => [x.sku, x.description, String(x.quantity), '[  ]', '[  ]']))

  if (later.length) {
    const home = (await branchTimes()).find((b) => b.id === order.branchId)!
    const promises = linePromises(order as Order, p.lines, home, sentAt, fmt.timeZone, new Map())
    page.heading('To follow')
    table(page, [
      { header: 'Part', width: 100 }, { header: 'Description', width: 170 }, { header: 'Qty', width: 40, align: 'right' },
      { header: 'Coming', width: 189 },
    ], later.map((x) => [x.sku, x.description, String(x.quantity), `${SUPPLY_SOURCE_LABELS[(x.source ?? 'home') as SupplySource]}; ${promises.get(x.id)?.promise ?? ''}`]))
  }

  const due = p.cores.filter((c) => (c.status === 'expected' || c.status === 'booked') && inBox.some((l) => l.id === c.orderLineId))
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
