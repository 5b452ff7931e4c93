/**
 * What the parts of one running fake share, and the shape of an API endpoint. Every part takes the `Fake` it
 * works for, so two fakes in one process (a test beside `npm run fakes`) never share state.
 */
import type { FormObject } from './form'
import type { FakeState } from './store'
import type { WebhookSender } from './webhooks'

export interface Fake {
  readonly state: FakeState
  readonly webhooks: WebhookSender
  /** Base of the hosted page URLs: the server's own address unless a public one was given. */
  publicUrl: string
  /** The fake clock in unix seconds; `/_fake/clock/advance` moves it forward. */
  now(): number
  /** Empties the store and drops pending deliveries; the configuration stays. */
  reset(): void
}

/** Which API request caused a change, as events record it. */
export interface RequestContext {
  requestId: string | null
  idempotencyKey: string | null
}

export interface HandlerResult {
  status?: number
  body: unknown
}

/** An endpoint gets the decoded parameters, the path's captured ids and the request context. */
export type Handler = (params: FormObject, ids: string[], ctx: RequestContext) => HandlerResult

export interface Route {
  method: 'GET' | 'POST'
  pattern: RegExp
  handler: Handler
}

export function route(method: Route['method'], pattern: RegExp, handler: Handler): Route {
  return { method, pattern, handler }
}
