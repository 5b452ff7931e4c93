/**
 * The in-memory store: every object the fake has made, the requests it saw, the answers kept for idempotency
 * keys, and its configuration. Tests read it through `fake.state`; a reset replaces its contents in place.
 */
import { randomBytes } from 'node:crypto'
import { noSuch } from './errors'
import type { Charge, CheckoutSession, LineItem, Metadata, PaymentIntent, Refund, StripeEvent } from './types'

export interface FakeConfig {
  webhookUrl: string | null
  webhookSecret: string
  webhookMaxAttempts: number
  webhookRetryBaseMs: number
  webhookTimeoutMs: number
  enabledEvents: string[]
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

export interface StoredResponse {
  fingerprint: string
  status: number
  body: unknown
}

/** What a Checkout Session hands to the PaymentIntent made when its customer first pays. */
export interface IntentData {
  metadata?: Metadata
  description?: string
  receiptEmail?: string
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
  /** checkout session id -> its `payment_intent_data` */
  intentData: Map<string, IntentData>
  config: FakeConfig
}

export function emptyState(config: FakeConfig, apiVersion: string): FakeState {
  return {
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
    intentData: new Map(),
    config,
  }
}

const ALPHABET = 'abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ0123456789'

export function randomId(prefix: string, length = 24): string {
  let out = prefix
  while (out.length < prefix.length + length) {
    for (const byte of randomBytes(length)) {
      if (byte < 248 && out.length < prefix.length + length) out += ALPHABET[byte % 62] // 248 = 4 * 62: no bias
    }
  }
  return out
}

/** Answers and events carry copies, so later changes to the stored object do not leak into them. */
export function clone<T>(value: T): T {
  return structuredClone(value)
}

/** Applies a metadata update: a null value removes its key. */
export function mergeMetadata(base: Metadata, update: Record<string, string | null> | undefined): Metadata {
  const merged = Object.entries({ ...base, ...update })
  return Object.fromEntries(merged.filter((e): e is [string, string] => e[1] !== null))
}

export function sessionById(state: FakeState, id: string): CheckoutSession {
  const s = state.sessions.get(id)
  if (!s) throw noSuch('checkout.session', id, 'session')
  return s
}

export function intentById(state: FakeState, id: string): PaymentIntent {
  const pi = state.paymentIntents.get(id)
  if (!pi) throw noSuch('payment_intent', id, 'intent')
  return pi
}

export function chargeById(state: FakeState, id: string): Charge {
  const ch = state.charges.get(id)
  if (!ch) throw noSuch('charge', id, 'charge')
  return ch
}

/** Any stored object by its id, told apart by the id's prefix. */
export function objectById(state: FakeState, id: string): object | undefined {
  if (id.startsWith('pi_')) return state.paymentIntents.get(id)
  if (id.startsWith('ch_')) return state.charges.get(id)
  if (id.startsWith('re_')) return state.refunds.get(id)
  if (id.startsWith('cs_')) return state.sessions.get(id)
  return undefined
}

/** Keeps the request log bounded: a long `npm run fakes` session would otherwise grow without end. */
export function logRequest(state: FakeState, entry: RequestRecord): RequestRecord {
  state.requests.push(entry)
  if (state.requests.length > 2000) state.requests.splice(0, state.requests.length - 2000)
  return entry
}
