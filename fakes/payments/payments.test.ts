/**
 * Self-test of the payment fake, driven by the real `stripe` SDK (the reference outside this project):
 * its error classes, its webhook verifier `stripe.webhooks.constructEvent` and its signer
 * `stripe.webhooks.generateTestHeaderString` judge what the fake sends.
 */
import http from 'node:http'
import type { AddressInfo } from 'node:net'
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest'
import Stripe from 'stripe'
import { decodeForm } from './form'
import { createPaymentsFake, type PaymentsFake } from './server'

const SECRET = 'whsec_selftest_secret'

interface Received {
  headers: http.IncomingHttpHeaders
  body: string
}

/** A tiny webhook receiver that keeps the raw body, answering with queued statuses (200 when empty). */
async function startReceiver() {
  const received: Received[] = []
  const statuses: number[] = []
  const server = http.createServer((req, res) => {
    const chunks: Buffer[] = []
    req.on('data', (c: Buffer) => chunks.push(c))
    req.on('end', () => {
      received.push({ headers: req.headers, body: Buffer.concat(chunks).toString('utf8') })
      res.writeHead(statuses.shift() ?? 200).end()
    })
  })
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r))
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}/hook`
  return {
    url,
    received,
    statuses,
    close: () => new Promise<void>((r) => { server.closeAllConnections(); server.close(() => r()) }),
  }
}

async function until<T>(fn: () => T | undefined, what: string, ms = 5000): Promise<T> {
  const start = Date.now()
  for (;;) {
    const v = fn()
    if (v !== undefined) return v
    if (Date.now() - start > ms) throw new Error(`timed out waiting for ${what}`)
    await new Promise((r) => setTimeout(r, 20))
  }
}

let fake: PaymentsFake
let base: string
let port: number
let stripe: Stripe
let receiver: Awaited<ReturnType<typeof startReceiver>>

type Loose = any

async function call(method: 'GET' | 'POST', path: string, body?: unknown): Promise<{ status: number; json: Loose }> {
  const res = await fetch(`${base}${path}`, {
    method,
    headers: { 'content-type': 'application/json' },
    ...(body === undefined ? {} : { body: JSON.stringify(body) }),
  })
  return { status: res.status, json: await res.json() }
}
const get = (path: string) => call('GET', path)
const post = (path: string, body: unknown = {}) => call('POST', path, body)

const events = (type: string) =>
  receiver.received.map((r) => JSON.parse(r.body) as Stripe.Event).filter((e) => e.type === type)

function sessionParams(overrides: Partial<Stripe.Checkout.SessionCreateParams> = {}): Stripe.Checkout.SessionCreateParams {
  return {
    mode: 'payment',
    line_items: [
      { price_data: { currency: 'gbp', unit_amount: 1250, product_data: { name: 'Front pad set' } }, quantity: 2 },
      { price_data: { currency: 'gbp', unit_amount: 4999, product_data: { name: 'Disc 280 mm' } }, quantity: 1 },
    ],
    metadata: { orderId: '42' },
    client_reference_id: '42',
    success_url: 'http://shop.test/orders/42?session={CHECKOUT_SESSION_ID}',
    cancel_url: 'http://shop.test/orders/42',
    ...overrides,
  }
}

beforeAll(async () => {
  receiver = await startReceiver()
  fake = createPaymentsFake({ port: 0, webhookUrl: receiver.url, webhookSecret: SECRET, webhookRetryBaseMs: 20, webhookMaxAttempts: 3 })
  const started = await fake.listen()
  base = started.url
  port = started.port
  stripe = new Stripe('sk_test_x', { host: '127.0.0.1', port, protocol: 'http', telemetry: false, maxNetworkRetries: 0 })
})

afterAll(async () => {
  await fake.close()
  await receiver.close()
})

beforeEach(() => {
  receiver.received.length = 0
  receiver.statuses.length = 0
})

describe('form decoding', () => {
  it('turns bracketed keys into nested objects and arrays, keeping values as strings', () => {
    // observed SDK behaviour: brackets unencoded, indexes always present, every value a string
    const body = 'line_items[0][price_data][unit_amount]=1250&line_items[0][quantity]=2&line_items[1][quantity]=1&metadata[orderId]=42&expand[0]=payment_intent&success_url=http%3A%2F%2Fa.test%2F%3Fs%3D%7BCHECKOUT_SESSION_ID%7D'
    expect(decodeForm(body)).toEqual({
      line_items: [{ price_data: { unit_amount: '1250' }, quantity: '2' }, { quantity: '1' }],
      metadata: { orderId: '42' },
      expand: ['payment_intent'],
      success_url: 'http://a.test/?s={CHECKOUT_SESSION_ID}',
    })
  })

  it('refuses prototype keys and value/hash clashes', () => {
    expect(() => decodeForm('__proto__[x]=1')).toThrow(/Invalid parameter name/)
    expect(() => decodeForm('a=1&a[b]=2')).toThrow(/both as a value and as a hash/)
  })
})

describe('authentication and plumbing', () => {
  it('answers a missing or non-test key with 401, which the SDK raises as StripeAuthenticationError', async () => {
    // observed SDK behaviour: the HTTP status chooses the error class (401 -> StripeAuthenticationError)
    const wrong = new Stripe('pk_test_x', { host: '127.0.0.1', port, protocol: 'http', telemetry: false, maxNetworkRetries: 0 })
    await expect(wrong.checkout.sessions.list()).rejects.toBeInstanceOf(Stripe.errors.StripeAuthenticationError)
    const res = await fetch(`${base}/v1/checkout/sessions`)
    expect(res.status).toBe(401)
    expect((await res.json()).error.message).toMatch(/did not provide an API key/)
  })

  it('sends Request-Id, never Stripe-Notice, and 404s an unknown endpoint', async () => {
    const res = await fetch(`${base}/v1/nothing_here`, { headers: { authorization: 'Bearer sk_test_x' } })
    expect(res.status).toBe(404)
    expect(res.headers.get('request-id')).toMatch(/^req_/)
    expect(res.headers.get('stripe-notice')).toBeNull()
    const s = await stripe.checkout.sessions.create(sessionParams())
    expect(s.lastResponse.requestId).toMatch(/^req_/)
  })
})

describe('checkout sessions', () => {
  it('creates and retrieves a session with totals, metadata and a hosted page url', async () => {
    const before = Math.floor(Date.now() / 1000)
    const s = await stripe.checkout.sessions.create(sessionParams())
    expect(s.id).toMatch(/^cs_test_/)
    expect(s.object).toBe('checkout.session')
    expect(s.status).toBe('open')
    expect(s.payment_status).toBe('unpaid')
    expect(s.amount_total).toBe(1250 * 2 + 4999) // sum of unit_amount x quantity
    expect(s.currency).toBe('gbp')
    expect(s.metadata).toEqual({ orderId: '42' })
    expect(s.client_reference_id).toBe('42')
    expect(s.payment_intent).toBeNull() // observed SDK behaviour: null until the customer pays
    expect(s.url).toBe(`${base}/pay/${s.id}`)
    // default lifetime 24 h (observed SDK behaviour / API reference)
    expect(s.expires_at - before).toBeGreaterThanOrEqual(24 * 3600 - 1)
    expect(s.expires_at - before).toBeLessThanOrEqual(24 * 3600 + 1)

    const again = await stripe.checkout.sessions.retrieve(s.id)
    expect(again.id).toBe(s.id)
    expect(again.amount_total).toBe(s.amount_total)
  })

  it('lists line items with amounts', async () => {
    const s = await stripe.checkout.sessions.create(sessionParams())
    const items = await stripe.checkout.sessions.listLineItems(s.id)
    expect(items.object).toBe('list')
    expect(items.data.map((li) => [li.description, li.quantity, li.amount_total])).toEqual([
      ['Front pad set', 2, 2500],
      ['Disc 280 mm', 1, 4999],
    ])
    expect(items.data[0]?.price?.unit_amount).toBe(1250)
    const expanded = await stripe.checkout.sessions.retrieve(s.id, { expand: ['line_items'] })
    expect(expanded.line_items?.data).toHaveLength(2)
  })

  it('expires an open session (and refuses to expire it twice)', async () => {
    const s = await stripe.checkout.sessions.create(sessionParams())
    const expired = await stripe.checkout.sessions.expire(s.id)
    expect(expired.status).toBe('expired')
    expect(expired.url).toBeNull()
    await expect(stripe.checkout.sessions.expire(s.id)).rejects.toBeInstanceOf(Stripe.errors.StripeInvalidRequestError)
    const ev = await until(() => events('checkout.session.expired')[0], 'checkout.session.expired')
    expect((ev.data.object as Stripe.Checkout.Session).id).toBe(s.id)
  })

  it('rejects bad requests with StripeInvalidRequestError naming the parameter', async () => {
    const now = Math.floor(Date.now() / 1000)
    const cases: [Stripe.Checkout.SessionCreateParams, string][] = [
      [sessionParams({ line_items: [] }), 'line_items'],
      [sessionParams({ expires_at: now + 10 * 60 }), 'expires_at'], // under 30 min (API reference, from memory)
      [sessionParams({ expires_at: now + 25 * 3600 }), 'expires_at'], // over 24 h
      [{ ...sessionParams(), mode: undefined } as unknown as Stripe.Checkout.SessionCreateParams, 'mode'],
      [{ ...sessionParams(), colour: 'red' } as unknown as Stripe.Checkout.SessionCreateParams, 'colour'],
      [sessionParams({ line_items: [{ price_data: { currency: 'gbp', unit_amount: 100, product_data: { name: 'x' } } }] }), 'line_items[0][quantity]'],
    ]
    for (const [params, param] of cases) {
      const err = await stripe.checkout.sessions.create(params).catch((e: unknown) => e)
      expect(err, param).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError)
      expect((err as Stripe.errors.StripeError).param, param).toBe(param)
      expect((err as Stripe.errors.StripeError).statusCode).toBe(400)
    }
    const inRange = await stripe.checkout.sessions.create(sessionParams({ expires_at: now + 3600 }))
    expect(inRange.expires_at).toBe(now + 3600)
  })

  it('answers an unknown id with 404 resource_missing', async () => {
    const err = await stripe.checkout.sessions.retrieve('cs_test_missing').catch((e: unknown) => e)
    expect(err).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError)
    expect((err as Stripe.errors.StripeError).statusCode).toBe(404)
    expect((err as Stripe.errors.StripeError).code).toBe('resource_missing')
  })

  it('words parameter errors as the API does, naming the bracketed parameter', async () => {
    // API reference (from memory): parameter_unknown / parameter_missing / parameter_invalid with these messages
    const form = 'mode=payment&line_items[0][price_data][currency]=gbp&line_items[0][price_data][unit_amount]=1250&line_items[0][price_data][product_data][name]=Pad'
    const cases: [string, string, string, string][] = [
      [`${form}&line_items[0][quantity]=1&line_items[0][colour]=red`, 'parameter_unknown', 'line_items[0][colour]', 'Received unknown parameter: line_items[0][colour]'],
      [form, 'parameter_missing', 'line_items[0][quantity]', 'Missing required param: line_items[0][quantity].'],
      [`${form}&line_items[0][quantity]=two`, 'parameter_invalid', 'line_items[0][quantity]', 'Invalid integer: two'],
      [`${form}&line_items[0][quantity]=0`, 'parameter_invalid', 'line_items[0][quantity]', 'Invalid positive integer'],
      [`${form}&line_items[0][quantity]=1&submit_type=later`, 'parameter_invalid', 'submit_type', 'Invalid submit_type: must be one of auto, book, donate, pay'],
      [`${form}&line_items[0][quantity]=1&metadata[${'k'.repeat(41)}]=1`, 'parameter_invalid', `metadata[${'k'.repeat(41)}]`, `Invalid metadata key ${'k'.repeat(41)}: at most 40 characters`],
    ]
    for (const [body, code, param, message] of cases) {
      const res = await fetch(`${base}/v1/checkout/sessions`, {
        method: 'POST',
        headers: { authorization: 'Bearer sk_test_x', 'content-type': 'application/x-www-form-urlencoded' },
        body,
      })
      expect(res.status, param).toBe(400)
      expect((await res.json()).error, param).toEqual({ type: 'invalid_request_error', code, param, message })
    }
  })
})

describe('idempotency', () => {
  it('replays the first response for a key and refuses the key with other parameters', async () => {
    // observed SDK behaviour: the first response for a key is replayed; other params -> idempotency_error
    const key = `order-42-${Date.now()}`
    const a = await stripe.checkout.sessions.create(sessionParams(), { idempotencyKey: key })
    const b = await stripe.checkout.sessions.create(sessionParams(), { idempotencyKey: key })
    expect(b.id).toBe(a.id)
    expect(b.lastResponse.headers['idempotent-replayed']).toBe('true')
    const err = await stripe.checkout.sessions.create(sessionParams({ client_reference_id: '43' }), { idempotencyKey: key }).catch((e: unknown) => e)
    expect(err).toBeInstanceOf(Stripe.errors.StripeIdempotencyError)
    const seen = await get(`/_fake/requests?path=/v1/checkout/sessions`)
    const mine = (seen.json.data as { idempotencyKey: string; replayed?: boolean; body: Loose }[]).filter((r) => r.idempotencyKey === key)
    expect(mine).toHaveLength(3)
    expect(mine[1]?.replayed).toBe(true)
    expect(mine[0]?.body.line_items[0].price_data.unit_amount).toBe('1250') // as sent on the wire
  })

  it('replays even a server error for the same key', async () => {
    const key = `fail-${Date.now()}`
    await post('/_fake/fail-next', { status: 500, count: 1, path: '/v1/checkout/sessions' })
    await expect(stripe.checkout.sessions.create(sessionParams(), { idempotencyKey: key })).rejects.toBeInstanceOf(Stripe.errors.StripeAPIError)
    await expect(stripe.checkout.sessions.create(sessionParams(), { idempotencyKey: key })).rejects.toBeInstanceOf(Stripe.errors.StripeAPIError)
    const fresh = await stripe.checkout.sessions.create(sessionParams(), { idempotencyKey: `${key}-2` })
    expect(fresh.status).toBe('open')
  })
})

describe('hosted page and webhooks', () => {
  it('serves an accessible form with a card field, pay button and cancel link', async () => {
    const s = await stripe.checkout.sessions.create(sessionParams())
    const res = await fetch(s.url as string)
    expect(res.status).toBe(200)
    const html = await res.text()
    expect(html).toMatch(/<label for="card">/)
    expect(html).toMatch(/<input id="card" name="card"/)
    expect(html).toMatch(/<button type="submit">Pay £74\.99<\/button>/) // 2 x 12.50 + 49.99
    expect(html).toContain(`href="/pay/${s.id}/cancel"`)
    const cancel = await fetch(`${base}/pay/${s.id}/cancel`, { redirect: 'manual' })
    expect(cancel.status).toBe(303)
    expect(cancel.headers.get('location')).toBe('http://shop.test/orders/42')
    expect((await stripe.checkout.sessions.retrieve(s.id)).status).toBe('open')
  })

  it('takes 4242 4242 4242 4242, redirects to success_url and delivers a verifiable signed event', async () => {
    const s = await stripe.checkout.sessions.create(sessionParams())
    const res = await fetch(s.url as string, {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: 'card=4242+4242+4242+4242',
      redirect: 'manual',
    })
    expect(res.status).toBe(303)
    // observed SDK behaviour: {CHECKOUT_SESSION_ID} substituted on redirect
    expect(res.headers.get('location')).toBe(`http://shop.test/orders/42?session=${s.id}`)

    // the first delivery attempt is made before the redirect
    const delivery = receiver.received.find((r) => JSON.parse(r.body).type === 'checkout.session.completed')
    expect(delivery).toBeDefined()
    const header = delivery?.headers['stripe-signature'] as string
    const raw = delivery?.body as string
    const event = stripe.webhooks.constructEvent(raw, header, SECRET) // real verifier, default tolerance 300 s
    expect(event.type).toBe('checkout.session.completed')
    expect(event.id).toMatch(/^evt_/)
    expect(event.object).toBe('event')
    expect(event.livemode).toBe(false)
    const obj = event.data.object as Stripe.Checkout.Session
    expect(obj.id).toBe(s.id)
    expect(obj.payment_status).toBe('paid')
    expect(obj.metadata).toEqual({ orderId: '42' })
    const timestamp = Number(/t=(\d+)/.exec(header)?.[1])
    expect(stripe.webhooks.generateTestHeaderString({ payload: raw, secret: SECRET, timestamp })).toBe(header)
    expect(() => stripe.webhooks.constructEvent(raw, header, 'whsec_other')).toThrow(Stripe.errors.StripeSignatureVerificationError)

    const paid = await stripe.checkout.sessions.retrieve(s.id, { expand: ['payment_intent'] })
    expect(paid.status).toBe('complete')
    expect(paid.payment_status).toBe('paid')
    expect(paid.url).toBeNull()
    const pi = paid.payment_intent as Stripe.PaymentIntent
    expect(pi.id).toMatch(/^pi_/)
    expect(pi.status).toBe('succeeded')
    expect(pi.amount).toBe(7499)
    expect(pi.latest_charge).toMatch(/^ch_/)
    const again = await fetch(s.url as string, { method: 'POST', body: new URLSearchParams({ card: '4242424242424242' }) })
    expect(again.status).toBe(409) // a complete session takes no second payment
  })

  it('shows declines on the page and keeps the session open; the next good card pays', async () => {
    const s = await stripe.checkout.sessions.create(sessionParams())
    const cases = [
      ['4000 0000 0000 0002', 'generic_decline', 'Your card was declined.'],
      ['4000 0000 0000 9995', 'insufficient_funds', 'Your card has insufficient funds.'],
    ] as const
    for (const [card, declineCode, message] of cases) {
      const res = await fetch(s.url as string, { method: 'POST', body: new URLSearchParams({ card }), redirect: 'manual' })
      expect(res.status).toBe(402)
      const html = await res.text()
      expect(html).toContain('role="alert"')
      expect(html).toContain(message)
      const open = await stripe.checkout.sessions.retrieve(s.id, { expand: ['payment_intent'] })
      expect(open.status).toBe('open')
      expect(open.payment_status).toBe('unpaid')
      const pi = open.payment_intent as Stripe.PaymentIntent
      expect(pi.status).toBe('requires_payment_method')
      expect(pi.last_payment_error?.code).toBe('card_declined')
      expect(pi.last_payment_error?.decline_code).toBe(declineCode)
    }
    expect(events('checkout.session.completed')).toHaveLength(0)
    const bad = await fetch(s.url as string, { method: 'POST', body: new URLSearchParams({ card: '1234' }) })
    expect(bad.status).toBe(400)
    expect(await bad.text()).toContain('Your card number is invalid.')

    const done = await post(`/_fake/sessions/${s.id}/complete`)
    expect(done.status).toBe(200)
    expect(done.json.session.status).toBe('complete')
    expect(done.json.delivery.ok).toBe(true)
    const pi = await stripe.paymentIntents.retrieve(done.json.session.payment_intent)
    expect(pi.status).toBe('succeeded')
    expect(pi.last_payment_error).toBeNull()
  })

  it('retries a failed delivery with back-off and replays events on request', async () => {
    receiver.statuses.push(500, 503)
    const s = await stripe.checkout.sessions.create(sessionParams())
    const done = await post(`/_fake/sessions/${s.id}/complete`)
    expect(done.json.delivery.status).toBe(500)
    await until(() => (events('checkout.session.completed').length >= 3 ? true : undefined), 'three attempts')
    const log = await get('/_fake/events?type=checkout.session.completed')
    const entry = (log.json.data as { event: { id: string }; deliveries: { status: number; attempt: number }[] }[]).at(-1)
    expect(entry?.deliveries.map((d) => [d.attempt, d.status])).toEqual([[1, 500], [2, 503], [3, 200]])

    const id = entry?.event.id as string
    receiver.received.length = 0
    const resent = await post(`/_fake/events/${id}/resend?duplicate=2`)
    expect(resent.status).toBe(200)
    expect(receiver.received).toHaveLength(2)
    for (const r of receiver.received) {
      const ev = stripe.webhooks.constructEvent(r.body, r.headers['stripe-signature'] as string, SECRET)
      expect(ev.id).toBe(id) // the same event id twice: receivers must de-duplicate
    }
    receiver.received.length = 0
    await post(`/_fake/events/${id}/resend?signature=stale`)
    const stale = receiver.received[0] as Received
    expect(() => stripe.webhooks.constructEvent(stale.body, stale.headers['stripe-signature'] as string, SECRET)).toThrow(/tolerance/)
  })

  it('lists and retrieves events through the SDK', async () => {
    const s = await stripe.checkout.sessions.create(sessionParams())
    await post(`/_fake/sessions/${s.id}/complete`)
    const list = await stripe.events.list({ type: 'checkout.session.completed', limit: 1 })
    expect(list.data).toHaveLength(1)
    const ev = list.data[0] as Stripe.Event
    expect((ev.data.object as Stripe.Checkout.Session).id).toBe(s.id)
    const one = await stripe.events.retrieve(ev.id)
    expect(one.type).toBe('checkout.session.completed')
    expect(one.api_version).toBe(Stripe.API_VERSION)
  })
})

