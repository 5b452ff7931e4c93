/**
 * Paperwork for an order: the invoice (garage and counter) and the delivery note that travels with the parts
 * (counter; attached to the dispatch e-mail). pdfkit with the Inter font shipped in @fontsource/inter,
 * resolved at run time (nuxt.config.ts traces the files into the production build).
 */
import { createRequire } from 'node:module'
import { existsSync } from 'node:fs'
import { join } from 'node:path'
import PDFDocument from 'pdfkit'
import { Branch, Organisation } from '../models/accounts'
import { CoreReturn, Order, OrderLine } from '../models/orders'
import { formatMinor } from '../../shared/utils/money'
import { orderLineTaxMinor } from '../../shared/utils/order-totals'
import { PAYMENT_STATE_LABELS, orderReference } from '../../shared/types/orders'

type Weight = 400 | 600

const fontCache = new Map<Weight, string>()

/** The path of an Inter face; throws with the places looked in when it is missing. */
export function interFont(weight: Weight): string {
  const hit = fontCache.get(weight)
  if (hit) return hit
  const file = `inter-latin-${weight}-normal.woff`
  const tried: string[] = []
  for (const base of [import.meta.url, join(process.cwd(), 'package.json')]) {
    try {
      const p = createRequire(base).resolve(`@fontsource/inter/files/${file}`)
      if (existsSync(p)) {
        fontCache.set(weight, p)
        return p
      }
      tried.push(p)
    } catch {
      tried.push(`${base} (not resolvable)`)
    }
  }
  throw new Error(`Inter font ${file} not found (looked in ${tried.join(', ')})`)
}

const dateText = (d: Date | null | undefined) => (d ? d.toLocaleDateString('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'Europe/London' }) : '')

function newDoc(title: string): { doc: PDFKit.PDFDocument; done: Promise<Buffer> } {
  const doc = new PDFDocument({ size: 'A4', margin: 50, info: { Title: title, Author: 'Boreline' } })
  doc.registerFont('Inter', interFont(400))
  doc.registerFont('Inter-SemiBold', interFont(600))
  doc.font('Inter')
  const chunks: Buffer[] = []
  doc.on('data', (c: Buffer) => chunks.push(c))
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)))
    doc.on('error', reject)
  })
  return { doc, done }
}

interface Loaded { order: Order; garage: Organisation; distributor: Organisation | null; branch: Branch | null; lines: OrderLine[]; cores: CoreReturn[] }

async function load(orderId: number): Promise<Loaded> {
  const order = await Order.findByPk(orderId, { include: [{ model: OrderLine, as: 'lines' }, { model: Branch, as: 'branch' }, { model: CoreReturn, as: 'coreReturns' }] })
  if (!order) throw new Error(`order ${orderId} not found`)
  const [garage, distributor] = await Promise.all([
    Organisation.findByPk(order.organisationId),
    Organisation.findOne({ where: { kind: 'distributor' } }),
  ])
  const lines = [...(order.lines ?? [])].sort((a, b) => a.position - b.position || a.id - b.id)
  return { order, garage: garage!, distributor, branch: order.branch ?? null, lines, cores: order.coreReturns ?? [] }
}

function letterhead(doc: PDFKit.PDFDocument, l: Loaded, title: string): void {
  const d = l.distributor
  doc.font('Inter-SemiBold').fontSize(18).fillColor('#18222d').text(d?.name ?? 'Distributor', 50, 50)
  doc.font('Inter').fontSize(9).fillColor('#3d4a5c')
  if (l.branch) doc.text(`${l.branch.name} branch · ${l.branch.address}`)
  if (d?.taxNumber) doc.text(`VAT no. ${d.taxNumber}`)
  if (d?.phone || d?.email) doc.text([d.phone, d.email].filter(Boolean).join(' · '))
  doc.font('Inter-SemiBold').fontSize(22).fillColor('#9a5225').text(title, 350, 50, { width: 195, align: 'right' })
  doc.font('Inter').fontSize(10).fillColor('#1b2430').text(orderReference(l.order.id), 350, 80, { width: 195, align: 'right' })
  doc.moveDown(0)
  doc.y = 130
  doc.x = 50
}

