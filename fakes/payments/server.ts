/**
 * Local stand-in for the hosted card-payment API, driven by the official `stripe` SDK.
 *
 * The SDK is pointed at it with `{ host, port, protocol: 'http' }`. It keeps everything in memory, speaks
 * the wire format the SDK uses (bracketed form bodies in, JSON out, status code chooses the error class),
 * serves a small hosted payment page at each Checkout Session's `url`, and delivers signed webhook events
 * with bounded retries. Test-only control routes live under `/_fake/`.
 *
 * Behaviours marked "observed SDK behaviour" were seen by running stripe@23.1.0 against a logging server;
 * those marked "API reference (from memory)" follow the public API reference as recalled, without the page
 * at hand.
 */
import http from 'node:http'
import type { AddressInfo } from 'node:net'
import { createHmac, randomBytes } from 'node:crypto'

// ---------------------------------------------------------------------------------------------------------
// Options and public shape
// ---------------------------------------------------------------------------------------------------------

export interface PaymentsFakeOptions {
  /** 0 (or absent) picks a free port. */
  port?: number
  /** Defaults to 127.0.0.1. */
  host?: string
  /** Where signed events are POSTed. Without one, events are recorded but not delivered. */
  webhookUrl?: string
  /** The whole `whsec_...` string is the HMAC key. */
  webhookSecret?: string
  /** Base of the hosted page URLs; defaults to `http://<host>:<port>`. */
  publicUrl?: string
  /** Event `api_version` until a request brings its own `Stripe-Version`. */
  apiVersion?: string
  /** Bounded delivery: total attempts per event (default 5). */
  webhookMaxAttempts?: number
  /** Back-off base; attempt n waits base * 2^(n-1) ms (default 1000). */
  webhookRetryBaseMs?: number
  /** Per-attempt timeout (default 10000 ms). */
  webhookTimeoutMs?: number
  /** Event types delivered to the endpoint (default all); others are still recorded. */
  enabledEvents?: string[]
}

export interface FakeConfig {
  webhookUrl: string | null
  webhookSecret: string
  webhookMaxAttempts: number
  webhookRetryBaseMs: number
  webhookTimeoutMs: number
  enabledEvents: string[]
}

export interface PaymentsFake {
  listen(): Promise<{ port: number; url: string }>
  close(): Promise<void>
  state: FakeState
}

// ---------------------------------------------------------------------------------------------------------
// API objects (only the fields Boreline relies on, plus the usual envelope fields)
// ---------------------------------------------------------------------------------------------------------

type Metadata = Record<string, string>

export interface CheckoutSession {
  id: string
  object: 'checkout.session'
  amount_subtotal: number
  amount_total: number
  cancel_url: string | null
  client_reference_id: string | null
  created: number
  currency: string
  customer_details: { email: string | null } | null
  customer_email: string | null
  expires_at: number
  livemode: false
  locale: string | null
  metadata: Metadata
  mode: 'payment'
  payment_intent: string | PaymentIntent | null
  payment_method_types: string[]
  payment_status: 'unpaid' | 'paid'
  status: 'open' | 'complete' | 'expired'
  submit_type: string | null
  success_url: string | null
  ui_mode: 'hosted'
  url: string | null
}

export interface LineItem {
  id: string
  object: 'item'
  amount_discount: number
  amount_subtotal: number
  amount_tax: number
  amount_total: number
  currency: string
  description: string
  quantity: number
  price: {
    id: string
    object: 'price'
    currency: string
    product: string
    unit_amount: number
    type: 'one_time'
    livemode: false
  }
}

export interface PaymentError {
  type: 'card_error'
  code: string
  decline_code?: string
  message: string
  charge?: string
  payment_method?: { id: string; object: 'payment_method'; type: 'card'; card: { brand: string; last4: string } }
}

export interface PaymentIntent {
  id: string
  object: 'payment_intent'
  amount: number
  amount_capturable: number
  amount_received: number
  canceled_at: number | null
  cancellation_reason: string | null
  capture_method: string
  client_secret: string
  confirmation_method: 'automatic'
  created: number
  currency: string
  description: string | null
  last_payment_error: PaymentError | null
  latest_charge: string | Charge | null
  livemode: false
  metadata: Metadata
  payment_method: string | null
  payment_method_types: string[]
  receipt_email: string | null
  status: 'requires_payment_method' | 'requires_confirmation' | 'requires_capture' | 'processing' | 'succeeded' | 'canceled'
}

export interface Charge {
  id: string
  object: 'charge'
  amount: number
  amount_captured: number
  amount_refunded: number
  captured: boolean
  created: number
  currency: string
  failure_code: string | null
  failure_message: string | null
  livemode: false
  metadata: Metadata
  paid: boolean
  payment_intent: string | PaymentIntent
  payment_method: string
  refunded: boolean
  status: 'succeeded' | 'failed'
}

export interface Refund {
  id: string
  object: 'refund'
  amount: number
  charge: string | Charge
  created: number
  currency: string
  metadata: Metadata
  payment_intent: string | PaymentIntent
  reason: string | null
  status: 'succeeded'
}

export interface StripeEvent {
  id: string
  object: 'event'
  api_version: string
  created: number
  data: { object: object; previous_attributes?: Record<string, unknown> }
  livemode: false
  pending_webhooks: number
  request: { id: string | null; idempotency_key: string | null }
  type: string
}

export interface DeliveryAttempt {
  eventId: string
  attempt: number
  at: string
  url: string
  status: number | null
  ok: boolean
  error?: string
  /** set on control-route replays made with a deliberately bad signature */
  tampered?: 'invalid' | 'stale'
}

export interface RequestRecord {
  at: string
  method: string
  path: string
  query: unknown
  idempotencyKey: string | null
  body: unknown
  status?: number
  requestId?: string
  replayed?: boolean
}

export interface FakeState {
  sessions: Map<string, CheckoutSession>
  lineItems: Map<string, LineItem[]>
  /** payment intent id -> owning checkout session id */
  sessionOfIntent: Map<string, string>
  paymentIntents: Map<string, PaymentIntent>
  charges: Map<string, Charge>
  refunds: Map<string, Refund>
  events: StripeEvent[]
  deliveries: DeliveryAttempt[]
  requests: RequestRecord[]
  idempotency: Map<string, StoredResponse>
  failNext: { status: number; count: number; path: string | null } | null
  clockOffset: number
  apiVersion: string
  config: FakeConfig
}

interface StoredResponse {
  fingerprint: string
  status: number
  body: unknown
}

// ---------------------------------------------------------------------------------------------------------
// Errors
// ---------------------------------------------------------------------------------------------------------

interface ErrorBody {
  type: 'invalid_request_error' | 'card_error' | 'idempotency_error' | 'api_error'
  message: string
  code?: string
  decline_code?: string
  param?: string
  charge?: string
  payment_intent?: PaymentIntent
  payment_method?: PaymentError['payment_method']
}

class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly body: ErrorBody,
    /** Parameter and auth failures happen before the endpoint runs, so they are not saved for the key. */
    readonly savedForIdempotency = true,
  ) {
    super(body.message)
  }
}

function paramError(message: string, param: string, code = 'parameter_invalid'): ApiError {
  return new ApiError(400, { type: 'invalid_request_error', code, message, param }, false)
}

function missing(param: string): ApiError {
  // API reference (from memory): "Missing required param: <name>." with code parameter_missing
  return paramError(`Missing required param: ${param}.`, param, 'parameter_missing')
}

function noSuch(kind: string, id: string, param: string): ApiError {
  // API reference (from memory): 404 resource_missing "No such <object>: '<id>'"
  return new ApiError(404, { type: 'invalid_request_error', code: 'resource_missing', message: `No such ${kind}: '${id}'`, param }, false)
}

function stateError(message: string, code = 'payment_intent_unexpected_state', param?: string): ApiError {
  return new ApiError(400, { type: 'invalid_request_error', code, message, ...(param ? { param } : {}) })
}

// ---------------------------------------------------------------------------------------------------------
// Form decoding: `line_items[0][price_data][unit_amount]=1250` -> nested objects and arrays
// ---------------------------------------------------------------------------------------------------------

/** Decoded form values are strings (every value is sent as a string: observed SDK behaviour). */
export type FormValue = string | FormObject | FormValue[]
export interface FormObject { [key: string]: FormValue }

const FORBIDDEN_SEGMENTS = new Set(['__proto__', 'prototype', 'constructor'])

function splitKey(key: string): string[] | null {
  const first = key.indexOf('[')
  if (first === -1) return [key]
  const segments = [key.slice(0, first)]
  const rest = key.slice(first)
  const re = /\[([^\]]*)\]/g
  let consumed = 0
  let m: RegExpExecArray | null
  while ((m = re.exec(rest)) !== null) {
    if (m.index !== consumed) return null
    segments.push(m[1] ?? '')
    consumed = re.lastIndex
  }
  return consumed === rest.length && segments[0] !== '' ? segments : null
}

function toArrays(value: FormValue): FormValue {
  if (typeof value === 'string') return value
  if (Array.isArray(value)) return value.map(toArrays)
  const keys = Object.keys(value)
  const out: FormObject = {}
  for (const k of keys) out[k] = toArrays(value[k] as FormValue)
  if (keys.length > 0 && keys.every((k) => /^\d+$/.test(k))) {
    return keys.sort((a, b) => Number(a) - Number(b)).map((k) => out[k] as FormValue)
  }
  return out
}

/**
 * Decodes an `application/x-www-form-urlencoded` string with bracketed keys into nested objects, turning
 * objects whose keys are all indexes into arrays (indexes are always present: observed SDK behaviour).
 * Values stay strings; the endpoint schemas coerce numbers and booleans where a field is numeric or boolean,
 * so metadata values and ids that look like numbers stay strings.
 */
export function decodeForm(input: string): FormObject {
  const root: FormObject = {}
  for (const [key, value] of new URLSearchParams(input)) {
    const segments = splitKey(key)
    if (!segments || segments.some((s) => FORBIDDEN_SEGMENTS.has(s))) {
      throw paramError(`Invalid parameter name: ${key}`, key)
    }
    let cur: FormObject = root
    for (let i = 0; i < segments.length; i++) {
      let seg = segments[i] as string
      if (seg === '') seg = String(Object.keys(cur).length) // `a[]=x` appends
      const last = i === segments.length - 1
      const existing = cur[seg]
      if (last) {
        if (existing !== undefined && typeof existing !== 'string') {
          throw paramError(`Invalid parameter: ${key} is given both as a value and as a hash`, key)
        }
        cur[seg] = value
      } else {
        if (existing === undefined) cur[seg] = {}
        else if (typeof existing === 'string') {
          throw paramError(`Invalid parameter: ${key} is given both as a value and as a hash`, key)
        }
        cur = cur[seg] as FormObject
      }
    }
  }
  return toArrays(root) as FormObject
}

