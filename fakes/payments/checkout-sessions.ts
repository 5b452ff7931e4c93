/**
 * `/v1/checkout/sessions`: create (payment mode with inline `price_data` only: the fake keeps no catalogue of
 * prices or products), list, retrieve, list line items, expire.
 */
import { z } from 'zod'
import { route, type Fake, type Route } from './context'
import { missing, paramError, stateError, unknownReference } from './errors'
import { createEndpoint, retrieveEndpoint } from './endpoints'
import { expand, list, newestFirst } from './listing'
import { currencyCode, formatMoney, minimumAmount } from './money'
import { expandField, expandOnly, form, integer, listFields, metadata, pagingFields, parse } from './params'
import { expireSession } from './session-lifecycle'
import { mergeMetadata, randomId, sessionById } from './store'
import type { CheckoutSession, LineItem } from './types'

const DAY = 24 * 60 * 60

const productData = form({
  name: z.string().max(250),
  description: z.string().optional(),
  metadata: metadata.optional(),
  images: z.array(z.string()).optional(),
})

const lineItem = form({
  price: z.string().optional(),
  quantity: integer(1, 999999),
  price_data: form({
    currency: z.string(),
    unit_amount: integer(0, 99999999).optional(),
    product: z.string().optional(),
    product_data: productData.optional(),
    tax_behavior: z.enum(['inclusive', 'exclusive', 'unspecified']).optional(),
  }).optional(),
})

const sessionCreateSchema = form({
  mode: z.string(),
  line_items: z.array(lineItem).max(100).optional(),
  success_url: z.string().max(5000).optional(),
  cancel_url: z.string().max(5000).optional(),
  metadata: metadata.optional(),
  client_reference_id: z.string().max(200).optional(),
  customer_email: z.string().optional(),
  expires_at: integer().optional(),
  locale: z.string().optional(),
  submit_type: z.enum(['auto', 'book', 'donate', 'pay']).optional(),
  ui_mode: z.enum(['hosted']).optional(),
  payment_method_types: z.array(z.enum(['card'])).optional(),
  payment_intent_data: form({
    metadata: metadata.optional(),
    description: z.string().optional(),
    receipt_email: z.string().optional(),
  }).optional(),
  expand: expandField.optional(),
})

const sessionListSchema = form({
  ...listFields,
  payment_intent: z.string().optional(),
  status: z.enum(['open', 'complete', 'expired']).optional(),
})

const lineItemsListSchema = form(pagingFields)

type LineItemParams = z.output<typeof lineItem>

/** A line item from inline price data; the fake makes up the price and product ids. */
function lineItemOf(item: LineItemParams, name: string): LineItem {
  if (item.price) throw unknownReference('price', item.price, `${name}[price]`)
  const pd = item.price_data
  if (!pd) throw paramError(`You must specify either \`price\` or \`price_data\` in ${name}.`, `${name}[price_data]`, 'parameter_missing')
  if (pd.product) throw unknownReference('product', pd.product, `${name}[price_data][product]`)
  if (!pd.product_data) {
    throw paramError(`You must specify either \`product\` or \`product_data\` in ${name}[price_data].`, `${name}[price_data][product_data]`, 'parameter_missing')
  }
  if (pd.unit_amount === undefined) throw missing(`${name}[price_data][unit_amount]`)
  const currency = currencyCode(pd.currency, `${name}[price_data][currency]`)
  const total = pd.unit_amount * item.quantity
  return {
    id: randomId('li_'),
    object: 'item',
    amount_discount: 0,
    amount_subtotal: total,
    amount_tax: 0,
    amount_total: total,
    currency,
    description: pd.product_data.name,
    quantity: item.quantity,
    price: {
      id: randomId('price_'), object: 'price', currency, product: randomId('prod_', 14), unit_amount: pd.unit_amount, type: 'one_time', livemode: false,
    },
  }
}

/** The line items of a new session, all in one currency and together at least the minimum charge. */
function lineItemsOf(items: LineItemParams[]): LineItem[] {
  // API reference (from memory): payment mode needs line items
  if (items.length === 0) throw paramError('You must specify `line_items` in `payment` mode.', 'line_items', 'parameter_missing')
  let currency: string | undefined
  const lineItems = items.map((item, i) => {
    const li = lineItemOf(item, `line_items[${i}]`)
    if (currency && li.currency !== currency) throw paramError('All line items must use the same currency.', `line_items[${i}][price_data][currency]`)
    currency = li.currency
    return li
  })
  const cur = (lineItems[0] as LineItem).currency
  const minimum = minimumAmount(cur)
  if (lineItems.reduce((sum, li) => sum + li.amount_total, 0) < minimum) {
    throw paramError(`The Checkout Session's total amount due must add up to at least ${formatMoney(minimum, cur)}.`, 'line_items', 'amount_too_small')
  }
  return lineItems
}

