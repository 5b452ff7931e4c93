/** The invoice for an order the garage has paid or put on its account (garage and distributor staff). */
import type { Order } from '../../models/orders'
import { PAYMENT_STATE_LABELS } from '../../../shared/types/orders'
import { orderLineTaxMinor } from '../../../shared/utils/order-totals'
import type { Formats } from '../../../shared/utils/format'
import type { PdfFonts } from '../pdf/document'
import { conflict } from '../errors'
import { hasInvoice } from './rules'
import { addressAndFacts, note, orderDocument, printedOrder, table } from './paperwork'

export async function invoicePdf(orderId: number, fmt: Formats, fonts: PdfFonts): Promise<Buffer> {
  const p = await printedOrder(orderId)
  const { order, garage } = p
  const m = fmt.money
  const page = orderDocument(p, fonts, 'Invoice', `Issued ${fmt.day(order.paidAt ?? order.createdAt)}`)
  const due = order.paymentMethod === 'account' && garage.paymentDays
    ? fmt.day(new Date(order.createdAt.getTime() + garage.paymentDays * 86_400_000))
    : ''
  addressAndFacts(page, 'Invoice to', garage, [
    ['Invoice date', fmt.day(order.paidAt ?? order.createdAt)],
    ['Order', p.reference],
    ...(order.garageReference ? [['Your reference', order.garageReference] as [string, string]] : []),
    ['Payment', order.paymentMethod === 'card' ? 'Card' : `Trade account, ${garage.paymentDays} days`],
    ...(due ? [['Due by', due] as [string, string]] : []),
    ['Status', PAYMENT_STATE_LABELS[order.paymentState]],
  ])

  page.heading('Parts')
  table(page, [
    { header: 'Part', width: 90 }, { header: 'Description', width: 175 }, { header: 'Qty', width: 35, align: 'right' },
    { header: 'Unit net', width: 70, align: 'right' }, { header: 'VAT', width: 60, align: 'right' }, { header: 'Amount', width: 69, align: 'right' },
  ], p.lines.map((x) => [x.sku, x.description, String(x.quantity), m(x.unitNetMinor), m(orderLineTaxMinor(x.lineNetMinor, order.taxRateBp)), m(x.lineNetMinor)]))
  const deposits = p.lines.filter((x) => x.coreDepositUnitMinor > 0)
  if (deposits.length) {
    page.heading('Core deposits (refundable)')
    table(page, [
      { header: 'Old unit for', width: 300 }, { header: 'Qty', width: 35, align: 'right' },
      { header: 'Each', width: 95, align: 'right' }, { header: 'Amount', width: 69, align: 'right' },
    ], deposits.map((x) => [x.sku, String(x.quantity), m(x.coreDepositUnitMinor), m(x.coreDepositUnitMinor * x.quantity)]))
  }

  page.doc.moveDown(0.6)
  page.totalRow('Parts', m(order.subtotalMinor))
  page.totalRow(`VAT ${order.taxRateBp / 100} %`, m(order.taxMinor))
  if (order.coreDepositMinor) page.totalRow('Core deposits', m(order.coreDepositMinor))
  page.totalRow('Total', m(order.totalMinor), true)
  if (order.status === 'cancelled') {
    note(page, `This order was cancelled on ${fmt.day(order.cancelledAt)}; the amount has been ${order.paymentMethod === 'card' ? 'refunded to the card' : 'credited to the trade account'}.`)
  } else if (deposits.length) {
    note(page, 'Core deposits are returned when the old units come back and are accepted by the counter.')
  }
  return page.finish(`${p.distributor?.name ?? 'Boreline'} · Invoice ${p.reference}`)
}

/** The invoice of an order the caller may see; 409 while there is none (not yet paid or put on account). */
export function invoiceOf(order: Order, fmt: Formats, fonts: PdfFonts): Promise<Buffer> {
  if (!hasInvoice(order)) throw conflict('The invoice is issued once the order is paid or put on the account.')
  return invoicePdf(order.id, fmt, fonts)
}