describe('payment intents', () => {
  it('raises StripeCardError with decline_code for declined test cards', async () => {
    // observed SDK behaviour: 402 -> StripeCardError
    const err = await stripe.paymentIntents
      .create({ amount: 2000, currency: 'gbp', payment_method: 'pm_card_chargeDeclinedInsufficientFunds', confirm: true })
      .catch((e: unknown) => e)
    expect(err).toBeInstanceOf(Stripe.errors.StripeCardError)
    const e = err as Stripe.errors.StripeCardError
    expect(e.statusCode).toBe(402)
    expect(e.code).toBe('card_declined')
    expect(e.decline_code).toBe('insufficient_funds')
    expect(e.payment_intent?.status).toBe('requires_payment_method')
    const generic = await stripe.paymentIntents.create({ amount: 2000, currency: 'gbp' })
    const declined = await stripe.paymentIntents.confirm(generic.id, { payment_method: 'pm_card_chargeDeclined' }).catch((x: unknown) => x)
    expect((declined as Stripe.errors.StripeCardError).decline_code).toBe('generic_decline')
  })

  it('confirms, captures and cancels with the documented state rules', async () => {
    const pi = await stripe.paymentIntents.create({ amount: 3000, currency: 'gbp' })
    expect(pi.status).toBe('requires_payment_method')
    const ok = await stripe.paymentIntents.confirm(pi.id, { payment_method: 'pm_card_visa' })
    expect(ok.status).toBe('succeeded')
    expect(ok.amount_received).toBe(3000)
    expect(ok.latest_charge).toMatch(/^ch_/)
    await expect(stripe.paymentIntents.cancel(pi.id)).rejects.toBeInstanceOf(Stripe.errors.StripeInvalidRequestError)

    const held = await stripe.paymentIntents.create({ amount: 5000, currency: 'gbp', capture_method: 'manual', payment_method: 'pm_card_visa', confirm: true })
    expect(held.status).toBe('requires_capture')
    const captured = await stripe.paymentIntents.capture(held.id, { amount_to_capture: 4000 })
    expect(captured.status).toBe('succeeded')
    expect(captured.amount_received).toBe(4000)

    const dropped = await stripe.paymentIntents.create({ amount: 5000, currency: 'gbp' })
    const canceled = await stripe.paymentIntents.cancel(dropped.id, { cancellation_reason: 'abandoned' })
    expect(canceled.status).toBe('canceled')
    await expect(stripe.paymentIntents.capture(dropped.id)).rejects.toBeInstanceOf(Stripe.errors.StripeInvalidRequestError)
  })
})

