/**
 * Card payment end to end: order -> checkout through the stripe SDK -> the fake's hosted page -> signed
 * `checkout.session.completed` -> the order is paid. Then what the webhook must refuse or ignore: replays,
 * bad and stale signatures, forged claims, and events that arrive late or out of order.
 * The signature format is the SDK's own (`stripe.webhooks.generateTestHeaderString`), the reference here.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { as, env, waitForMail, type Client } from '../support/api'
import {
  eventOf, eventsFor, fake, ledgerOf, makeGarage, makePart, orderRow, payOnFake, postEvent, sessionIdOf, snapshot, stockOf,
  type TestGarage, type TestPart,
} from '../support/orders'

await setup({ host: env().baseUrl })

let garage: TestGarage
let part: TestPart
let c: Client

beforeAll(async () => {
  garage = await makeGarage({ terms: 'card', label: 'Card Garage' })
  // no tier: the net price is the list price
  part = await makePart({ listPriceMinor: 5000, coreDepositMinor: 1500, stock: { NGT: 40 } })
  c = await as(garage.email)
})

async function cardOrder(quantity = 1) {
  const r = await c.post('/api/orders', { lines: [{ sku: part.sku, quantity }], payment: 'card' })
  expect(r.status, r.text).toBe(201)
  return r.body
}

async function openCheckout(orderId: number): Promise<{ url: string; sessionId: string }> {
  const r = await c.post(`/api/orders/${orderId}/checkout`)
  expect(r.status, r.text).toBe(200)
  return { url: r.body.url, sessionId: sessionIdOf(r.body.url) }
}

describe('card payment through the payment fake', () => {
  it('takes an order from checkout to paid through the hosted page and the signed webhook', async () => {
    const before = await stockOf(part.id)
    const order = await cardOrder(2)
    expect(order).toMatchObject({ status: 'awaiting_payment', paymentMethod: 'card', paymentState: 'unpaid', currency: 'GBP' })
    // 2 x £50.00 = £100.00; VAT at the UK standard rate of 20 % (gov.uk "VAT rates") = £20.00; deposits 2 x £15.00
    // = £30.00 with their VAT at the part's rate, £6.00 (shared/utils/order-totals.ts): £156.00
    expect(order).toMatchObject({ subtotalMinor: 10_000, taxMinor: 2_600, coreDepositMinor: 3_000, totalMinor: 15_600 })
    expect(await stockOf(part.id)).toBe(before - 2) // held from the moment the order exists

    const { url, sessionId } = await openCheckout(order.id)
    expect(url.startsWith(`${env().paymentsUrl}/pay/cs_test_`)).toBe(true)
    // the SDK call: minor units, order id in metadata and client_reference_id, an idempotency key from the order
    const created = (await fake('GET', '/_fake/requests?path=/v1/checkout/sessions&method=POST')).json.data
      .filter((r: { idempotencyKey: string }) => r.idempotencyKey?.startsWith(`boreline-order-${order.id}-`))
    expect(created).toHaveLength(1)
    const body = created[0].body
    expect(String(body.client_reference_id)).toBe(String(order.id))
    expect(String(body.metadata.orderId)).toBe(String(order.id))
    const items = body.line_items as { quantity: string; price_data: { unit_amount: string; currency: string } }[]
    expect(items.reduce((s, i) => s + Number(i.price_data.unit_amount) * Number(i.quantity), 0)).toBe(15_600)
    expect(items.every((i) => i.price_data.currency === 'gbp')).toBe(true)

    // asking again gives the same open checkout, not a second one
    expect((await openCheckout(order.id)).sessionId).toBe(sessionId)

    // the garage pays on the hosted page (an HTML form with a field named card)
    const pay = await fetch(url, { method: 'POST', body: new URLSearchParams({ card: '4242 4242 4242 4242' }), redirect: 'manual' })
    expect(pay.status).toBe(303)
    const back = new URL(pay.headers.get('location')!)
    expect(back.origin).toBe(env().baseUrl)
    expect(back.pathname).toBe(`/orders/${order.id}`)
    expect(back.searchParams.get('session_id')).toBe(sessionId)

    const delivered = await eventsFor(sessionId, 'checkout.session.completed')
    expect(delivered).toHaveLength(1)
    expect(delivered[0]!.deliveries[0].status).toBe(200)
    const paid = (await c.get(`/api/orders/${order.id}`)).body
    expect(paid).toMatchObject({ status: 'confirmed', paymentState: 'paid', decline: null })
    expect(paid.can).toMatchObject({ pay: false, invoice: true })
    // the old units are expected once the parts leave
    expect(paid.coreReturns).toHaveLength(0)
    // the charge and the payment that settles it
    const ledger = await ledgerOf(garage.id)
    expect(ledger.slice(-3)).toEqual([
      { kind: 'order', amountMinor: 12_000, externalId: null },
      { kind: 'core_deposit', amountMinor: 3_600, externalId: null },
      { kind: 'payment', amountMinor: -15_600, externalId: expect.stringMatching(/^pi_/) },
    ])
    await waitForMail(garage.email, new RegExp(`Payment received for order ${paid.reference}`))
    // paying again is refused
    expect((await c.post(`/api/orders/${order.id}/checkout`)).status).toBe(409)
  })

  it('acknowledges a replayed event and changes nothing', async () => {
    const order = await cardOrder(1)
    const { sessionId } = await openCheckout(order.id)
    await payOnFake(sessionId)
    const before = await snapshot(order.id, garage.id)
    expect(before.order?.paymentState).toBe('paid')
    const [evt] = await eventsFor(sessionId, 'checkout.session.completed')
    const again = await fake('POST', `/_fake/events/${evt!.event.id}/resend?duplicate=3`)
    expect(again.json.deliveries.map((d: { status: number }) => d.status)).toEqual([200, 200, 200])
    expect(await snapshot(order.id, garage.id)).toEqual(before)
    // the same event posted directly, correctly signed: still a duplicate
    const direct = await postEvent(evt!.event)
    expect(direct.status).toBe(200)
    expect(direct.body.duplicate).toBe(true)
    expect(await snapshot(order.id, garage.id)).toEqual(before)
  })

  it('refuses an event with a bad, stale or missing signature and changes nothing', async () => {
    const order = await cardOrder(1)
    const { sessionId } = await openCheckout(order.id)
    const before = await snapshot(order.id, garage.id)
    const forged = eventOf('checkout.session.completed', {
      id: sessionId, object: 'checkout.session', status: 'complete', payment_status: 'paid', amount_total: order.totalMinor,
      currency: 'gbp', metadata: { orderId: String(order.id) }, client_reference_id: String(order.id),
    })
    for (const signature of ['invalid', 'stale', 'none'] as const) {
      const r = await postEvent(forged, { signature })
      expect(r.status, signature).toBe(400)
    }
    // tampering after signing breaks the signature too
    const tampered = await fetch(`${env().baseUrl}/api/webhooks/stripe`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'stripe-signature': `t=${Math.floor(Date.now() / 1000)},v1=${'0'.repeat(64)}` },
      body: JSON.stringify(forged),
    })
    expect(tampered.status).toBe(400)
    expect(await snapshot(order.id, garage.id)).toEqual(before)

    // a correctly signed claim is still checked against the payment service: the session is open, so not paid
    const claimed = await postEvent(forged)
    expect(claimed.status).toBe(200)
    expect(claimed.body.outcome).toMatch(/not paid/)
    expect(await snapshot(order.id, garage.id)).toEqual(before)

    // the fake's own delivery with a broken or old signature is refused as well
    const declined = await payOnFake(sessionId, '4000 0000 0000 0002')
    const [evt] = await eventsFor(declined.json.payment_intent.id, 'payment_intent.payment_failed')
    expect(evt).toBeTruthy()
    for (const signature of ['invalid', 'stale']) {
      const r = await fake('POST', `/_fake/events/${evt!.event.id}/resend?signature=${signature}`)
      expect(r.json.deliveries[0].status, signature).toBe(400)
    }
  })

  it('ends in the right state when events arrive late and out of order', async () => {
    const held = await stockOf(part.id)
    const order = await cardOrder(1)
    const { sessionId } = await openCheckout(order.id)
    // an early "completed" for a checkout that has not been paid yet changes nothing
    const early = await postEvent(eventOf('checkout.session.completed', { id: sessionId, object: 'checkout.session' }))
    expect(early.body.outcome).toMatch(/not paid/)

    // first attempt declined, second paid
    const declined = await payOnFake(sessionId, '4000 0000 0000 0002')
    expect(declined.status).toBe(402)
    const piId = declined.json.payment_intent.id as string
    expect((await c.get(`/api/orders/${order.id}`)).body.decline).toMatchObject({ code: 'generic_decline' })
    await payOnFake(sessionId)
    const paid = await snapshot(order.id, garage.id)
    expect(paid.order).toMatchObject({ status: 'confirmed', paymentState: 'paid', declineReason: null })

    // the decline's news arrives again, late, under a new event id: the intent has since succeeded
    const late = await postEvent(eventOf('payment_intent.payment_failed', { id: piId, object: 'payment_intent' }))
    expect(late.status).toBe(200)
    expect(late.body.outcome).toMatch(/ignored/)
    // so does an "expired" for the same checkout: it is complete, the order keeps its stock
    const expired = await postEvent(eventOf('checkout.session.expired', { id: sessionId, object: 'checkout.session' }))
    expect(expired.status).toBe(200)
    expect(await snapshot(order.id, garage.id)).toEqual(paid)
    expect(await stockOf(part.id)).toBe(held - 1)
    const view = (await c.get(`/api/orders/${order.id}`)).body
    expect(view).toMatchObject({ status: 'confirmed', paymentState: 'paid', decline: null })

    // an event about an object the payment service does not know is acknowledged and ignored
    const ghost = await postEvent(eventOf('checkout.session.completed', { id: 'cs_test_not_known_anywhere', object: 'checkout.session' }))
    expect(ghost.status).toBe(200)
    expect(ghost.body.outcome).toMatch(/no such object/)
    // an event type the app does not use is acknowledged
    const other = await postEvent(eventOf('customer.created', { id: 'cus_123', object: 'customer' }))
    expect(other.status).toBe(200)
  })

  it('refuses a paid checkout whose amount does not match the order', async () => {
    const order = await cardOrder(1)
    // a checkout for this order made outside the app, for the wrong amount
    const { default: Stripe } = await import('stripe')
    const port = Number(new URL(env().paymentsUrl).port)
    const sdk = new Stripe('sk_test_e2e', { host: '127.0.0.1', port, protocol: 'http', telemetry: false })
    const s = await sdk.checkout.sessions.create({
      mode: 'payment', client_reference_id: String(order.id), metadata: { orderId: String(order.id) },
      line_items: [{ quantity: 1, price_data: { currency: 'gbp', unit_amount: 100, product_data: { name: 'not the order' } } }],
      success_url: `${env().baseUrl}/`,
    })
    await payOnFake(s.id)
    const row = await orderRow(order.id)
    expect(row).toMatchObject({ status: 'awaiting_payment', paymentState: 'unpaid' })
  })
})
