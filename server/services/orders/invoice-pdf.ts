/**
 * The order confirmation: what a garage has paid or put on its account, line by line with where each comes from,
 * before anything has left (garage and distributor staff). Not a tax document: the numbered invoices are issued
 * with each dispatch (server/services/documents).
 */
import type { Order } from '../../models/orders'
import { PAYMENT_STATE_LABELS, SUPPLY_SOURCE_LABELS, type SupplySource } from '../../../shared/types/orders'
import type { Formats } from '../../../shared/utils/format'
import type { PdfFonts } from '../pdf/document'
import { conflict } from '../errors'
import { hasInvoice } from './rules'
import { addressAndFacts, note, orderDocument, partyOf, printedOrder, table } from './paperwork'

export async function invoicePdf(orderId: number, fmt: Formats, fonts: PdfFonts): Promise<Buffer> {
  const p = await printedOrder(orderId)
  const { order, garage } = p
  const m = fmt.money
  const page = orderDocument(p, fonts, 'Order confirmation', `Placed ${fmt.day(order.createdAt)}`)
  addressAndFacts(page, 'For', partyOf(garage), [
    ['Order date', fmt.day(order.createdAt)],
    ['Order', p.reference],
    ...(order.garageReference ? [['Your reference', order.garageReference] as [string, string]] : []),
    ['Payment', order.paymentMethod === 'card' ? 'Card' : `Trade account, ${garage.paymentDays} days`],
    ['Status', PAYMENT_STATE_LABELS[order.paymentState]],
  ])

  page.heading('Parts')
  table(page, [
    { header: 'Part', width: 80 }, { header: 'Description', width: 150 }, { header: 'Supply', width: 70 }, { header: 'Qty', width: 30, align: 'right' },
    { header: 'Unit net', width: 55, align: 'right' }, { header: 'VAT', width: 50, align: 'right' }, { header: 'Amount', width: 64, align: 'right' },
  ], p.lines.map((x) => [x.sku, x.description, SUPPLY_SOURCE_LABELS[(x.source ?? 'home') as SupplySource], String(x.quantity), m(x.unitNetMinor), m(x.taxMinor ?? 0), m(x.lineNetMinor)]))
  const deposits = p.lines.filter((x) => x.coreDepositUnitMinor > 0)
  if (deposits.length) {
    page.heading('Core deposits (refundable, with their VAT)')
    table(page, [
      { header: 'Old unit for', width: 250 }, { header: 'Qty', width: 35, align: 'right' },
      { header: 'Each', width: 80, align: 'right' }, { header: 'VAT', width: 65, align: 'right' }, { header: 'Amount', width: 69, align: 'right' },
    ], deposits.map((x) => [x.sku, String(x.quantity), m(x.coreDepositUnitMinor), m(x.depositTaxMinor ?? 0), m(x.coreDepositUnitMinor * x.quantity)]))
  }

  page.doc.moveDown(0.6)
  page.totalRow('Parts', m(order.subtotalMinor))
  if (order.coreDepositMinor) page.totalRow('Core deposits', m(order.coreDepositMinor))
  page.totalRow(`VAT ${order.taxRateBp / 100} %`, m(order.taxMinor))
  page.totalRow('Total', m(order.totalMinor), true)
  if (order.status === 'cancelled') {
    note(page, `This order was cancelled on ${fmt.day(order.cancelledAt)}; the amount has been ${order.paymentMethod === 'card' ? 'refunded to the card' : 'credited to the trade account'}.`)
  } else if (deposits.length) {
    note(page, 'Core deposits and their VAT are returned when the old units come back and are accepted by the counter.')
  }
  note(page, 'This confirms the order; a numbered VAT invoice is issued with each delivery and is in your documents.')
  return page.finish(`${p.distributor?.name ?? 'Boreline'} · Order confirmation ${p.reference}`)
}

/** The confirmation of an order the caller may see; 409 while there is none (not yet paid or put on account). */
export function invoiceOf(order: Order, fmt: Formats, fonts: PdfFonts): Promise<Buffer> {
  if (!hasInvoice(order)) throw conflict('The order confirmation is issued once the order is paid or put on the account.')
  return invoicePdf(order.id, fmt, fonts)
}
