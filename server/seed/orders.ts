/**
 * Demo orders at different stages, placed through the same service the API uses (priced at the garage's net
 * prices, supplied from the shelf, by transfer or back-order, stock held, ledger written), then moved along as the
 * counter would have done (dispatches through the same service, so each has its numbered invoice):
 *   Millbrook (trade account): delivered with one old unit booked back, dispatched, being picked, confirmed with a
 *   line more than the shelf holds (the rest by transfer or back-order), and one cancelled and credited.
 *   Tannery Yard (card): one delivered and paid, one waiting for payment after a declined card.
 * Idempotent: each demo order carries its own reference ("DEMO-…") and is only made when missing. Parts are
 * chosen from the seeded catalogue (the first in SKU order with enough stock), so the seed follows the catalogue.
 * Nothing here calls the payment service or sends e-mail.
 */
import { Op, QueryTypes, type Transaction } from 'sequelize'
import { Organisation, User } from '../models/accounts'
import { StockLevel } from '../models/catalogue'
import { Order } from '../models/orders'
import { placeOrder } from '../services/orders/place'
import { bookOrderCharges } from '../services/orders/ledger'
import { cancelOrder } from '../services/orders/cancel'
import { dispatchPicked } from '../services/orders/dispatch'
import { orderIncludes } from '../services/orders/find'
import { getDb } from '../utils/db'
import { formatsFor } from '../../shared/utils/format'

type Stage = 'confirmed' | 'picking' | 'dispatched' | 'delivered' | 'cancelled' | 'awaiting_payment'

interface DemoOrder {
  ref: string
  garage: string
  payment: 'card' | 'account'
  stage: Stage
  daysAgo: number
  /** how many exchange parts (with a core deposit) and how many plain parts */
  exchange: number
  plain: number
  bookCore?: boolean
  /** the first line asks for more than the branch's shelf holds */
  short?: boolean
  decline?: { reason: string; code: string }
}

const DEMO: DemoOrder[] = [
  { ref: 'DEMO-JOB-4471', garage: 'Millbrook Motor Works', payment: 'account', stage: 'delivered', daysAgo: 9, exchange: 1, plain: 1, bookCore: true },
  { ref: 'DEMO-JOB-4502', garage: 'Millbrook Motor Works', payment: 'account', stage: 'dispatched', daysAgo: 2, exchange: 1, plain: 0 },
  { ref: 'DEMO-JOB-4510', garage: 'Millbrook Motor Works', payment: 'account', stage: 'picking', daysAgo: 1, exchange: 0, plain: 2 },
  { ref: 'DEMO-JOB-4513', garage: 'Millbrook Motor Works', payment: 'account', stage: 'confirmed', daysAgo: 0, exchange: 0, plain: 1, short: true },
  { ref: 'DEMO-JOB-4460', garage: 'Millbrook Motor Works', payment: 'account', stage: 'cancelled', daysAgo: 12, exchange: 0, plain: 1 },
  { ref: 'DEMO-TY-0192', garage: 'Tannery Yard Autos', payment: 'card', stage: 'delivered', daysAgo: 6, exchange: 0, plain: 2 },
  {
    ref: 'DEMO-TY-0201', garage: 'Tannery Yard Autos', payment: 'card', stage: 'awaiting_payment', daysAgo: 0, exchange: 0, plain: 1,
    decline: { reason: 'Your card has insufficient funds.', code: 'insufficient_funds' },
  },
]

async function partIdOf(t: Transaction, sku: string): Promise<number> {
  const [row] = await getDb().query<{ id: number }>('SELECT id FROM parts WHERE sku = :sku', { replacements: { sku }, type: QueryTypes.SELECT, transaction: t })
  return row?.id ?? 0
}

async function pickParts(t: Transaction, branchId: number, withDeposit: boolean, count: number, skip: number): Promise<string[]> {
  if (count === 0) return []
  const rows = await getDb().query(
    `SELECT p.sku FROM parts p
       JOIN part_prices pr ON pr.part_id = p.id
       JOIN stock_levels s ON s.part_id = p.id AND s.branch_id = :branchId
     WHERE p.status = 'active' AND s.quantity >= 6 AND ${withDeposit ? 'pr.core_deposit_minor > 0' : "pr.core_deposit_minor = 0 AND p.type IN ('pad_set', 'disc', 'shoe_set', 'fluid', 'hose')"}
     ORDER BY p.sku LIMIT :count OFFSET :skip`,
    { replacements: { branchId, count, skip }, type: QueryTypes.SELECT, transaction: t },
  ) as { sku: string }[]
  return rows.map((r) => r.sku)
}