// ---------------------------------------------------------------------------------------------------------
// Parameter schemas: reject unknown keys, coerce numbers and booleans, report the bracketed param name
// ---------------------------------------------------------------------------------------------------------

type Schema =
  | { readonly t: 'string'; readonly max?: number; readonly oneOf?: readonly string[] }
  | { readonly t: 'int'; readonly min?: number; readonly max?: number }
  | { readonly t: 'bool' }
  | { readonly t: 'metadata' }
  | { readonly t: 'range' }
  | { readonly t: 'array'; readonly of: Schema; readonly max?: number }
  | { readonly t: 'object'; readonly fields: { readonly [k: string]: Schema }; readonly required?: readonly string[] }

type Infer<S> = S extends { t: 'string' }
  ? string
  : S extends { t: 'int' }
    ? number
    : S extends { t: 'bool' }
      ? boolean
      : S extends { t: 'metadata' }
        ? Record<string, string | null>
        : S extends { t: 'range' }
          ? number | { gt?: number; gte?: number; lt?: number; lte?: number }
          : S extends { t: 'array'; of: infer O }
            ? Infer<O>[]
            : S extends { t: 'object'; fields: infer F }
              ? { -readonly [K in keyof F]?: Infer<F[K]> }
              : never

function show(value: FormValue): string {
  return typeof value === 'string' ? value : JSON.stringify(value)
}

function parseInteger(value: FormValue, param: string): number {
  if (typeof value !== 'string' || !/^-?\d+$/.test(value)) {
    // API reference (from memory): "Invalid integer: abc"
    throw paramError(`Invalid integer: ${show(value)}`, param)
  }
  const n = Number(value)
  if (!Number.isSafeInteger(n)) throw paramError(`Invalid integer: ${value}`, param)
  return n
}

/** `null` is sent as `key=` (observed SDK behaviour); an empty value therefore means "not given". */
function coerce(schema: Schema, value: FormValue, param: string): unknown {
  switch (schema.t) {
    case 'string': {
      if (typeof value !== 'string') throw paramError(`Invalid string: ${show(value)}`, param)
      if (schema.max !== undefined && value.length > schema.max) {
        throw paramError(`Invalid ${param}: must be at most ${schema.max} characters`, param)
      }
      if (schema.oneOf && !schema.oneOf.includes(value)) {
        throw paramError(`Invalid ${param}: must be one of ${schema.oneOf.join(', ')}`, param)
      }
      return value
    }
    case 'int': {
      const n = parseInteger(value, param)
      if (schema.min !== undefined && n < schema.min) {
        throw paramError(
          schema.min === 1 ? `Invalid positive integer` : `Invalid ${param}: must be at least ${schema.min}`,
          param,
        )
      }
      if (schema.max !== undefined && n > schema.max) throw paramError(`Invalid ${param}: must be at most ${schema.max}`, param)
      return n
    }
    case 'bool': {
      if (value === 'true') return true
      if (value === 'false') return false
      throw paramError(`Invalid boolean: ${show(value)}`, param)
    }
    case 'metadata': {
      // numeric metadata keys would have been turned into an array by decodeForm; turn them back
      const entries: [string, FormValue][] = Array.isArray(value)
        ? value.map((v, i) => [String(i), v])
        : typeof value === 'string'
          ? value === '' ? [] : (() => { throw paramError('Invalid object', param) })()
          : Object.entries(value)
      // API reference (from memory): up to 50 keys, key up to 40 characters, value up to 500 characters
      if (entries.length > 50) throw paramError('Invalid metadata: at most 50 keys', param)
      const out: Record<string, string | null> = {}
      for (const [k, v] of entries) {
        if (typeof v !== 'string') throw paramError(`Invalid metadata value for ${k}: must be a string`, `${param}[${k}]`)
        if (k.length > 40) throw paramError(`Invalid metadata key ${k}: at most 40 characters`, `${param}[${k}]`)
        if (v.length > 500) throw paramError(`Invalid metadata value for ${k}: at most 500 characters`, `${param}[${k}]`)
        out[k] = v === '' ? null : v
      }
      return out
    }
    case 'range': {
      if (typeof value === 'string') return parseInteger(value, param)
      if (Array.isArray(value)) throw paramError('Invalid range', param)
      const out: Record<string, number> = {}
      for (const [k, v] of Object.entries(value)) {
        if (!['gt', 'gte', 'lt', 'lte'].includes(k)) throw paramError(`Received unknown parameter: ${param}[${k}]`, `${param}[${k}]`, 'parameter_unknown')
        out[k] = parseInteger(v, `${param}[${k}]`)
      }
      return out
    }
    case 'array': {
      if (!Array.isArray(value)) {
        if (value === '') return [] // `key=` for an empty list
        throw paramError(`Invalid array`, param)
      }
      if (schema.max !== undefined && value.length > schema.max) throw paramError(`Invalid ${param}: at most ${schema.max} entries`, param)
      return value.map((v, i) => coerce(schema.of, v, `${param}[${i}]`))
    }
    case 'object': {
      if (typeof value === 'string' || Array.isArray(value)) {
        throw paramError(`Invalid object`, param)
      }
      return coerceObject(schema, value, param)
    }
  }
}

function coerceObject(schema: Extract<Schema, { t: 'object' }>, value: FormObject, prefix: string): Record<string, unknown> {
  const out: Record<string, unknown> = {}
  for (const [k, v] of Object.entries(value)) {
    const name = prefix ? `${prefix}[${k}]` : k
    const field = schema.fields[k]
    // API reference (from memory): "Received unknown parameter: <name>"
    if (!field) throw paramError(`Received unknown parameter: ${name}`, name, 'parameter_unknown')
    if (v === '' && field.t !== 'metadata' && field.t !== 'array') continue
    out[k] = coerce(field, v, name)
  }
  for (const r of schema.required ?? []) {
    if (out[r] === undefined) throw missing(prefix ? `${prefix}[${r}]` : r)
  }
  return out
}

function parse<S extends Extract<Schema, { t: 'object' }>>(schema: S, params: FormObject): Infer<S> {
  return coerceObject(schema, params, '') as Infer<S>
}

const expandSchema = { t: 'array', of: { t: 'string' } } as const
const listFields = {
  limit: { t: 'int', min: 1, max: 100 },
  starting_after: { t: 'string' },
  ending_before: { t: 'string' },
  created: { t: 'range' },
  expand: expandSchema,
} as const

const sessionCreateSchema = {
  t: 'object',
  required: ['mode'],
  fields: {
    mode: { t: 'string' },
    line_items: {
      t: 'array',
      max: 100,
      of: {
        t: 'object',
        required: ['quantity'],
        fields: {
          price: { t: 'string' },
          quantity: { t: 'int', min: 1, max: 999999 },
          price_data: {
            t: 'object',
            required: ['currency'],
            fields: {
              currency: { t: 'string' },
              unit_amount: { t: 'int', min: 0, max: 99999999 },
              product: { t: 'string' },
              product_data: {
                t: 'object',
                required: ['name'],
                fields: {
                  name: { t: 'string', max: 250 },
                  description: { t: 'string' },
                  metadata: { t: 'metadata' },
                  images: { t: 'array', of: { t: 'string' } },
                },
              },
              tax_behavior: { t: 'string', oneOf: ['inclusive', 'exclusive', 'unspecified'] },
            },
          },
        },
      },
    },
    success_url: { t: 'string', max: 5000 },
    cancel_url: { t: 'string', max: 5000 },
    metadata: { t: 'metadata' },
    client_reference_id: { t: 'string', max: 200 },
    customer_email: { t: 'string' },
    expires_at: { t: 'int' },
    locale: { t: 'string' },
    submit_type: { t: 'string', oneOf: ['auto', 'book', 'donate', 'pay'] },
    ui_mode: { t: 'string', oneOf: ['hosted'] },
    payment_method_types: { t: 'array', of: { t: 'string', oneOf: ['card'] } },
    payment_intent_data: {
      t: 'object',
      fields: { metadata: { t: 'metadata' }, description: { t: 'string' }, receipt_email: { t: 'string' } },
    },
    expand: expandSchema,
  },
} as const satisfies Schema

const expandOnly = { t: 'object', fields: { expand: expandSchema } } as const satisfies Schema

const sessionListSchema = {
  t: 'object',
  fields: { ...listFields, payment_intent: { t: 'string' }, status: { t: 'string', oneOf: ['open', 'complete', 'expired'] } },
} as const satisfies Schema

const lineItemsListSchema = {
  t: 'object',
  fields: { limit: listFields.limit, starting_after: listFields.starting_after, ending_before: listFields.ending_before, expand: expandSchema },
} as const satisfies Schema

const intentCreateSchema = {
  t: 'object',
  required: ['amount', 'currency'],
  fields: {
    amount: { t: 'int', min: 1, max: 99999999 },
    currency: { t: 'string' },
    metadata: { t: 'metadata' },
    description: { t: 'string', max: 1000 },
    payment_method: { t: 'string' },
    payment_method_types: { t: 'array', of: { t: 'string', oneOf: ['card'] } },
    automatic_payment_methods: {
      t: 'object',
      required: ['enabled'],
      fields: { enabled: { t: 'bool' }, allow_redirects: { t: 'string', oneOf: ['always', 'never'] } },
    },
    confirm: { t: 'bool' },
    capture_method: { t: 'string', oneOf: ['automatic', 'automatic_async', 'manual'] },
    receipt_email: { t: 'string' },
    return_url: { t: 'string' },
    expand: expandSchema,
  },
} as const satisfies Schema

const intentConfirmSchema = {
  t: 'object',
  fields: { payment_method: { t: 'string' }, return_url: { t: 'string' }, receipt_email: { t: 'string' }, expand: expandSchema },
} as const satisfies Schema

const intentCancelSchema = {
  t: 'object',
  fields: {
    cancellation_reason: { t: 'string', oneOf: ['duplicate', 'fraudulent', 'requested_by_customer', 'abandoned'] },
    expand: expandSchema,
  },
} as const satisfies Schema