describe('refunds', () => {
  it('refunds up to what was captured, then refuses; each refund is a signed event', async () => {
    const s = await stripe.checkout.sessions.create(sessionParams())
    const done = await post(`/_fake/sessions/${s.id}/complete`)
    const piId = done.json.session.payment_intent as string

    const part = await stripe.refunds.create({ payment_intent: piId, amount: 2500 }, { idempotencyKey: `refund-${piId}-1` })
    expect(part.id).toMatch(/^re_/)
    expect(part.status).toBe('succeeded')
    expect(part.amount).toBe(2500)
    expect(part.payment_intent).toBe(piId)
    const replay = await stripe.refunds.create({ payment_intent: piId, amount: 2500 }, { idempotencyKey: `refund-${piId}-1` })
    expect(replay.id).toBe(part.id)

    const tooMuch = await stripe.refunds.create({ payment_intent: piId, amount: 5000 }).catch((e: unknown) => e)
    expect(tooMuch).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError)
    expect((tooMuch as Stripe.errors.StripeError).param).toBe('amount')

    const rest = await stripe.refunds.create({ payment_intent: piId })
    expect(rest.amount).toBe(7499 - 2500)
    const again = await stripe.refunds.create({ payment_intent: piId }).catch((e: unknown) => e)
    expect((again as Stripe.errors.StripeError).code).toBe('charge_already_refunded')

    expect((await stripe.refunds.retrieve(part.id)).amount).toBe(2500)
    const charge = await stripe.charges.retrieve(String(done.json.payment_intent.latest_charge))
    expect(charge.amount_refunded).toBe(7499)
    expect(charge.refunded).toBe(true)

    const refunded = await until(() => (events('charge.refunded').length === 2 ? events('charge.refunded') : undefined), 'charge.refunded x2')
    for (const r of receiver.received.filter((x) => JSON.parse(x.body).type === 'refund.created')) {
      expect(stripe.webhooks.constructEvent(r.body, r.headers['stripe-signature'] as string, SECRET).type).toBe('refund.created')
    }
    expect((refunded[1]?.data.object as Stripe.Charge).amount_refunded).toBe(7499)
  })

  it('refuses to refund an intent that was never paid', async () => {
    const pi = await stripe.paymentIntents.create({ amount: 3000, currency: 'gbp' })
    await expect(stripe.refunds.create({ payment_intent: pi.id })).rejects.toBeInstanceOf(Stripe.errors.StripeInvalidRequestError)
  })
})