/** `expires_at`: 24 hours after creation unless given, and then 30 minutes to 24 hours (API reference, from memory). */
function expiryOf(expiresAt: number | undefined, created: number): number {
  if (expiresAt === undefined) return created + DAY
  if (expiresAt < created + 30 * 60) throw paramError('The `expires_at` timestamp must be at least 30 minutes from Checkout Session creation.', 'expires_at')
  if (expiresAt > created + DAY) throw paramError('The `expires_at` timestamp must be less than 24 hours from Checkout Session creation.', 'expires_at')
  return expiresAt
}

function createSession(fake: Fake, p: z.output<typeof sessionCreateSchema>): CheckoutSession {
  if (p.mode !== 'payment') {
    if (!['subscription', 'setup'].includes(p.mode)) throw paramError(`Invalid mode: must be one of payment, setup, or subscription`, 'mode')
    throw paramError(`The payments fake supports only mode=payment (got ${p.mode}).`, 'mode')
  }
  const created = fake.now()
  const lineItems = lineItemsOf(p.line_items ?? [])
  const expiresAt = expiryOf(p.expires_at, created)
  for (const [field, value] of [['success_url', p.success_url], ['cancel_url', p.cancel_url]] as const) {
    if (value !== undefined && !/^https?:\/\/[^\s]+$/i.test(value)) throw paramError(`Not a valid URL`, field, 'url_invalid')
  }
  const amountTotal = lineItems.reduce((sum, li) => sum + li.amount_total, 0)
  const id = randomId('cs_test_', 58)
  const session: CheckoutSession = {
    id,
    object: 'checkout.session',
    amount_subtotal: amountTotal,
    amount_total: amountTotal,
    cancel_url: p.cancel_url ?? null,
    client_reference_id: p.client_reference_id ?? null,
    created,
    currency: (lineItems[0] as LineItem).currency,
    customer_details: null,
    customer_email: p.customer_email ?? null,
    expires_at: expiresAt,
    livemode: false,
    locale: p.locale ?? null,
    metadata: mergeMetadata({}, p.metadata),
    mode: 'payment',
    payment_intent: null,
    payment_method_types: ['card'],
    payment_status: 'unpaid',
    status: 'open',
    submit_type: p.submit_type ?? null,
    success_url: p.success_url ?? null,
    ui_mode: 'hosted',
    url: `${fake.publicUrl}/pay/${id}`,
  }
  fake.state.sessions.set(id, session)
  fake.state.lineItems.set(id, lineItems)
  const pid = p.payment_intent_data
  fake.state.intentData.set(id, {
    metadata: mergeMetadata({}, pid?.metadata),
    ...(pid?.description ? { description: pid.description } : {}),
    ...(pid?.receipt_email ? { receiptEmail: pid.receipt_email } : {}),
  })
  return session
}

export function checkoutSessionRoutes(fake: Fake): Route[] {
  const { state } = fake
  return [
    createEndpoint(fake, /^\/v1\/checkout\/sessions$/, sessionCreateSchema, (p) => createSession(fake, p)),

    route('GET', /^\/v1\/checkout\/sessions$/, (raw) => {
      const p = parse(sessionListSchema, raw)
      let rows = newestFirst(state.sessions.values())
      if (p.payment_intent) rows = rows.filter((s) => s.payment_intent === p.payment_intent)
      if (p.status) rows = rows.filter((s) => s.status === p.status)
      return { body: list(state, rows, p, '/v1/checkout/sessions') }
    }),

    retrieveEndpoint(fake, /^\/v1\/checkout\/sessions\/([^/]+)$/, (id) => sessionById(state, id)),

    route('GET', /^\/v1\/checkout\/sessions\/([^/]+)\/line_items$/, (raw, [id]) => {
      const p = parse(lineItemsListSchema, raw)
      sessionById(state, id as string)
      return { body: list(state, state.lineItems.get(id as string) ?? [], p, `/v1/checkout/sessions/${id}/line_items`) }
    }),

    route('POST', /^\/v1\/checkout\/sessions\/([^/]+)\/expire$/, (raw, [id], ctx) => {
      const p = parse(expandOnly, raw)
      const s = sessionById(state, id as string)
      if (s.status !== 'open') {
        // API reference (from memory)
        throw stateError(
          `Only Checkout Sessions with a status in ["open"] can be expired. This Checkout Session has a status of "${s.status}".`,
          'checkout_session_not_open',
        )
      }
      void expireSession(fake, s, ctx)
      return { body: expand(state, s, p.expand) }
    }),
  ]
}