function party(doc: PDFKit.PDFDocument, heading: string, g: Organisation, y: number): void {
  doc.font('Inter-SemiBold').fontSize(9).fillColor('#5b6878').text(heading.toUpperCase(), 50, y)
  doc.font('Inter-SemiBold').fontSize(11).fillColor('#1b2430').text(g.name)
  doc.font('Inter').fontSize(10).text(g.tradingAddress || '')
  if (g.taxNumber) doc.text(`VAT no. ${g.taxNumber}`)
}

function facts(doc: PDFKit.PDFDocument, rows: [string, string][], y: number): void {
  let yy = y
  for (const [k, v] of rows) {
    doc.font('Inter').fontSize(9).fillColor('#5b6878').text(k, 330, yy, { width: 95 })
    doc.font('Inter').fontSize(10).fillColor('#1b2430').text(v, 425, yy, { width: 120, align: 'right' })
    yy += 16
  }
}

interface Col { header: string; width: number; align?: 'left' | 'right' | 'center' }

function table(doc: PDFKit.PDFDocument, cols: Col[], rows: string[][], y: number): number {
  let x = 50
  doc.font('Inter-SemiBold').fontSize(9).fillColor('#3d4a5c')
  for (const c of cols) {
    doc.text(c.header, x, y, { width: c.width - 6, align: c.align ?? 'left' })
    x += c.width
  }
  let yy = y + 16
  doc.moveTo(50, yy - 3).lineTo(545, yy - 3).lineWidth(0.8).strokeColor('#a79f91').stroke()
  doc.font('Inter').fontSize(9.5).fillColor('#1b2430')
  for (const r of rows) {
    if (yy > 740) {
      doc.addPage()
      yy = 60
    }
    x = 50
    let h = 0
    r.forEach((cell, i) => {
      const c = cols[i]!
      h = Math.max(h, doc.heightOfString(cell, { width: c.width - 6 }))
      doc.text(cell, x, yy, { width: c.width - 6, align: c.align ?? 'left' })
      x += c.width
    })
    yy += h + 6
    doc.moveTo(50, yy - 3).lineTo(545, yy - 3).lineWidth(0.4).strokeColor('#d3cdc2').stroke()
  }
  return yy
}

