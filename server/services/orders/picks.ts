/**
 * The picked quantities the counter confirms per line. A short pick is never a silent change: the rest becomes a
 * back-order from the supplier or a transfer from another branch (its own line, with the tax stated for the line
 * split so the order's tax does not move), it is audited and the garage is told. Plain Node apart from the e-mail.
 */
import type { Transaction } from 'sequelize'
import type { User } from '../../models/accounts'
import { OrderLine, type Order } from '../../models/orders'
import { withWrite } from '../../utils/db'
import { audit } from '../../utils/audit'
import { orderReference, type OrderDetail } from '../../../shared/types/orders'
import type { CounterPickInput } from '../../../shared/schemas/orders'
import { orderLineTaxMinor } from '../../../shared/utils/order-totals'
import { conflict, invalidInput } from '../errors'
import { availableStock, branchTimes } from './branches'
import type { ViewClock } from './clock'
import { counterSettings } from './counter-settings'
import { findAnyOrder } from './find'
import { sendToGarage } from './mail'
import { readiness } from './picking'
import { promiseWords, supplierArrival, whenReady } from './promise'
import { runAfter } from './after-commit'
import { stockKey } from './supply-plan'
import { takeStock } from './stock'
import { orderDetail } from './views'

interface Shortfall { line: OrderLine; short: number; to: 'back_order' | 'transfer'; from?: string }

/** The rest of a short line, as its own line (or the whole line when nothing was there), supplied the way asked. */
async function resupply(t: Transaction, order: Order, s: Shortfall, index: number, clock: ViewClock): Promise<OrderLine> {
  const times = await branchTimes(t)
  const home = times.find((b) => b.id === order.branchId)!
  const moved = s.line.pickedQuantity === 0 ? s.line : await splitLine(t, s.line, s.short)
  if (s.to === 'transfer') {
    const stock = await availableStock([moved.partId], t)
    const from = times.filter((b) => b.id !== order.branchId).sort((a, b) => a.transferMinutes - b.transferMinutes)
      .find((b) => (stock.get(stockKey(b.id, moved.partId)) ?? 0) >= s.short)
    if (!from || !await takeStock(t, from.id, moved.partId, s.short, clock.now)) {
      throw invalidInput({ [`lines.${index}.shortfall`]: `No other branch has ${s.short} of ${moved.sku}: back-order the rest from the supplier.` })
    }
    const readyAt = new Date(clock.now.getTime() + from.transferMinutes * 60_000)
    const when = whenReady(home, readyAt, order.collect ?? false, clock.timeZone)
    moved.set({ source: 'transfer', sourceBranchId: from.id, state: 'reserved', readyAt, reservedAt: clock.now, promisedAt: when?.arrivesAt ?? null, pickedQuantity: null })
    s.from = `${from.name}: ${promiseWords(when, clock.now, clock.timeZone)}`
  } else {
    const readyAt = supplierArrival(home, clock.now, counterSettings().supplierLeadDays, clock.timeZone)
    const when = whenReady(home, readyAt, order.collect ?? false, clock.timeZone)
    moved.set({ source: 'back_order', sourceBranchId: null, state: 'waiting', readyAt, reservedAt: null, promisedAt: when?.arrivesAt ?? null, pickedQuantity: null })
    s.from = `the supplier: ${promiseWords(when, clock.now, clock.timeZone)}`
  }
  await moved.save({ transaction: t })
  return moved
}

/**
 * Splits `short` units off a line into a new line. The line that stays states its own tax (rounded half away from
 * zero); the new line takes the remainder of what was stated, so the order's tax is unchanged.
 */