const intentCaptureSchema = {
  t: 'object',
  fields: { amount_to_capture: { t: 'int', min: 1 }, metadata: { t: 'metadata' }, expand: expandSchema },
} as const satisfies Schema

const refundCreateSchema = {
  t: 'object',
  fields: {
    payment_intent: { t: 'string' },
    charge: { t: 'string' },
    amount: { t: 'int', min: 1 },
    reason: { t: 'string', oneOf: ['duplicate', 'fraudulent', 'requested_by_customer'] },
    metadata: { t: 'metadata' },
    expand: expandSchema,
  },
} as const satisfies Schema

const refundListSchema = {
  t: 'object',
  fields: { ...listFields, payment_intent: { t: 'string' }, charge: { t: 'string' } },
} as const satisfies Schema

const eventListSchema = {
  t: 'object',
  fields: { ...listFields, type: { t: 'string' }, types: { t: 'array', of: { t: 'string' }, max: 20 } },
} as const satisfies Schema

// ---------------------------------------------------------------------------------------------------------
// Small helpers
// ---------------------------------------------------------------------------------------------------------

const ALPHABET = 'abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ0123456789'

function randomId(prefix: string, length = 24): string {
  let out = prefix
  while (out.length < prefix.length + length) {
    for (const byte of randomBytes(length)) {
      if (byte < 248 && out.length < prefix.length + length) out += ALPHABET[byte % 62] // 248 = 4 * 62: no bias
    }
  }
  return out
}

function clone<T>(value: T): T {
  return structuredClone(value)
}

function mergeMetadata(base: Metadata, update: Record<string, string | null> | undefined): Metadata {
  const out = { ...base }
  for (const [k, v] of Object.entries(update ?? {})) {
    if (v === null) delete out[k]
    else out[k] = v
  }
  return out
}

function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] as string)
}

function formatMoney(amount: number, currency: string): string {
  try {
    const fmt = new Intl.NumberFormat('en-GB', { style: 'currency', currency: currency.toUpperCase() })
    const digits = fmt.resolvedOptions().maximumFractionDigits ?? 2
    return fmt.format(amount / 10 ** digits)
  } catch {
    return `${amount} ${currency.toUpperCase()}`
  }
}

/** Luhn check digit test, the checksum every card number carries (ISO/IEC 7812-1). */
function luhnValid(digits: string): boolean {
  let sum = 0
  for (let i = 0; i < digits.length; i++) {
    let d = Number(digits[digits.length - 1 - i])
    if (i % 2 === 1) {
      d *= 2
      if (d > 9) d -= 9
    }
    sum += d
  }
  return sum % 10 === 0
}

// API reference (from memory): minimum charge amounts per currency in minor units; 50 elsewhere.
const MINIMUM_AMOUNT: Record<string, number> = { usd: 50, eur: 50, gbp: 30, aud: 50, cad: 50, chf: 50, jpy: 50 }

// ---------------------------------------------------------------------------------------------------------
// Test cards and test payment methods
// ---------------------------------------------------------------------------------------------------------

interface CardOutcome {
  brand: string
  last4: string
  ok: boolean
  code?: string
  declineCode?: string
  message?: string
}

const DECLINED = 'Your card was declined.'

/** Test card numbers; the first three are the ones Boreline relies on (observed SDK/test-card facts). */
const TEST_CARDS: Record<string, Omit<CardOutcome, 'last4'>> = {
  '4242424242424242': { brand: 'visa', ok: true },
  '4000000000000002': { brand: 'visa', ok: false, code: 'card_declined', declineCode: 'generic_decline', message: DECLINED },
  '4000000000009995': {
    brand: 'visa', ok: false, code: 'card_declined', declineCode: 'insufficient_funds', message: 'Your card has insufficient funds.',
  },
  // API reference (from memory): further test cards
  '5555555555554444': { brand: 'mastercard', ok: true },
  '4000000000009987': { brand: 'visa', ok: false, code: 'card_declined', declineCode: 'lost_card', message: DECLINED },
  '4000000000000069': { brand: 'visa', ok: false, code: 'expired_card', declineCode: 'expired_card', message: 'Your card has expired.' },
}

// API reference (from memory): test PaymentMethod ids that stand for the cards above
const TEST_PAYMENT_METHODS: Record<string, string> = {
  pm_card_visa: '4242424242424242',
  pm_card_mastercard: '5555555555554444',
  pm_card_chargeDeclined: '4000000000000002',
  pm_card_chargeDeclinedInsufficientFunds: '4000000000009995',
  pm_card_chargeDeclinedLostCard: '4000000000009987',
  pm_card_chargeDeclinedExpiredCard: '4000000000000069',
}

/** Returns null for a number that is not a card number at all (wrong length or checksum). */
function classifyCard(input: string): CardOutcome | null {
  const digits = input.replace(/[\s-]/g, '')
  if (!/^\d{12,19}$/.test(digits) || !luhnValid(digits)) return null
  const known = TEST_CARDS[digits]
  const last4 = digits.slice(-4)
  if (known) return { ...known, last4 }
  // API reference (from memory): a real card number in test mode is declined with test_mode_live_card
  return {
    brand: 'unknown', last4, ok: false, code: 'card_declined', declineCode: 'test_mode_live_card',
    message: 'Your card was declined. This is a test environment: use a test card number.',
  }
}

// ---------------------------------------------------------------------------------------------------------
// The fake
// ---------------------------------------------------------------------------------------------------------

const DEFAULT_API_VERSION = '2026-10-28.endive' // the version pinned by stripe@23.1.0 (observed SDK behaviour)
const DAY = 24 * 60 * 60

interface RequestContext {
  requestId: string | null
  idempotencyKey: string | null
}

interface HandlerResult {
  status?: number
  body: unknown
}

type Handler = (params: FormObject, match: string[], ctx: RequestContext) => HandlerResult