export async function seedOrders(t: Transaction, log: (s: string) => void): Promise<void> {
  // the seed runs outside the server: the installation's currency comes from the same variables the server reads
  const fmt = formatsFor({ currency: process.env.NUXT_PUBLIC_CURRENCY, locale: process.env.NUXT_PUBLIC_LOCALE, timeZone: process.env.NUXT_PUBLIC_TIME_ZONE })
  let made = 0
  let n = 0
  const counterPerson = await User.findOne({ where: { role: 'counter_staff' }, order: [['id', 'ASC']], transaction: t })
  // oldest first, so the statement's order of entries follows the dates
  for (const d of [...DEMO].sort((a, b) => b.daysAgo - a.daysAgo)) {
    n++
    const org = await Organisation.findOne({ where: { name: d.garage, kind: 'garage' }, transaction: t })
    const manager = org ? await User.findOne({ where: { organisationId: org.id, role: 'garage_manager' }, order: [['id', 'ASC']], transaction: t }) : null
    if (!org || !manager || !org.homeBranchId) continue
    if (await Order.findOne({ where: { organisationId: org.id, garageReference: d.ref }, transaction: t })) continue
    const skus = [
      ...await pickParts(t, org.homeBranchId, true, d.exchange, n % 5),
      ...await pickParts(t, org.homeBranchId, false, d.plain, n * 2),
    ]
    if (skus.length === 0) continue
    const at = (hours: number) => new Date(Date.now() - d.daysAgo * 86_400_000 + hours * 3_600_000)
    const clock = (hours: number) => ({ now: at(hours), timeZone: fmt.timeZone })
    let first = 2
    if (d.short) {
      const shelf = await StockLevel.findOne({ where: { branchId: org.homeBranchId, partId: (await partIdOf(t, skus[0]!)) }, transaction: t })
      first = (shelf?.quantity ?? 0) + 3
    }
    const placed = await placeOrder(t, org.id, manager, {
      lines: skus.map((sku, i) => ({ sku, quantity: i === 0 ? first : 1 })), payment: d.payment, garageReference: d.ref,
    }, null, fmt, at(0))
    const order = (await Order.findByPk(placed.order.id, { include: orderIncludes(), transaction: t }))!
    const ledgerAt = at(0)
    if (d.payment === 'card' && d.stage !== 'awaiting_payment') {
      // paid by card before this demo began: its payment is history, so no payment-service id to refund against
      order.status = 'confirmed'
      order.paymentState = 'paid'
      order.paidAt = at(0.1)
      await order.save({ transaction: t })
      await bookOrderCharges(t, order, `pi_demo_${order.id}`, fmt)
    }
    if (d.decline) {
      order.declineReason = d.decline.reason
      order.declineCode = d.decline.code
      order.declinedAt = at(0.05)
    }
    const reach = ['confirmed', 'picking', 'dispatched', 'delivered'].indexOf(d.stage)
    if (reach >= 1) {
      order.status = 'picking'
      order.pickingAt = at(2)
      await order.save({ transaction: t })
    }
    if (reach >= 2) await dispatchPicked(t, order, counterPerson ?? manager, clock(5), fmt)
    if (reach >= 3) {
      order.status = 'delivered'
      order.deliveredAt = at(26)
    }
    if (d.stage === 'cancelled') {
      // the e-mail it would send is history: the demo sends nothing
      await cancelOrder(t, order, counterPerson ?? manager, 'Ordered for the wrong axle; the garage phoned the counter.', fmt, clock(3))
    }
    await order.save({ transaction: t })
    if (d.bookCore) {
      await getDb().query(
        `UPDATE core_returns SET status = 'booked', quantity_booked = quantity_expected, booked_at = :at, booked_by_user_id = :user,
           garage_note = 'Old unit boxed with its bracket.' WHERE order_id = :id AND status = 'expected'`,
        { replacements: { id: order.id, at: at(30), user: manager.id }, transaction: t },
      )
    }
    // the order's own dates, so lists and the statement read like a few weeks of trade
    await getDb().query('UPDATE orders SET created_at = :at, updated_at = :at WHERE id = :id', { replacements: { at: ledgerAt, id: order.id }, transaction: t })
    await getDb().query('UPDATE ledger_entries SET created_at = :at WHERE order_id = :id AND kind <> :credit', { replacements: { at: ledgerAt, id: order.id, credit: 'credit' }, transaction: t })
    await getDb().query('UPDATE ledger_entries SET created_at = :at WHERE order_id = :id AND kind = :credit', { replacements: { at: at(3), id: order.id, credit: 'credit' }, transaction: t })
    made++
  }
  const total = await Order.count({ where: { garageReference: { [Op.like]: 'DEMO-%' } }, transaction: t })
  log(`orders: ${total} demo orders (${made} new)`)
}
