/**
 * A garage paying what it owes on its trade account by card: a checkout for an amount up to its balance, and,
 * once the payment service says it is paid, one `account_payment` ledger entry under the payment's id (the
 * ledger's unique (kind, external id) makes a second delivery change nothing). Open to a suspended or stopped
 * garage: paying is how it gets back into good standing. The payment settles the oldest items first.
 */
import { randomUUID } from 'node:crypto'
import type Stripe from 'stripe'
import type { Organisation, User } from '../../models/accounts'
import { LedgerEntry } from '../../models/orders'
import { audit } from '../../utils/audit'
import { appLink } from '../../utils/mail'
import { stripeProblem, useStripe } from '../../utils/stripe'
import type { Formats } from '../../../shared/utils/format'
import { balanceOf } from '../orders/credit'
import { DomainError } from '../errors'
import { handleOnce, type EventRef, type Handled } from './record-once'

const idOf = (v: string | { id: string } | null | undefined): string | null => (v == null ? null : typeof v === 'string' ? v : v.id)

/** The garage a checkout pays the account of, when it is an account payment. */
export function accountPaymentOrg(s: Pick<Stripe.Checkout.Session, 'metadata'>): number | null {
  const n = Number(s.metadata?.accountPayment ?? NaN)
  return Number.isSafeInteger(n) && n > 0 ? n : null
}

/** Opens a card checkout for `amountMinor` (at most the balance owed) and returns where to send the browser. */
export async function startAccountCardPayment(org: Organisation, user: Pick<User, 'email'>, amountMinor: number, fmt: Formats): Promise<{ url: string }> {
  const owed = await balanceOf(org.id)
  if (amountMinor > owed) {
    const message = owed > 0 ? `You owe ${fmt.money(owed)}: pay at most that.` : 'Nothing is owed on the trade account.'
    throw new DomainError('invalid', message, { fields: { amountMinor: message }, details: { balanceMinor: owed } })
  }
  const back = appLink('/statement')
  let session: Stripe.Checkout.Session
  try {
    session = await useStripe().checkout.sessions.create({
      mode: 'payment',
      line_items: [{ quantity: 1, price_data: { currency: fmt.currency.toLowerCase(), unit_amount: amountMinor, product_data: { name: `Payment on the trade account of ${org.name}`.slice(0, 250) } } }],
      client_reference_id: `account-${org.id}`,
      metadata: { accountPayment: String(org.id) },
      payment_intent_data: { metadata: { accountPayment: String(org.id) }, description: `Boreline trade account ${org.name}`.slice(0, 250) },
      customer_email: user.email,
      success_url: `${back}?paid=card&session_id={CHECKOUT_SESSION_ID}`,
      cancel_url: `${back}?paid=left`,
    }, { idempotencyKey: `boreline-account-${org.id}-${randomUUID()}` })
  } catch (err) {
    console.error('[boreline] payment service error:', stripeProblem(err))
    throw new DomainError('upstream', 'The card payment service did not answer properly, so nothing was charged. Please try again in a moment.')
  }
  if (!session.url) throw new DomainError('upstream', 'The card payment service did not open a payment page. Please try again.')
  return { url: session.url }
}

/** Books a completed account checkout once: a negative `account_payment` entry keyed on the payment's id. */
export function settleAccountCardPayment(s: Stripe.Checkout.Session, evt: EventRef | null, fmt: Formats): Promise<Handled> {
  return handleOnce(evt, null, async (t) => {
    const organisationId = accountPaymentOrg(s)
    const pi = idOf(s.payment_intent) ?? s.id
    if (!organisationId) return { outcome: 'ignored: no trade account named' }
    if (s.status !== 'complete' || s.payment_status !== 'paid') return { outcome: `not paid (${s.status}, ${s.payment_status})` }
    if ((s.currency ?? '').toLowerCase() !== fmt.currency.toLowerCase()) return { outcome: `refused: currency ${s.currency}` }
    const externalId = `card:${pi}`
    if (await LedgerEntry.findOne({ where: { kind: 'account_payment', externalId }, transaction: t })) return { outcome: 'already booked' }
    const amountMinor = s.amount_total ?? 0
    const entry = await LedgerEntry.create({
      organisationId, orderId: null, kind: 'account_payment', amountMinor: -amountMinor, reference: `CARD-${pi.slice(-8).toUpperCase()}`,
      description: `Paid by card on ${fmt.day(new Date())}`, externalId,
    }, { transaction: t })
    await audit(t, {
      actorUserId: null, organisationId, entity: 'ledger_entry', entityId: entry.id, action: 'tradeAccount.card_payment_received',
      changes: { amountMinor, paymentIntent: pi, session: s.id },
    })
    return { outcome: 'account payment booked' }
  })
}