export function createPaymentsFake(options: PaymentsFakeOptions = {}): PaymentsFake {
  const host = options.host ?? '127.0.0.1'
  let publicUrl = options.publicUrl ?? ''
  const timers = new Set<NodeJS.Timeout>()
  const inflight = new Set<AbortController>()
  let resetCount = 0
  let closed = false

  const freshState = (config: FakeConfig, apiVersion: string): FakeState => ({
    sessions: new Map(),
    lineItems: new Map(),
    sessionOfIntent: new Map(),
    paymentIntents: new Map(),
    charges: new Map(),
    refunds: new Map(),
    events: [],
    deliveries: [],
    requests: [],
    idempotency: new Map(),
    failNext: null,
    clockOffset: 0,
    apiVersion,
    config,
  })

  const state = freshState(
    {
      webhookUrl: options.webhookUrl ?? null,
      webhookSecret: options.webhookSecret ?? 'whsec_boreline_local_secret',
      webhookMaxAttempts: Math.max(1, options.webhookMaxAttempts ?? 5),
      webhookRetryBaseMs: Math.max(0, options.webhookRetryBaseMs ?? 1000),
      webhookTimeoutMs: Math.max(1, options.webhookTimeoutMs ?? 10_000),
      enabledEvents: options.enabledEvents ?? ['*'],
    },
    options.apiVersion ?? DEFAULT_API_VERSION,
  )

  /** Fake clock in unix seconds; `/_fake/clock/advance` moves it forward. */
  const now = (): number => Math.floor(Date.now() / 1000) + state.clockOffset

  // ---- events and webhook delivery -------------------------------------------------------------------

  function sign(payload: string, secret: string, timestamp: number): string {
    // observed SDK behaviour: v1 = hex HMAC-SHA256 keyed by the whole whsec_ secret over "<t>.<body>"
    const v1 = createHmac('sha256', secret).update(`${timestamp}.${payload}`, 'utf8').digest('hex')
    return `t=${timestamp},v1=${v1}`
  }

  async function attempt(event: StripeEvent, n: number, tamper?: 'invalid' | 'stale'): Promise<DeliveryAttempt> {
    const url = state.config.webhookUrl as string
    const payload = JSON.stringify(event, null, 2)
    // The signature uses the real clock, not the fake one, so receivers' tolerance checks still pass.
    const realNow = Math.floor(Date.now() / 1000)
    const header =
      tamper === 'invalid'
        ? sign(payload, `${state.config.webhookSecret}_wrong`, realNow)
        : tamper === 'stale'
          ? sign(payload, state.config.webhookSecret, realNow - 3600)
          : sign(payload, state.config.webhookSecret, realNow)
    const record: DeliveryAttempt = {
      eventId: event.id, attempt: n, at: new Date().toISOString(), url, status: null, ok: false, ...(tamper ? { tampered: tamper } : {}),
    }
    const controller = new AbortController()
    inflight.add(controller)
    const timeout = setTimeout(() => controller.abort(new Error('timeout')), state.config.webhookTimeoutMs)
    try {
      const res = await fetch(url, {
        method: 'POST',
        headers: { 'content-type': 'application/json; charset=utf-8', 'stripe-signature': header, 'user-agent': 'boreline-payments-fake/1' },
        body: payload,
        signal: controller.signal,
      })
      await res.arrayBuffer().catch(() => undefined)
      record.status = res.status
      record.ok = res.status >= 200 && res.status < 300
    } catch (e) {
      record.error = controller.signal.aborted ? 'timeout' : e instanceof Error ? e.message : String(e)
    } finally {
      clearTimeout(timeout)
      inflight.delete(controller)
    }
    state.deliveries.push(record)
    return record
  }

  /**
   * Delivers an event: the first attempt is awaited by the caller, later attempts back off exponentially in
   * the background up to `webhookMaxAttempts` (real delivery retries on non-2xx or timeout). A reset or
   * close cancels pending retries. Replays with a deliberately bad signature are sent once.
   */
  async function deliver(event: StripeEvent, tamper?: 'invalid' | 'stale'): Promise<DeliveryAttempt | null> {
    if (!state.config.webhookUrl) return null
    const enabled = state.config.enabledEvents
    if (!enabled.includes('*') && !enabled.includes(event.type)) return null
    const generation = resetCount
    const retry = (n: number): void => {
      if (n > state.config.webhookMaxAttempts || generation !== resetCount || closed) return
      const timer = setTimeout(() => {
        timers.delete(timer)
        if (generation !== resetCount || closed || !state.config.webhookUrl) return
        void attempt(event, n).then((r) => { if (!r.ok) retry(n + 1) })
      }, state.config.webhookRetryBaseMs * 2 ** (n - 2))
      timers.add(timer)
    }
    const first = await attempt(event, 1, tamper)
    if (!first.ok && !tamper) retry(2)
    return first
  }

  function emit(
    type: string,
    object: object,
    ctx: RequestContext | null,
    previous?: Record<string, unknown>,
  ): { event: StripeEvent; delivered: Promise<DeliveryAttempt | null> } {
    const event: StripeEvent = {
      id: randomId('evt_'),
      object: 'event',
      api_version: state.apiVersion,
      created: now(),
      data: { object: clone(object), ...(previous ? { previous_attributes: previous } : {}) },
      livemode: false,
      pending_webhooks: state.config.webhookUrl ? 1 : 0,
      request: { id: ctx?.requestId ?? null, idempotency_key: ctx?.idempotencyKey ?? null },
      type,
    }
    state.events.push(event)
    return { event, delivered: deliver(event) }
  }

  // ---- lookups and expansion -----------------------------------------------------------------------

  function getSession(id: string): CheckoutSession {
    const s = state.sessions.get(id)
    if (!s) throw noSuch('checkout.session', id, 'session')
    return s
  }
  function getIntent(id: string): PaymentIntent {
    const pi = state.paymentIntents.get(id)
    if (!pi) throw noSuch('payment_intent', id, 'intent')
    return pi
  }
  function getCharge(id: string): Charge {
    const ch = state.charges.get(id)
    if (!ch) throw noSuch('charge', id, 'charge')
    return ch
  }

  function lookup(id: string): object | undefined {
    if (id.startsWith('pi_')) return state.paymentIntents.get(id)
    if (id.startsWith('ch_')) return state.charges.get(id)
    if (id.startsWith('re_')) return state.refunds.get(id)
    if (id.startsWith('cs_')) return state.sessions.get(id)
    return undefined
  }

  const EXPANDABLE: Record<string, string[]> = {
    'checkout.session': ['payment_intent', 'line_items'],
    payment_intent: ['latest_charge'],
    charge: ['payment_intent'],
    refund: ['charge', 'payment_intent'],
  }

  /** `expand[]`: replaces id fields by their objects (dotted paths go deeper), on a copy. */
  function expand<T extends object>(obj: T, paths: string[] | undefined): T {
    const out = clone(obj) as Record<string, unknown>
    for (const path of paths ?? []) {
      if (path.length > 0) expandPath(out, path.split('.'), path)
    }
    return out as T
  }

  function expandPath(target: Record<string, unknown>, segments: string[], full: string): void {
    const [field, ...rest] = segments as [string, ...string[]]
    const kind = String(target.object ?? '')
    if (!(EXPANDABLE[kind] ?? []).includes(field)) {
      // API reference (from memory)
      throw paramError(`This property cannot be expanded (${field}).`, 'expand')
    }
    if (kind === 'checkout.session' && field === 'line_items') {
      const items = state.lineItems.get(String(target.id)) ?? []
      target.line_items = { object: 'list', data: clone(items), has_more: false, url: `/v1/checkout/sessions/${String(target.id)}/line_items` }
      if (rest.length > 0) throw paramError(`This property cannot be expanded (${full}).`, 'expand')
      return
    }
    let value = target[field]
    if (typeof value === 'string') {
      const found = lookup(value)
      if (found) {
        value = clone(found)
        target[field] = value
      }
    }
    if (rest.length > 0 && value && typeof value === 'object') expandPath(value as Record<string, unknown>, rest, full)
  }

  function list<T extends { id: string; created?: number }>(
    items: T[],
    params: { limit?: number; starting_after?: string; ending_before?: string; created?: number | { gt?: number; gte?: number; lt?: number; lte?: number }; expand?: string[] },
    url: string,
  ): { object: 'list'; data: T[]; has_more: boolean; url: string } {
    let rows = items
    const created = params.created
    if (created !== undefined) {
      rows = rows.filter((r) => {
        const c = r.created ?? 0
        if (typeof created === 'number') return c === created
        return (
          (created.gt === undefined || c > created.gt) && (created.gte === undefined || c >= created.gte) &&
          (created.lt === undefined || c < created.lt) && (created.lte === undefined || c <= created.lte)
        )
      })
    }
    const limit = params.limit ?? 10
    let start = 0
    let end = rows.length
    if (params.starting_after) {
      const i = rows.findIndex((r) => r.id === params.starting_after)
      if (i === -1) throw noSuch('object', params.starting_after, 'starting_after')
      start = i + 1
    } else if (params.ending_before) {
      const i = rows.findIndex((r) => r.id === params.ending_before)
      if (i === -1) throw noSuch('object', params.ending_before, 'ending_before')
      end = i
      start = Math.max(0, end - limit)
    }
    const page = rows.slice(start, Math.min(end, start + limit))
    const itemExpands = (params.expand ?? []).filter((p) => p.startsWith('data.')).map((p) => p.slice(5))
    const otherExpand = (params.expand ?? []).find((p) => !p.startsWith('data.'))
    if (otherExpand) throw paramError(`This property cannot be expanded (${otherExpand}).`, 'expand')
    return {
      object: 'list',
      data: page.map((r) => expand(r, itemExpands)),
      has_more: params.ending_before ? start > 0 : start + limit < end,
      url,
    }
  }

  const newestFirst = <T extends { created: number }>(rows: Iterable<T>): T[] =>
    [...rows].map((r, i) => ({ r, i })).sort((a, b) => b.r.created - a.r.created || b.i - a.i).map((x) => x.r)

  // ---- state changes -------------------------------------------------------------------------------

  function expireSession(session: CheckoutSession, ctx: RequestContext | null): Promise<DeliveryAttempt | null> {
    session.status = 'expired'
    session.url = null
    // API reference (from memory): an expired session's payment intent, if one was started, is canceled
    const pi = typeof session.payment_intent === 'string' ? state.paymentIntents.get(session.payment_intent) : undefined
    if (pi && pi.status !== 'succeeded' && pi.status !== 'canceled') {
      pi.status = 'canceled'
      pi.canceled_at = now()
      pi.cancellation_reason = 'abandoned'
    }
    return emit('checkout.session.expired', session, ctx).delivered
  }

  /** Expires every open session whose `expires_at` has passed on the fake clock. */
  function sweepExpired(): { ids: string[]; delivered: Promise<unknown>[] } {
    const ids: string[] = []
    const delivered: Promise<unknown>[] = []
    const t = now()
    for (const s of state.sessions.values()) {
      if (s.status === 'open' && s.expires_at <= t) {
        ids.push(s.id)
        delivered.push(expireSession(s, null))
      }
    }
    return { ids, delivered }
  }

  function newIntent(fields: {
    amount: number
    currency: string
    metadata?: Metadata
    description?: string | null
    captureMethod?: string
    receiptEmail?: string | null
    paymentMethodTypes?: string[]
  }): PaymentIntent {
    const id = randomId('pi_')
    const pi: PaymentIntent = {
      id,
      object: 'payment_intent',
      amount: fields.amount,
      amount_capturable: 0,
      amount_received: 0,
      canceled_at: null,
      cancellation_reason: null,
      capture_method: fields.captureMethod ?? 'automatic_async',
      client_secret: `${id}_secret_${randomId('', 24)}`,
      confirmation_method: 'automatic',
      created: now(),
      currency: fields.currency,
      description: fields.description ?? null,
      last_payment_error: null,
      latest_charge: null,
      livemode: false,
      metadata: fields.metadata ?? {},
      payment_method: null,
      payment_method_types: fields.paymentMethodTypes?.length ? fields.paymentMethodTypes : ['card'],
      receipt_email: fields.receiptEmail ?? null,
      status: 'requires_payment_method',
    }
    state.paymentIntents.set(id, pi)
    return pi
  }

  /** Charges a card against an intent: success moves it on, a decline records `last_payment_error`. */
  function chargeIntent(pi: PaymentIntent, card: CardOutcome, paymentMethodId: string): Charge {
    const charge: Charge = {
      id: randomId('ch_'),
      object: 'charge',
      amount: pi.amount,
      amount_captured: 0,
      amount_refunded: 0,
      captured: false,
      created: now(),
      currency: pi.currency,
      failure_code: null,
      failure_message: null,
      livemode: false,
      metadata: {},
      paid: false,
      payment_intent: pi.id,
      payment_method: paymentMethodId,
      refunded: false,
      status: 'failed',
    }
    state.charges.set(charge.id, charge)
    pi.payment_method = paymentMethodId
    pi.latest_charge = charge.id
    if (card.ok) {
      charge.status = 'succeeded'
      charge.paid = true
      pi.last_payment_error = null
      if (pi.capture_method === 'manual') {
        pi.status = 'requires_capture'
        pi.amount_capturable = pi.amount
      } else {
        charge.captured = true
        charge.amount_captured = pi.amount
        pi.status = 'succeeded'
        pi.amount_received = pi.amount
      }
    } else {
      charge.failure_code = card.code ?? 'card_declined'
      charge.failure_message = card.message ?? DECLINED
      pi.status = 'requires_payment_method'
      pi.last_payment_error = {
        type: 'card_error',
        code: card.code ?? 'card_declined',
        ...(card.declineCode ? { decline_code: card.declineCode } : {}),
        message: card.message ?? DECLINED,
        charge: charge.id,
        payment_method: { id: paymentMethodId, object: 'payment_method', type: 'card', card: { brand: card.brand, last4: card.last4 } },
      }
    }
    return charge
  }

  function cardErrorFor(pi: PaymentIntent): ApiError {
    const e = pi.last_payment_error as PaymentError
    // observed SDK behaviour: a 402 becomes StripeCardError carrying code, decline_code and payment_intent
    return new ApiError(402, {
      type: 'card_error',
      code: e.code,
      ...(e.decline_code ? { decline_code: e.decline_code } : {}),
      message: e.message,
      ...(e.charge ? { charge: e.charge } : {}),
      payment_intent: clone(pi),
      ...(e.payment_method ? { payment_method: e.payment_method } : {}),
    })
  }

  interface PayResult {
    ok: boolean
    /** set when the number is not a card number at all; no payment was attempted */
    invalid?: string
    session: CheckoutSession
    intent?: PaymentIntent
    delivered?: Promise<DeliveryAttempt | null>
  }

  /** One payment attempt on a Checkout Session, as the hosted page (or the complete control route) makes it. */
  function paySession(session: CheckoutSession, cardInput: string): PayResult {
    if (session.status !== 'open') throw stateError(`This Checkout Session is no longer open (status: ${session.status}).`, 'checkout_session_not_open')
    const card = classifyCard(cardInput)
    if (!card) return { ok: false, invalid: 'Your card number is invalid.', session }
    // The intent is created at the first attempt and reused by later ones (payment_intent stays null
    // before the customer submits a card: API reference, from memory, for current API versions).
    let pi = typeof session.payment_intent === 'string' ? state.paymentIntents.get(session.payment_intent) : undefined
    if (!pi) {
      pi = newIntent({
        amount: session.amount_total,
        currency: session.currency,
        metadata: clone(sessionIntentData.get(session.id)?.metadata ?? {}),
        description: sessionIntentData.get(session.id)?.description ?? null,
        receiptEmail: sessionIntentData.get(session.id)?.receiptEmail ?? null,
      })
      state.sessionOfIntent.set(pi.id, session.id)
      session.payment_intent = pi.id
    }
    const pm = randomId('pm_')
    chargeIntent(pi, card, pm)
    if (!card.ok) {
      const delivered = emit('payment_intent.payment_failed', pi, null).delivered
      return { ok: false, session, intent: pi, delivered }
    }
    session.status = 'complete'
    session.payment_status = 'paid'
    session.url = null
    session.customer_details = { email: session.customer_email }
    const delivered = emit('checkout.session.completed', session, null).delivered
    return { ok: true, session, intent: pi, delivered }
  }

  const sessionIntentData = new Map<string, { metadata?: Metadata; description?: string; receiptEmail?: string }>()

  function refund(
    params: Infer<typeof refundCreateSchema>,
    ctx: RequestContext,
  ): Refund {
    if (!params.payment_intent && !params.charge) {
      // API reference (from memory)
      throw paramError('One of the following params should be provided for this request: payment_intent or charge.', 'payment_intent', 'parameter_missing')
    }
    let charge: Charge
    let pi: PaymentIntent
    if (params.payment_intent) {
      pi = state.paymentIntents.get(params.payment_intent) ?? (() => { throw noSuch('payment_intent', params.payment_intent as string, 'payment_intent') })()
      const latest = typeof pi.latest_charge === 'string' ? state.charges.get(pi.latest_charge) : undefined
      if (!latest || latest.status !== 'succeeded' || !latest.captured) {
        throw stateError(`This PaymentIntent (${pi.id}) does not have a successful charge to refund.`, 'charge_not_refundable', 'payment_intent')
      }
      charge = latest
      if (params.charge && params.charge !== charge.id) throw paramError(`Charge ${params.charge} does not belong to PaymentIntent ${pi.id}.`, 'charge')
    } else {
      charge = state.charges.get(params.charge as string) ?? (() => { throw noSuch('charge', params.charge as string, 'charge') })()
      pi = getIntent(String(charge.payment_intent))
      if (charge.status !== 'succeeded' || !charge.captured) {
        throw stateError(`Charge ${charge.id} has not been captured and cannot be refunded.`, 'charge_not_refundable', 'charge')
      }
    }
    const remaining = charge.amount_captured - charge.amount_refunded
    if (remaining <= 0) {
      // API reference (from memory): code charge_already_refunded
      throw stateError(`Charge ${charge.id} has already been refunded.`, 'charge_already_refunded')
    }
    const amount = params.amount ?? remaining
    if (amount > remaining) {
      // API reference (from memory): the amount may not exceed what was captured minus what was refunded
      throw stateError(
        `Refund amount (${formatMoney(amount, charge.currency)}) is greater than unrefunded amount on charge (${formatMoney(remaining, charge.currency)})`,
        'amount_too_large',
        'amount',
      )
    }
    const r: Refund = {
      id: randomId('re_'),
      object: 'refund',
      amount,
      charge: charge.id,
      created: now(),
      currency: charge.currency,
      metadata: mergeMetadata({}, params.metadata),
      payment_intent: pi.id,
      reason: params.reason ?? null,
      status: 'succeeded',
    }
    state.refunds.set(r.id, r)
    const previous = { amount_refunded: charge.amount_refunded, refunded: charge.refunded }
    charge.amount_refunded += amount
    charge.refunded = charge.amount_refunded >= charge.amount_captured
    emit('refund.created', r, ctx)
    emit('charge.refunded', charge, ctx, previous)
    return r
  }

  // ---- /v1 routes ----------------------------------------------------------------------------------

  const routes: { method: string; pattern: RegExp; handler: Handler }[] = []
  const route = (method: string, pattern: RegExp, handler: Handler): void => { routes.push({ method, pattern, handler }) }

  route('POST', /^\/v1\/checkout\/sessions$/, (raw) => {
    const p = parse(sessionCreateSchema, raw)
    if (p.mode !== 'payment') {
      if (!['subscription', 'setup'].includes(p.mode as string)) throw paramError(`Invalid mode: must be one of payment, setup, or subscription`, 'mode')
      throw paramError(`The payments fake supports only mode=payment (got ${p.mode}).`, 'mode')
    }
    const items = p.line_items ?? []
    // API reference (from memory): payment mode needs line items
    if (items.length === 0) throw paramError('You must specify `line_items` in `payment` mode.', 'line_items', 'parameter_missing')
    const created = now()
    let currency: string | undefined
    const lineItems: LineItem[] = items.map((item, i) => {
      const name = `line_items[${i}]`
      if (item.price) throw new ApiError(400, { type: 'invalid_request_error', code: 'resource_missing', message: `No such price: '${item.price}'`, param: `${name}[price]` }, false)
      const pd = item.price_data
      if (!pd) throw paramError(`You must specify either \`price\` or \`price_data\` in ${name}.`, `${name}[price_data]`, 'parameter_missing')
      if (pd.product) throw new ApiError(400, { type: 'invalid_request_error', code: 'resource_missing', message: `No such product: '${pd.product}'`, param: `${name}[price_data][product]` }, false)
      if (!pd.product_data) throw paramError(`You must specify either \`product\` or \`product_data\` in ${name}[price_data].`, `${name}[price_data][product_data]`, 'parameter_missing')
      if (pd.unit_amount === undefined) throw missing(`${name}[price_data][unit_amount]`)
      const cur = (pd.currency as string).toLowerCase()
      if (!/^[a-z]{3}$/.test(cur)) throw paramError(`Invalid currency: ${pd.currency}`, `${name}[price_data][currency]`)
      if (currency && cur !== currency) throw paramError('All line items must use the same currency.', `${name}[price_data][currency]`)
      currency = cur
      const quantity = item.quantity as number
      const total = pd.unit_amount * quantity
      return {
        id: randomId('li_'),
        object: 'item',
        amount_discount: 0,
        amount_subtotal: total,
        amount_tax: 0,
        amount_total: total,
        currency: cur,
        description: pd.product_data.name as string,
        quantity,
        price: {
          id: randomId('price_'), object: 'price', currency: cur, product: randomId('prod_', 14), unit_amount: pd.unit_amount, type: 'one_time', livemode: false,
        },
      }
    })
    const amountTotal = lineItems.reduce((sum, li) => sum + li.amount_total, 0)
    const cur = (lineItems[0] as LineItem).currency
    const minimum = MINIMUM_AMOUNT[cur] ?? 50
    if (amountTotal < minimum) {
      throw paramError(
        `The Checkout Session's total amount due must add up to at least ${formatMoney(minimum, cur)}.`,
        'line_items',
        'amount_too_small',
      )
    }
    let expiresAt = created + DAY
    if (p.expires_at !== undefined) {
      // API reference (from memory): 30 minutes to 24 hours after creation
      if (p.expires_at < created + 30 * 60) throw paramError('The `expires_at` timestamp must be at least 30 minutes from Checkout Session creation.', 'expires_at')
      if (p.expires_at > created + DAY) throw paramError('The `expires_at` timestamp must be less than 24 hours from Checkout Session creation.', 'expires_at')
      expiresAt = p.expires_at
    }
    for (const [field, value] of [['success_url', p.success_url], ['cancel_url', p.cancel_url]] as const) {
      if (value !== undefined && !/^https?:\/\/[^\s]+$/i.test(value)) throw paramError(`Not a valid URL`, field, 'url_invalid')
    }
    const id = randomId('cs_test_', 58)
    const session: CheckoutSession = {
      id,
      object: 'checkout.session',
      amount_subtotal: amountTotal,
      amount_total: amountTotal,
      cancel_url: p.cancel_url ?? null,
      client_reference_id: p.client_reference_id ?? null,
      created,
      currency: cur,
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
      url: `${publicUrl}/pay/${id}`,
    }
    state.sessions.set(id, session)
    state.lineItems.set(id, lineItems)
    const pid = p.payment_intent_data
    sessionIntentData.set(id, {
      metadata: mergeMetadata({}, pid?.metadata),
      ...(pid?.description ? { description: pid.description } : {}),
      ...(pid?.receipt_email ? { receiptEmail: pid.receipt_email } : {}),
    })
    return { body: expand(session, p.expand) }
  })

  route('GET', /^\/v1\/checkout\/sessions$/, (raw) => {
    const p = parse(sessionListSchema, raw)
    let rows = newestFirst(state.sessions.values())
    if (p.payment_intent) rows = rows.filter((s) => s.payment_intent === p.payment_intent)
    if (p.status) rows = rows.filter((s) => s.status === p.status)
    return { body: list(rows, p, '/v1/checkout/sessions') }
  })

  route('GET', /^\/v1\/checkout\/sessions\/([^/]+)$/, (raw, [id]) => {
    const p = parse(expandOnly, raw)
    return { body: expand(getSession(id as string), p.expand) }
  })

  route('GET', /^\/v1\/checkout\/sessions\/([^/]+)\/line_items$/, (raw, [id]) => {
    const p = parse(lineItemsListSchema, raw)
    getSession(id as string)
    const items = state.lineItems.get(id as string) ?? []
    return { body: list(items, p, `/v1/checkout/sessions/${id}/line_items`) }
  })

  route('POST', /^\/v1\/checkout\/sessions\/([^/]+)\/expire$/, (raw, [id], ctx) => {
    const p = parse(expandOnly, raw)
    const s = getSession(id as string)
    if (s.status !== 'open') {
      // API reference (from memory)
      throw stateError(
        `Only Checkout Sessions with a status in ["open"] can be expired. This Checkout Session has a status of "${s.status}".`,
        'checkout_session_not_open',
      )
    }
    void expireSession(s, ctx)
    return { body: expand(s, p.expand) }
  })

  route('POST', /^\/v1\/payment_intents$/, (raw, _m, ctx) => {
    const p = parse(intentCreateSchema, raw)
    const currency = (p.currency as string).toLowerCase()
    if (!/^[a-z]{3}$/.test(currency)) throw paramError(`Invalid currency: ${p.currency}`, 'currency')
    const minimum = MINIMUM_AMOUNT[currency] ?? 50
    if ((p.amount as number) < minimum) {
      throw paramError(`Amount must be at least ${formatMoney(minimum, currency)} ${currency}`, 'amount', 'amount_too_small')
    }
    if (p.payment_method) resolvePaymentMethod(p.payment_method)
    const pi = newIntent({
      amount: p.amount as number,
      currency,
      metadata: mergeMetadata({}, p.metadata),
      description: p.description ?? null,
      ...(p.capture_method ? { captureMethod: p.capture_method } : {}),
      receiptEmail: p.receipt_email ?? null,
      ...(p.payment_method_types ? { paymentMethodTypes: p.payment_method_types } : {}),
    })
    if (p.payment_method) {
      pi.payment_method = p.payment_method
      pi.status = 'requires_confirmation'
    }
    if (p.confirm) confirmIntent(pi, p.payment_method, ctx)
    return { body: expand(pi, p.expand) }
  })

  function resolvePaymentMethod(id: string): CardOutcome {
    const number = TEST_PAYMENT_METHODS[id]
    if (!number) throw new ApiError(400, { type: 'invalid_request_error', code: 'resource_missing', message: `No such PaymentMethod: '${id}'`, param: 'payment_method' }, false)
    return classifyCard(number) as CardOutcome
  }

  function confirmIntent(pi: PaymentIntent, paymentMethod: string | undefined, ctx: RequestContext): void {
    if (state.sessionOfIntent.has(pi.id)) {
      // API reference (from memory): a Checkout Session's intent cannot be confirmed or canceled directly
      throw stateError(`You cannot confirm this PaymentIntent because it is managed by Checkout Session ${state.sessionOfIntent.get(pi.id)}.`)
    }
    if (pi.status !== 'requires_payment_method' && pi.status !== 'requires_confirmation') {
      throw stateError(`You cannot confirm this PaymentIntent because it has a status of ${pi.status}.`)
    }
    const pm = paymentMethod ?? pi.payment_method
    if (!pm) {
      throw stateError("You cannot confirm this PaymentIntent because it's missing a payment method. Specify `payment_method` when confirming.", 'payment_intent_unexpected_state', 'payment_method')
    }
    const card = resolvePaymentMethod(pm)
    chargeIntent(pi, card, pm)
    if (!card.ok) {
      emit('payment_intent.payment_failed', pi, ctx)
      throw cardErrorFor(pi)
    }
    emit((pi as PaymentIntent).status === 'succeeded' ? 'payment_intent.succeeded' : 'payment_intent.amount_capturable_updated', pi, ctx)
  }

  route('GET', /^\/v1\/payment_intents\/([^/]+)$/, (raw, [id]) => {
    const p = parse(expandOnly, raw)
    return { body: expand(getIntent(id as string), p.expand) }
  })

  route('POST', /^\/v1\/payment_intents\/([^/]+)\/confirm$/, (raw, [id], ctx) => {
    const p = parse(intentConfirmSchema, raw)
    const pi = getIntent(id as string)
    confirmIntent(pi, p.payment_method, ctx)
    return { body: expand(pi, p.expand) }
  })

  route('POST', /^\/v1\/payment_intents\/([^/]+)\/cancel$/, (raw, [id], ctx) => {
    const p = parse(intentCancelSchema, raw)
    const pi = getIntent(id as string)
    if (state.sessionOfIntent.has(pi.id)) {
      throw stateError(`You cannot cancel this PaymentIntent because it is managed by Checkout Session ${state.sessionOfIntent.get(pi.id)}; expire the session instead.`)
    }
    const cancellable = ['requires_payment_method', 'requires_capture', 'requires_confirmation', 'requires_action', 'processing']
    if (!cancellable.includes(pi.status)) {
      // API reference (from memory)
      throw stateError(
        `You cannot cancel this PaymentIntent because it has a status of ${pi.status}. Only a PaymentIntent with one of the following statuses may be canceled: ${cancellable.join(', ')}.`,
      )
    }
    pi.status = 'canceled'
    pi.canceled_at = now()
    pi.cancellation_reason = p.cancellation_reason ?? null
    pi.amount_capturable = 0
    emit('payment_intent.canceled', pi, ctx)
    return { body: expand(pi, p.expand) }
  })

  route('POST', /^\/v1\/payment_intents\/([^/]+)\/capture$/, (raw, [id], ctx) => {
    const p = parse(intentCaptureSchema, raw)
    const pi = getIntent(id as string)
    if (pi.status !== 'requires_capture') {
      // API reference (from memory)
      throw stateError(
        `This PaymentIntent could not be captured because it has a status of ${pi.status}. Only a PaymentIntent with one of the following statuses may be captured: requires_capture.`,
      )
    }
    const amount = p.amount_to_capture ?? pi.amount_capturable
    if (amount > pi.amount_capturable) {
      throw paramError(`The amount to capture (${amount}) is greater than the amount capturable (${pi.amount_capturable}).`, 'amount_to_capture', 'amount_too_large')
    }
    const charge = getCharge(String(pi.latest_charge))
    charge.captured = true
    charge.amount_captured = amount
    pi.amount_received = amount
    pi.amount_capturable = 0
    pi.status = 'succeeded'
    pi.metadata = mergeMetadata(pi.metadata, p.metadata)
    emit('payment_intent.succeeded', pi, ctx)
    return { body: expand(pi, p.expand) }
  })

  route('GET', /^\/v1\/charges\/([^/]+)$/, (raw, [id]) => {
    const p = parse(expandOnly, raw)
    return { body: expand(getCharge(id as string), p.expand) }
  })

  route('POST', /^\/v1\/refunds$/, (raw, _m, ctx) => {
    const p = parse(refundCreateSchema, raw)
    return { body: expand(refund(p, ctx), p.expand) }
  })

  route('GET', /^\/v1\/refunds$/, (raw) => {
    const p = parse(refundListSchema, raw)
    let rows = newestFirst(state.refunds.values())
    if (p.payment_intent) rows = rows.filter((r) => r.payment_intent === p.payment_intent)
    if (p.charge) rows = rows.filter((r) => r.charge === p.charge)
    return { body: list(rows, p, '/v1/refunds') }
  })

  route('GET', /^\/v1\/refunds\/([^/]+)$/, (raw, [id]) => {
    const p = parse(expandOnly, raw)
    const r = state.refunds.get(id as string)
    if (!r) throw noSuch('refund', id as string, 'refund')
    return { body: expand(r, p.expand) }
  })

  route('GET', /^\/v1\/events$/, (raw) => {
    const p = parse(eventListSchema, raw)
    let rows = newestFirst(state.events)
    if (p.type) {
      // API reference (from memory): `type` accepts a `*` wildcard such as `checkout.session.*`
      const re = new RegExp(`^${p.type.split('*').map((s) => s.replace(/[.+?^${}()|[\]\\]/g, '\\$&')).join('.*')}$`)
      rows = rows.filter((e) => re.test(e.type))
    }
    if (p.types?.length) rows = rows.filter((e) => p.types?.includes(e.type))
    return { body: list(rows, p, '/v1/events') }
  })

  route('GET', /^\/v1\/events\/([^/]+)$/, (raw, [id]) => {
    parse(expandOnly, raw)
    const e = state.events.find((x) => x.id === id)
    if (!e) throw noSuch('event', id as string, 'id')
    return { body: clone(e) }
  })

  // ---- HTTP plumbing -------------------------------------------------------------------------------

  function readBody(req: http.IncomingMessage, limit = 1_000_000): Promise<string> {
    return new Promise((resolve, reject) => {
      const chunks: Buffer[] = []
      let size = 0
      req.on('data', (c: Buffer) => {
        size += c.length
        if (size > limit) {
          reject(new Error('body too large'))
          req.destroy()
        } else chunks.push(c)
      })
      req.on('end', () => resolve(Buffer.concat(chunks).toString('utf8')))
      req.on('error', reject)
    })
  }

  function sendJson(res: http.ServerResponse, status: number, body: unknown, headers: Record<string, string> = {}): void {
    const text = JSON.stringify(body, null, 2)
    // observed SDK behaviour: never send Stripe-Notice (the SDK turns it into a process warning)
    res.writeHead(status, { 'content-type': 'application/json', 'content-length': Buffer.byteLength(text), 'cache-control': 'no-store', ...headers })
    res.end(text)
  }

  function sendHtml(res: http.ServerResponse, status: number, html: string): void {
    res.writeHead(status, {
      'content-type': 'text/html; charset=utf-8',
      'content-length': Buffer.byteLength(html),
      'cache-control': 'no-store',
      'content-security-policy': "default-src 'none'; style-src 'unsafe-inline'; form-action 'self' http: https:; base-uri 'none'",
      'x-content-type-options': 'nosniff',
    })
    res.end(html)
  }

  function redirect(res: http.ServerResponse, location: string): void {
    res.writeHead(303, { location, 'content-length': 0, 'cache-control': 'no-store' })
    res.end()
  }

  function logRequest(entry: RequestRecord): RequestRecord {
    state.requests.push(entry)
    if (state.requests.length > 2000) state.requests.splice(0, state.requests.length - 2000)
    return entry
  }

  function authError(header: string | undefined): ApiError | null {
    if (!header) {
      // API reference (from memory)
      return new ApiError(401, {
        type: 'invalid_request_error',
        message: "You did not provide an API key. You need to provide your API key in the Authorization header, using Bearer auth (e.g. 'Authorization: Bearer YOUR_SECRET_KEY').",
      }, false)
    }
    const m = /^Bearer (.+)$/.exec(header)
    const key = m?.[1] ?? ''
    if (!key.startsWith('sk_test_')) {
      const masked = key.length > 12 ? `${key.slice(0, 8)}${'*'.repeat(Math.max(0, key.length - 12))}${key.slice(-4)}` : '****'
      return new ApiError(401, {
        type: 'invalid_request_error',
        code: 'api_key_invalid',
        message: key.startsWith('sk_live_')
          ? 'The payments fake accepts only test keys (sk_test_...).'
          : `Invalid API Key provided: ${masked}`,
      }, false)
    }
    return null
  }

  async function handleApi(req: http.IncomingMessage, res: http.ServerResponse, url: URL): Promise<void> {
    const method = req.method ?? 'GET'
    const requestId = randomId('req_', 14)
    const keyHeader = req.headers['idempotency-key']
    const idempotencyKey = method === 'POST' && typeof keyHeader === 'string' && keyHeader !== '' ? keyHeader : null
    const version = req.headers['stripe-version']
    if (typeof version === 'string' && version) state.apiVersion = version
    const baseHeaders: Record<string, string> = { 'request-id': requestId, 'stripe-version': state.apiVersion }
    if (idempotencyKey) baseHeaders['idempotency-key'] = idempotencyKey

    const rawBody = method === 'GET' || method === 'DELETE' ? url.search.slice(1) : await readBody(req)
    const entry = logRequest({
      at: new Date().toISOString(), method, path: url.pathname, query: decodeSafe(url.search.slice(1)), idempotencyKey, body: decodeSafe(rawBody), requestId,
    })
    const respond = (status: number, body: unknown, extra: Record<string, string> = {}): void => {
      entry.status = status
      sendJson(res, status, body, { ...baseHeaders, ...extra })
    }

    const auth = authError(req.headers.authorization)
    if (auth) return respond(auth.status, { error: auth.body })

    let params: FormObject
    try {
      params = decodeForm(rawBody)
    } catch (e) {
      if (e instanceof ApiError) return respond(e.status, { error: e.body })
      throw e
    }
    sweepExpired()

    const fingerprint = JSON.stringify([method, url.pathname, params])
    if (idempotencyKey) {
      if (idempotencyKey.length > 255) {
        return respond(400, { error: { type: 'invalid_request_error', message: 'Idempotency-Key must be at most 255 characters long.', param: 'Idempotency-Key' } })
      }
      const stored = state.idempotency.get(idempotencyKey)
      if (stored) {
        if (stored.fingerprint !== fingerprint) {
          // observed SDK behaviour: this envelope type becomes StripeIdempotencyError
          return respond(400, {
            error: {
              type: 'idempotency_error',
              message: `Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${idempotencyKey}' if you meant to execute a different request.`,
            },
          })
        }
        // the first response for a key is replayed, whatever its status
        entry.replayed = true
        return respond(stored.status, stored.body, { 'idempotent-replayed': 'true' })
      }
    }
    const save = (status: number, body: unknown): void => {
      if (idempotencyKey) state.idempotency.set(idempotencyKey, { fingerprint, status, body })
    }

    const fail = state.failNext
    if (fail && fail.count > 0 && (fail.path === null || fail.path === url.pathname)) {
      fail.count -= 1
      if (fail.count === 0) state.failNext = null
      const body = { error: { type: 'api_error', message: 'Injected failure from the payments fake control route.' } }
      save(fail.status, body)
      return respond(fail.status, body)
    }

    const found = routes
      .map((r) => ({ r, m: r.method === method ? r.pattern.exec(url.pathname) : null }))
      .find((x) => x.m !== null)
    if (!found || !found.m) {
      return respond(404, {
        error: { type: 'invalid_request_error', message: `Unrecognized request URL (${method}: ${url.pathname}). The payments fake does not implement this endpoint.` },
      })
    }
    const match = found.m.slice(1).map((s) => decodeURIComponent(s))
    try {
      const result = found.r.handler(params, match, { requestId, idempotencyKey })
      const status = result.status ?? 200
      save(status, result.body)
      return respond(status, result.body)
    } catch (e) {
      if (e instanceof ApiError) {
        const body = { error: e.body }
        if (e.savedForIdempotency) save(e.status, body)
        return respond(e.status, body)
      }
      const body = { error: { type: 'api_error', message: `The payments fake failed: ${e instanceof Error ? e.message : String(e)}` } }
      save(500, body)
      return respond(500, body)
    }
  }

  function decodeSafe(raw: string): unknown {
    try {
      return decodeForm(raw)
    } catch {
      return raw
    }
  }

  // ---- hosted payment page -------------------------------------------------------------------------

  function page(title: string, main: string): string {
    return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)}</title>