describe('control routes', () => {
  it('advancing the clock expires sessions past expires_at and sends checkout.session.expired', async () => {
    const now = Math.floor(Date.now() / 1000)
    const short = await stripe.checkout.sessions.create(sessionParams({ expires_at: now + 31 * 60 }))
    const long = await stripe.checkout.sessions.create(sessionParams())
    const adv = await post('/_fake/clock/advance', { seconds: 32 * 60 })
    expect(adv.json.expired).toContain(short.id)
    expect(adv.json.expired).not.toContain(long.id)
    expect((await stripe.checkout.sessions.retrieve(short.id)).status).toBe('expired')
    expect((await stripe.checkout.sessions.retrieve(long.id)).status).toBe('open')
    const ev = events('checkout.session.expired').find((e) => (e.data.object as Stripe.Checkout.Session).id === short.id)
    expect(ev).toBeDefined()
    const page = await fetch(`${base}/pay/${short.id}`)
    expect(await page.text()).toContain('This checkout has expired')
    expect((await post(`/_fake/sessions/${long.id}/expire`)).json.session.status).toBe('expired')
  })

  it('changes the webhook target at run time and resets state', async () => {
    const other = await startReceiver()
    try {
      await post('/_fake/config', { webhookUrl: other.url })
      const s = await stripe.checkout.sessions.create(sessionParams())
      await post(`/_fake/sessions/${s.id}/complete`)
      expect(other.received).toHaveLength(1)
      expect(receiver.received).toHaveLength(0)
    } finally {
      await post('/_fake/config', { webhookUrl: receiver.url })
      await other.close()
    }
    const reset = await post('/_fake/reset')
    expect(reset.json.ok).toBe(true)
    expect((await stripe.checkout.sessions.list()).data).toHaveLength(0)
    expect((await get('/_fake/events')).json.data).toHaveLength(0)
    expect((await get('/_fake/config')).json.config.webhookUrl).toBe(receiver.url)
  })
})
