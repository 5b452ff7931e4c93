/**
 * Events: made when an object changes (and handed to webhook delivery), listed and retrieved through
 * `/v1/events`.
 */
import { z } from 'zod'
import { route, type Fake, type RequestContext, type Route } from './context'
import { noSuch } from './errors'
import { list, newestFirst } from './listing'
import { expandOnly, form, listFields, parse } from './params'
import { clone, randomId, type DeliveryAttempt } from './store'
import type { StripeEvent } from './types'

export interface Emitted {
  event: StripeEvent
  /** The first delivery attempt (null when there is nowhere to deliver). */
  delivered: Promise<DeliveryAttempt | null>
}

/** Records an event about `object` (a copy, as it is now) and starts delivering it. */
export function emit(fake: Fake, type: string, object: object, ctx: RequestContext | null, previous?: Record<string, unknown>): Emitted {
  const { state } = fake
  const event: StripeEvent = {
    id: randomId('evt_'),
    object: 'event',
    api_version: state.apiVersion,
    created: fake.now(),
    data: { object: clone(object), ...(previous ? { previous_attributes: previous } : {}) },
    livemode: false,
    pending_webhooks: state.config.webhookUrl ? 1 : 0,
    request: { id: ctx?.requestId ?? null, idempotency_key: ctx?.idempotencyKey ?? null },
    type,
  }
  state.events.push(event)
  return { event, delivered: fake.webhooks.deliver(event) }
}

const eventListSchema = form({
  ...listFields,
  type: z.string().optional(),
  types: z.array(z.string()).max(20).optional(),
})

/** `checkout.session.*` -> a pattern matching every type under it (API reference, from memory). */
function typePattern(type: string): RegExp {
  return new RegExp(`^${type.split('*').map((s) => s.replace(/[.+?^${}()|[\]\\]/g, '\\$&')).join('.*')}$`)
}

export function eventRoutes(fake: Fake): Route[] {
  const { state } = fake
  return [
    route('GET', /^\/v1\/events$/, (raw) => {
      const p = parse(eventListSchema, raw)
      let rows = newestFirst(state.events)
      if (p.type) {
        const re = typePattern(p.type)
        rows = rows.filter((e) => re.test(e.type))
      }
      if (p.types?.length) rows = rows.filter((e) => p.types?.includes(e.type))
      return { body: list(state, rows, p, '/v1/events') }
    }),

    route('GET', /^\/v1\/events\/([^/]+)$/, (raw, [id]) => {
      parse(expandOnly, raw)
      const e = state.events.find((x) => x.id === id)
      if (!e) throw noSuch('event', id as string, 'id')
      return { body: clone(e) }
    }),
  ]
}
