/**
 * The periodic reconciliation of what lost or late webhooks would have told us: unpaid checkouts that completed
 * or expired, card orders that never opened a checkout (their stock goes back after the hold time), card payments
 * on a trade account completed in the last days (booked once; counted as paid), and refunds that could not be
 * sent yet (cancelled orders, old units, returned parts: the last two counted together).
 * Each pass looks at up to SWEEP_BATCH rows of each kind; the next pass takes
 * the rest, so a backlog drains without one pass holding the payment service for long.
 */
import { Op } from 'sequelize'
import { CoreReturn, Order } from '../../models/orders'
import { PartReturn } from '../../models/counter'
import { stripeProblem, useStripe } from '../../utils/stripe'
import type { Formats } from '../../../shared/utils/format'
import { accountPaymentOrg, settleAccountCardPayment } from './account-card'
import { lapseOrder } from './effects'
import { expireSession, settleSession } from './events'
import { handleOnce } from './record-once'
import { issueCoreRefund, issueOrderRefund, issueReturnRefund } from './refunds'

const SWEEP_BATCH = 200
/** A checkout lives at most 24 hours (the payment service's limit), so three days back covers any late payment. */
const ACCOUNT_PAYMENT_LOOKBACK_S = 3 * 86_400

export interface SweepResult { paid: number; lapsed: number; refunds: number; coreRefunds: number; errors: number }

/** Runs `step` for each row, counting what it reports done and logging (not throwing) what fails. */
async function each<R>(rows: R[], what: (row: R) => string, step: (row: R) => Promise<boolean>, r: SweepResult, done: 'paid' | 'lapsed' | 'refunds' | 'coreRefunds'): Promise<void> {
  for (const row of rows) {
    try {
      if (await step(row)) r[done]++
    } catch (err) {
      r.errors++
      console.error(`[boreline] sweep: ${what(row)}:`, stripeProblem(err))
    }
  }
}

export async function sweepOrders(fmt: Formats, holdMinutes: number, now = new Date()): Promise<SweepResult> {
  const r: SweepResult = { paid: 0, lapsed: 0, refunds: 0, coreRefunds: 0, errors: 0 }
  const waiting = await Order.findAll({ where: { status: 'awaiting_payment', checkoutSessionId: { [Op.ne]: null } }, limit: SWEEP_BATCH })
  for (const o of waiting) {
    try {
      const s = await useStripe().checkout.sessions.retrieve(o.checkoutSessionId!)
      if (s.status === 'complete' && (await settleSession(s, null, fmt)).outcome === 'paid') r.paid++
      if (s.status === 'expired' && (await expireSession(s, null, fmt, o.id)).outcome.startsWith('lapsed')) r.lapsed++
    } catch (err) {
      r.errors++
      console.error(`[boreline] sweep: order ${o.id}:`, stripeProblem(err))
    }
  }
  const stale = await Order.findAll({
    where: { status: 'awaiting_payment', checkoutSessionId: null, createdAt: { [Op.lt]: new Date(now.getTime() - holdMinutes * 60_000) } },
    limit: SWEEP_BATCH,
  })
  await each(stale, (o) => `lapse of order ${o.id}`, async (o) => (await handleOnce(null, o.id, async (t, order) => {
    if (!order || order.status !== 'awaiting_payment' || order.checkoutSessionId) return { outcome: 'ignored' }
    return lapseOrder(t, order, fmt)
  })).outcome.startsWith('lapsed'), r, 'lapsed')
  await sweepAccountPayments(fmt, now, r)
  const refunds = await Order.findAll({ where: { paymentState: 'refund_pending' }, limit: SWEEP_BATCH })
  await each(refunds, (o) => `refund of order ${o.id}`, (o) => issueOrderRefund(o.id, fmt), r, 'refunds')
  const coreRefunds = await CoreReturn.findAll({ where: { refundPending: true }, limit: SWEEP_BATCH })
  await each(coreRefunds, (cr) => `core refund ${cr.id}`, (cr) => issueCoreRefund(cr.id), r, 'coreRefunds')
  const returnRefunds = await PartReturn.findAll({ where: { refundPending: true }, limit: SWEEP_BATCH })
  await each(returnRefunds, (x) => `return refund ${x.id}`, (x) => issueReturnRefund(x.id), r, 'coreRefunds')
  return r
}

/**
 * Trade-account card payments whose webhook never came: no row of ours names their checkout (nothing is booked
 * until paid), so the payment service's completed checkouts of the last days are read instead, and each one naming
 * a trade account is booked (once: the ledger's key on the payment's id).
 */
async function sweepAccountPayments(fmt: Formats, now: Date, r: SweepResult): Promise<void> {
  let seen = 0
  try {
    const since = Math.floor(now.getTime() / 1000) - ACCOUNT_PAYMENT_LOOKBACK_S
    for await (const s of useStripe().checkout.sessions.list({ status: 'complete', created: { gte: since }, limit: 100 })) {
      if (++seen > SWEEP_BATCH * 5) break
      if (!accountPaymentOrg(s)) continue
      await each([s], (x) => `account payment ${x.id}`, async (x) => (await settleAccountCardPayment(x, null, fmt)).outcome === 'account payment booked', r, 'paid')
    }
  } catch (err) {
    r.errors++
    console.error('[boreline] sweep: account payments:', stripeProblem(err))
  }
}