/** The invoice for an order the garage has paid or put on its account. */
export async function invoicePdf(orderId: number): Promise<Buffer> {
  const l = await load(orderId)
  const { order } = l
  const money = (m: number) => formatMinor(m, order.currency)
  const { doc, done } = newDoc(`Invoice ${orderReference(order.id)}`)
  letterhead(doc, l, 'Invoice')
  party(doc, 'Invoice to', l.garage, 130)
  const due = order.paymentMethod === 'account' && l.garage.paymentDays
    ? dateText(new Date(order.createdAt.getTime() + l.garage.paymentDays * 86_400_000))
    : ''
  facts(doc, [
    ['Invoice date', dateText(order.paidAt ?? order.createdAt)],
    ['Order', orderReference(order.id)],
    ...(order.garageReference ? [['Your reference', order.garageReference] as [string, string]] : []),
    ['Payment', order.paymentMethod === 'card' ? 'Card' : `Trade account, ${l.garage.paymentDays} days`],
    ...(due ? [['Due by', due] as [string, string]] : []),
    ['Status', PAYMENT_STATE_LABELS[order.paymentState]],
  ], 130)
  let y = table(doc, [
    { header: 'Part', width: 90 }, { header: 'Description', width: 185 }, { header: 'Qty', width: 35, align: 'right' },
    { header: 'Unit net', width: 65, align: 'right' }, { header: 'VAT', width: 55, align: 'right' }, { header: 'Amount', width: 65, align: 'right' },
  ], l.lines.map((x) => [x.sku, x.description, String(x.quantity), money(x.unitNetMinor), money(orderLineTaxMinor(x.lineNetMinor, order.taxRateBp)), money(x.lineNetMinor)]), 235)
  const deposits = l.lines.filter((x) => x.coreDepositUnitMinor > 0)
  if (deposits.length) {
    y = table(doc, [
      { header: 'Core deposit (refundable)', width: 275 }, { header: 'Qty', width: 35, align: 'right' },
      { header: 'Each', width: 65, align: 'right' }, { header: '', width: 55 }, { header: 'Amount', width: 65, align: 'right' },
    ], deposits.map((x) => [`Old unit for ${x.sku}`, String(x.quantity), money(x.coreDepositUnitMinor), '', money(x.coreDepositUnitMinor * x.quantity)]), y + 10)
  }
  y += 10
  const totals: [string, string, boolean][] = [
    ['Parts', money(order.subtotalMinor), false],
    [`VAT ${order.taxRateBp / 100} %`, money(order.taxMinor), false],
    ...(order.coreDepositMinor ? [['Core deposits', money(order.coreDepositMinor), false] as [string, string, boolean]] : []),
    ['Total', money(order.totalMinor), true],
  ]
  for (const [k, v, strong] of totals) {
    doc.font(strong ? 'Inter-SemiBold' : 'Inter').fontSize(strong ? 12 : 10).fillColor('#1b2430')
    doc.text(k, 330, y, { width: 120 })
    doc.text(v, 425, y, { width: 120, align: 'right' })
    y += strong ? 20 : 16
  }
  doc.font('Inter').fontSize(9).fillColor('#3d4a5c')
  if (order.status === 'cancelled') doc.text(`This order was cancelled on ${dateText(order.cancelledAt)}; the amount has been ${order.paymentMethod === 'card' ? 'refunded to the card' : 'credited to the trade account'}.`, 50, y + 14, { width: 495 })
  else if (deposits.length) doc.text('Core deposits are returned when the old units come back and are accepted by the counter.', 50, y + 14, { width: 495 })
  doc.end()
  return done
}

/** The delivery note: what is in the box, no prices, with the old units due back. */
export async function deliveryNotePdf(orderId: number): Promise<Buffer> {
  const l = await load(orderId)
  const { order } = l
  const { doc, done } = newDoc(`Delivery note ${orderReference(order.id)}`)
  letterhead(doc, l, 'Delivery note')
  party(doc, 'Deliver to', l.garage, 130)
  facts(doc, [
    ['Order', orderReference(order.id)],
    ...(order.garageReference ? [['Your reference', order.garageReference] as [string, string]] : []),
    ['From', l.branch?.name ?? ''],
    ['Dispatched', dateText(order.dispatchedAt ?? new Date())],
    ['Lines', String(l.lines.length)],
  ], 130)
  let y = table(doc, [
    { header: 'Part', width: 100 }, { header: 'Description', width: 255 }, { header: 'Qty', width: 45, align: 'right' },
    { header: 'Picked', width: 45, align: 'center' }, { header: 'Checked', width: 50, align: 'center' },
  ], l.lines.map((x) => [x.sku, x.description, String(x.quantity), '[  ]', '[  ]']), 235)
  const due = l.cores.filter((c) => c.status === 'expected' || c.status === 'booked')
  if (due.length) {
    const bySku = new Map(l.lines.map((x) => [x.id, x.sku]))
    doc.font('Inter-SemiBold').fontSize(10).fillColor('#1b2430').text('Old units to send back for the deposit', 50, y + 12)
    doc.font('Inter').fontSize(9.5)
    for (const c of due) doc.text(`${c.quantityExpected} x ${bySku.get(c.orderLineId) ?? ''}: book the return on the order page, then hand it to the driver.`, { width: 495 })
    y = doc.y
  }
  doc.font('Inter').fontSize(9.5).fillColor('#1b2430')
  doc.text('Received in good order by (name and signature): ______________________________', 50, Math.max(y + 40, 650), { width: 495 })
  doc.end()
  return done
}