async function splitLine(t: Transaction, line: OrderLine, short: number): Promise<OrderLine> {
  const keep = line.quantity - short
  const rate = line.order?.taxRateBp
  const keepNet = line.unitNetMinor * keep
  const keepTax = orderLineTaxMinor(keepNet, rate)
  const keepDepositTax = orderLineTaxMinor(line.coreDepositUnitMinor * keep, rate)
  const rest = await OrderLine.create({
    orderId: line.orderId, partId: line.partId, sku: line.sku, description: line.description, quantity: short,
    unitListMinor: line.unitListMinor, unitNetMinor: line.unitNetMinor, lineNetMinor: line.unitNetMinor * short,
    coreDepositUnitMinor: line.coreDepositUnitMinor, quoteLineId: line.quoteLineId, quotedUnitNetMinor: line.quotedUnitNetMinor,
    position: line.position, fulfilment: line.fulfilment, lineGroup: line.lineGroup, splitFromLineId: line.id,
    taxMinor: (line.taxMinor ?? 0) - keepTax, depositTaxMinor: (line.depositTaxMinor ?? 0) - keepDepositTax,
  }, { transaction: t })
  line.set({ quantity: keep, lineNetMinor: keepNet, taxMinor: keepTax, depositTaxMinor: keepDepositTax })
  await line.save({ transaction: t })
  return rest
}

/** Records what the counter picked; short lines are resupplied as asked and the garage is told. */
export async function recordPicks(orderId: number, input: CounterPickInput, actor: Pick<User, 'id'>, clock: ViewClock): Promise<OrderDetail> {
  const shortfalls: Shortfall[] = []
  const order = await withWrite(async (t) => {
    const o = await findAnyOrder(orderId, t)
    if (o.status !== 'picking') throw conflict('Start picking the order before recording what was picked.')
    const why = readiness(o, o.lines ?? [], clock.now, clock.timeZone, new Map())
    const fields: Record<string, string> = {}
    const steps: { line: OrderLine; picked: number; index: number; to?: 'back_order' | 'transfer' }[] = []
    input.lines.forEach((p, index) => {
      const line = (o.lines ?? []).find((l) => l.id === p.lineId)
      if (!line) fields[`lines.${index}.lineId`] = 'This line is not on the order.'
      else if (!why.has(line.id) || why.get(line.id) !== null) fields[`lines.${index}.picked`] = `${line.sku} cannot be picked now (${why.get(line.id) ?? 'already sent or cancelled'}).`
      else if (p.picked > line.quantity) fields[`lines.${index}.picked`] = `At most ${line.quantity} of ${line.sku} are on this line.`
      else if (p.picked < line.quantity && !p.shortfall) fields[`lines.${index}.shortfall`] = `Say where the other ${line.quantity - p.picked} of ${line.sku} come from: back-order or transfer.`
      else steps.push({ line, picked: p.picked, index, to: p.shortfall })
    })
    if (Object.keys(fields).length) throw invalidInput(fields, 'Some picked quantities need a second look.')
    for (const s of steps) {
      s.line.order = o
      const short = s.line.quantity - s.picked
      s.line.set({ pickedQuantity: s.picked, state: s.picked > 0 ? 'picked' : s.line.state })
      if (short > 0) {
        const f: Shortfall = { line: s.line, short, to: s.to! }
        await resupply(t, o, f, s.index, clock)
        shortfalls.push(f)
      }
      if (s.picked > 0) await s.line.save({ transaction: t })
    }
    if (shortfalls.length) {
      await audit(t, {
        actorUserId: actor.id, organisationId: o.organisationId, action: 'order.short_pick', entity: 'order', entityId: o.id,
        changes: { lines: shortfalls.map((f) => ({ sku: f.line.sku, short: f.short, to: f.to })) },
      })
    }
    return o
  })
  if (shortfalls.length) {
    const list = shortfalls.map((f) => `  ${f.short} x ${f.line.sku} ${f.to === 'transfer' ? 'comes by transfer from' : 'is back-ordered from'} ${f.from}`).join('\n')
    await runAfter([() => sendToGarage(order, `Order ${orderReference(order.id)}: some parts follow later`,
      `The counter at ${order.branch?.name ?? 'the branch'} found fewer on the shelf than expected for order ${orderReference(order.id)}. What is here goes as planned; the rest follows:\n\n${list}\n\nYou can see every line on the order page.`)])
  }
  return orderDetail(await findAnyOrder(orderId), 'counter', clock)
}