<style>
  :root { color-scheme: light; font-family: system-ui, sans-serif; line-height: 1.5; }
  body { margin: 0; background: #eef1ec; color: #1d2420; }
  main { max-width: 30rem; margin: 2.5rem auto; padding: 1.5rem 1.75rem; background: #fff; border: 2px solid #2f5d50; border-radius: 6px; }
  .banner { margin: 0 0 1rem; padding: .35rem .6rem; background: #fff4cc; border-left: 4px solid #8a6d00; font-size: .9rem; }
  h1 { font-size: 1.35rem; margin: 0 0 .75rem; }
  table { width: 100%; border-collapse: collapse; margin: 0 0 1rem; font-size: .95rem; }
  th, td { text-align: left; padding: .3rem 0; border-bottom: 1px solid #d5dbd3; }
  td.num, th.num { text-align: right; }
  label { display: block; font-weight: 600; margin-bottom: .25rem; }
  input { width: 100%; box-sizing: border-box; font: inherit; font-size: 1.1rem; padding: .5rem; border: 2px solid #59655d; border-radius: 4px; }
  input:focus, button:focus, a:focus { outline: 3px solid #c77d00; outline-offset: 2px; }
  input[aria-invalid="true"] { border-color: #a4161a; }
  .hint { font-size: .85rem; color: #4a544d; margin: .25rem 0 0; }
  .error { color: #a4161a; font-weight: 600; margin: .5rem 0 0; }
  .actions { display: flex; gap: 1rem; align-items: center; margin-top: 1.25rem; }
  button { font: inherit; font-weight: 600; padding: .55rem 1.4rem; background: #2f5d50; color: #fff; border: 0; border-radius: 4px; cursor: pointer; }
  details { margin-top: 1.25rem; font-size: .9rem; }
</style>
</head>
<body>
<main>
<p class="banner">Test environment: no real money moves.</p>
${main}
</main>
</body>
</html>`
  }

  function payPage(session: CheckoutSession, message: string | null, cardValue = ''): string {
    const total = formatMoney(session.amount_total, session.currency)
    const rows = (state.lineItems.get(session.id) ?? [])
      .map((li) => `<tr><td>${escapeHtml(li.description)}</td><td class="num">${li.quantity}</td><td class="num">${escapeHtml(formatMoney(li.amount_total, li.currency))}</td></tr>`)
      .join('\n')
    const cancel = session.cancel_url ? `<a href="/pay/${encodeURIComponent(session.id)}/cancel">Cancel and go back</a>` : ''
    return page(
      `Pay ${total}`,
      `<h1>Pay ${escapeHtml(total)}</h1>
<table>
<caption class="hint">What you are paying for</caption>
<thead><tr><th scope="col">Item</th><th scope="col" class="num">Qty</th><th scope="col" class="num">Amount</th></tr></thead>
<tbody>
${rows}
</tbody>
<tfoot><tr><th scope="row" colspan="2">Total</th><td class="num">${escapeHtml(total)}</td></tr></tfoot>
</table>
<form method="post" action="/pay/${encodeURIComponent(session.id)}" novalidate>
<label for="card">Test card number</label>
<input id="card" name="card" type="text" inputmode="numeric" autocomplete="off" required value="${escapeHtml(cardValue)}"
  aria-describedby="card-hint${message ? ' card-error' : ''}"${message ? ' aria-invalid="true"' : ''}>
<p id="card-hint" class="hint">Spaces are allowed.</p>
${message ? `<p id="card-error" class="error" role="alert">${escapeHtml(message)}</p>` : ''}
<div class="actions">
<button type="submit">Pay ${escapeHtml(total)}</button>
${cancel}
</div>
</form>
<details>
<summary>Test card numbers</summary>
<ul>
<li>4242 4242 4242 4242: payment succeeds</li>
<li>4000 0000 0000 0002: card declined</li>
<li>4000 0000 0000 9995: insufficient funds</li>
</ul>
</details>`,
    )
  }

  function closedPage(session: CheckoutSession): string {
    if (session.status === 'complete') {
      const back = session.success_url ? `<p><a href="${escapeHtml(successUrl(session))}">Return to the shop</a></p>` : ''
      return page('Payment received', `<h1>Payment received</h1><p>${escapeHtml(formatMoney(session.amount_total, session.currency))} has been paid.</p>${back}`)
    }
    const back = session.cancel_url ? `<p><a href="${escapeHtml(session.cancel_url)}">Go back</a></p>` : ''
    return page('Checkout expired', `<h1>This checkout has expired</h1><p>Start the payment again from the shop.</p>${back}`)
  }

  function successUrl(session: CheckoutSession): string {
    // observed SDK behaviour: `{CHECKOUT_SESSION_ID}` in success_url is replaced by the session id on redirect
    return (session.success_url ?? '').split('{CHECKOUT_SESSION_ID}').join(session.id)
  }

  /** Waits for the first delivery attempt (bounded), so a redirected browser usually finds the order settled. */
  async function settle(delivered: Promise<unknown> | undefined): Promise<void> {
    if (!delivered) return
    let timer: NodeJS.Timeout | undefined
    await Promise.race([delivered, new Promise((r) => { timer = setTimeout(r, state.config.webhookTimeoutMs + 500) })])
    if (timer) clearTimeout(timer)
  }

  async function handlePay(req: http.IncomingMessage, res: http.ServerResponse, url: URL): Promise<void> {
    const m = /^\/pay\/([^/]+)(\/cancel)?$/.exec(url.pathname)
    const method = req.method ?? 'GET'
    const raw = method === 'POST' ? await readBody(req, 10_000) : ''
    const form = new URLSearchParams(raw)
    const cardInput = form.get('card') ?? ''
    const digits = cardInput.replace(/\D/g, '')
    const entry = logRequest({
      at: new Date().toISOString(), method, path: url.pathname, query: decodeSafe(url.search.slice(1)), idempotencyKey: null,
      body: method === 'POST' ? { card: digits.length >= 4 ? `**** ${digits.slice(-4)}` : cardInput } : {},
    })
    sweepExpired()
    const session = m ? state.sessions.get(decodeURIComponent(m[1] as string)) : undefined
    if (!m || !session) {
      entry.status = 404
      return sendHtml(res, 404, page('Not found', '<h1>No such checkout</h1><p>This payment link is not known.</p>'))
    }
    if (m[2]) {
      if (method !== 'GET') {
        entry.status = 405
        return sendHtml(res, 405, page('Not allowed', '<h1>Not allowed</h1>'))
      }
      // Leaving the page does not end the session; it stays open until it expires (API reference, from memory).
      entry.status = session.cancel_url ? 303 : 200
      if (session.cancel_url) return redirect(res, session.cancel_url)
      return sendHtml(res, 200, page('Payment cancelled', '<h1>Payment cancelled</h1><p>Nothing was charged.</p>'))
    }
    if (method === 'GET') {
      entry.status = 200
      return sendHtml(res, 200, session.status === 'open' ? payPage(session, null) : closedPage(session))
    }
    if (method !== 'POST') {
      entry.status = 405
      return sendHtml(res, 405, page('Not allowed', '<h1>Not allowed</h1>'))
    }
    if (session.status !== 'open') {
      entry.status = 409
      return sendHtml(res, 409, closedPage(session))
    }
    if (cardInput.trim() === '') {
      entry.status = 400
      return sendHtml(res, 400, payPage(session, 'Enter a card number.'))
    }
    const result = paySession(session, cardInput)
    if (result.invalid) {
      entry.status = 400
      return sendHtml(res, 400, payPage(session, result.invalid, cardInput))
    }
    if (!result.ok) {
      entry.status = 402
      void result.delivered
      return sendHtml(res, 402, payPage(session, result.intent?.last_payment_error?.message ?? DECLINED, cardInput))
    }
    await settle(result.delivered)
    if (session.success_url) {
      entry.status = 303
      return redirect(res, successUrl(session))
    }
    entry.status = 200
    return sendHtml(res, 200, closedPage(session))
  }

  // ---- control routes ------------------------------------------------------------------------------

  async function readControlBody(req: http.IncomingMessage): Promise<Record<string, unknown>> {
    const raw = await readBody(req)
    if (raw.trim() === '') return {}
    if (String(req.headers['content-type'] ?? '').includes('application/json')) {
      const parsed: unknown = JSON.parse(raw)
      return parsed && typeof parsed === 'object' && !Array.isArray(parsed) ? (parsed as Record<string, unknown>) : {}
    }
    return decodeForm(raw)
  }

  function controlError(res: http.ServerResponse, status: number, message: string): void {
    sendJson(res, status, { error: { message } })
  }

  async function handleControl(req: http.IncomingMessage, res: http.ServerResponse, url: URL): Promise<void> {
    const method = req.method ?? 'GET'
    const path = url.pathname
    let body: Record<string, unknown>
    try {
      body = method === 'POST' ? await readControlBody(req) : {}
    } catch {
      return controlError(res, 400, 'The body must be JSON or a form.')
    }
    let m: RegExpExecArray | null

    if (method === 'GET' && path === '/_fake/health') return sendJson(res, 200, { ok: true })

    if (method === 'POST' && (m = /^\/_fake\/sessions\/([^/]+)\/complete$/.exec(path))) {
      sweepExpired()
      const session = state.sessions.get(decodeURIComponent(m[1] as string))
      if (!session) return controlError(res, 404, `No such checkout session: ${m[1]}`)
      if (session.status !== 'open') return controlError(res, 409, `The checkout session is ${session.status}, not open.`)
      const card = typeof body.card === 'string' && body.card ? body.card : '4242 4242 4242 4242'
      const result = paySession(session, card)
      if (result.invalid) return controlError(res, 400, result.invalid)
      const delivery = result.delivered ? await result.delivered : null
      return sendJson(res, result.ok ? 200 : 402, {
        session: clone(session),
        payment_intent: result.intent ? clone(result.intent) : null,
        delivery,
        ...(result.ok ? { redirect: session.success_url ? successUrl(session) : null } : { error: result.intent?.last_payment_error ?? null }),
      })
    }

    if (method === 'POST' && (m = /^\/_fake\/sessions\/([^/]+)\/expire$/.exec(path))) {
      sweepExpired()
      const session = state.sessions.get(decodeURIComponent(m[1] as string))
      if (!session) return controlError(res, 404, `No such checkout session: ${m[1]}`)
      if (session.status !== 'open') return controlError(res, 409, `The checkout session is ${session.status}, not open.`)
      const delivery = await expireSession(session, null)
      return sendJson(res, 200, { session: clone(session), delivery })
    }

    if (method === 'GET' && path === '/_fake/clock') return sendJson(res, 200, { now: now(), offset: state.clockOffset })

    if (method === 'POST' && path === '/_fake/clock/advance') {
      const seconds = Number(body.seconds)
      if (!Number.isInteger(seconds) || seconds < 0) return controlError(res, 400, '`seconds` must be a whole number of seconds, 0 or more.')
      state.clockOffset += seconds
      const swept = sweepExpired()
      await Promise.all(swept.delivered)
      return sendJson(res, 200, { now: now(), offset: state.clockOffset, expired: swept.ids })
    }

    if (method === 'POST' && (m = /^\/_fake\/events\/([^/]+)\/resend$/.exec(path))) {
      const event = state.events.find((e) => e.id === decodeURIComponent(m?.[1] as string))
      if (!event) return controlError(res, 404, `No such event: ${m[1]}`)
      if (!state.config.webhookUrl) return controlError(res, 409, 'No webhook URL is configured.')
      const times = url.searchParams.has('duplicate') ? Number(url.searchParams.get('duplicate')) : 1
      if (!Number.isInteger(times) || times < 1 || times > 20) return controlError(res, 400, '`duplicate` must be a whole number from 1 to 20.')
      const sig = url.searchParams.get('signature')
      if (sig !== null && sig !== 'invalid' && sig !== 'stale') return controlError(res, 400, '`signature` must be `invalid` or `stale`.')
      const deliveries: (DeliveryAttempt | null)[] = []
      for (let i = 0; i < times; i++) deliveries.push(await deliver(event, sig ?? undefined))
      return sendJson(res, 200, { event: clone(event), deliveries })
    }

    if (method === 'GET' && path === '/_fake/requests') {
      const wantPath = url.searchParams.get('path')
      const wantMethod = url.searchParams.get('method')
      const data = state.requests.filter(
        (r) => (!wantPath || r.path === wantPath || (wantPath.endsWith('*') && r.path.startsWith(wantPath.slice(0, -1)))) &&
          (!wantMethod || r.method === wantMethod.toUpperCase()),
      )
      return sendJson(res, 200, { data })
    }

    if (method === 'GET' && path === '/_fake/events') {
      const type = url.searchParams.get('type')
      const data = state.events
        .filter((e) => !type || e.type === type)
        .map((event) => ({ event, deliveries: state.deliveries.filter((d) => d.eventId === event.id) }))
      return sendJson(res, 200, { data })
    }

    if (method === 'POST' && path === '/_fake/reset') {
      resetState()
      return sendJson(res, 200, { ok: true })
    }

    if (path === '/_fake/config' && (method === 'GET' || method === 'POST')) {
      if (method === 'POST') {
        const c = state.config
        if ('webhookUrl' in body) {
          const v = body.webhookUrl
          if (v !== null && (typeof v !== 'string' || !/^https?:\/\/\S+$/.test(v))) return controlError(res, 400, '`webhookUrl` must be an http(s) URL or null.')
          c.webhookUrl = v === null || v === '' ? null : (v as string)
        }
        if ('webhookSecret' in body) {
          if (typeof body.webhookSecret !== 'string' || body.webhookSecret === '') return controlError(res, 400, '`webhookSecret` must be a non-empty string.')
          c.webhookSecret = body.webhookSecret
        }
        for (const k of ['webhookMaxAttempts', 'webhookRetryBaseMs', 'webhookTimeoutMs'] as const) {
          if (k in body) {
            const n = Number(body[k])
            if (!Number.isInteger(n) || n < (k === 'webhookRetryBaseMs' ? 0 : 1)) return controlError(res, 400, `\`${k}\` must be a whole number.`)
            c[k] = n
          }
        }
        if ('enabledEvents' in body) {
          const v = body.enabledEvents
          if (!Array.isArray(v) || !v.every((x) => typeof x === 'string')) return controlError(res, 400, '`enabledEvents` must be a list of event types.')
          c.enabledEvents = v as string[]
        }
      }
      return sendJson(res, 200, { config: state.config })
    }

    if (method === 'POST' && path === '/_fake/fail-next') {
      const status = body.status === undefined ? 500 : Number(body.status)
      const count = body.count === undefined ? 1 : Number(body.count)
      if (!Number.isInteger(status) || status < 400 || status > 599) return controlError(res, 400, '`status` must be an HTTP error status (400-599).')
      if (!Number.isInteger(count) || count < 1) return controlError(res, 400, '`count` must be 1 or more.')
      state.failNext = { status, count, path: typeof body.path === 'string' ? body.path : null }
      return sendJson(res, 200, { failNext: state.failNext })
    }

    return controlError(res, 404, `Unknown control route: ${method} ${path}`)
  }

  function cancelBackground(): void {
    for (const t of timers) clearTimeout(t)
    timers.clear()
    for (const c of inflight) c.abort(new Error('reset'))
  }

  function resetState(): void {
    cancelBackground()
    resetCount += 1
    const fresh = freshState(state.config, options.apiVersion ?? DEFAULT_API_VERSION)
    Object.assign(state, fresh)
    sessionIntentData.clear()
  }

  // ---- server --------------------------------------------------------------------------------------

  const server = http.createServer((req, res) => {
    const url = new URL(req.url ?? '/', 'http://fake.invalid')
    const path = url.pathname
    const task = path.startsWith('/v1/')
      ? handleApi(req, res, url)
      : path.startsWith('/pay/')
        ? handlePay(req, res, url)
        : path.startsWith('/_fake/')
          ? handleControl(req, res, url)
          : Promise.resolve(sendJson(res, 404, { error: { type: 'invalid_request_error', message: `Unrecognized request URL (${req.method}: ${path}).` } }))
    task.catch((e: unknown) => {
      if (!res.headersSent) sendJson(res, 500, { error: { type: 'api_error', message: e instanceof Error ? e.message : String(e) } })
      else res.destroy()
    })
  })

  return {
    state,
    listen() {
      return new Promise((resolve, reject) => {
        server.once('error', reject)
        server.listen(options.port ?? 0, host, () => {
          server.off('error', reject)
          const port = (server.address() as AddressInfo).port
          const url = `http://${host.includes(':') ? `[${host}]` : host}:${port}`
          if (!options.publicUrl) publicUrl = url
          resolve({ port, url })
        })
      })
    },
    close() {
      closed = true
      cancelBackground()
      return new Promise((resolve, reject) => {
        if (!server.listening) return resolve()
        server.close((err) => (err ? reject(err) : resolve()))
        server.closeAllConnections()
      })
    },
  }
}
