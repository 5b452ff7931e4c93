/**
 * Test-only control routes under `/_fake/`: pay or expire a session without a browser, move the fake clock,
 * replay an event (again, duplicated or badly signed), read what the fake saw and sent, change the webhook
 * target, make the next API requests fail, and reset. Bodies may be JSON or a form; errors are
 * `{ error: { message } }`.
 */
import type http from 'node:http'
import { z } from 'zod'
import type { Fake } from './context'
import { decodeForm } from './form'
import { readBody, sendJson } from './http'
import { expireSession, paySession, successUrl, sweepExpired } from './session-lifecycle'
import { clone, type DeliveryAttempt } from './store'

class ControlError extends Error {
  constructor(readonly status: number, message: string) {
    super(message)
  }
}

type Body = Record<string, unknown>
interface ControlAnswer {
  status?: number
  body: unknown
}
interface ControlRoute {
  method: 'GET' | 'POST'
  pattern: RegExp
  handle: (body: Body, ids: string[], url: URL) => ControlAnswer | Promise<ControlAnswer>
}

async function readControlBody(req: http.IncomingMessage): Promise<Body> {
  const raw = await readBody(req)
  if (raw.trim() === '') return {}
  if (String(req.headers['content-type'] ?? '').includes('application/json')) {
    const parsed: unknown = JSON.parse(raw)
    return parsed && typeof parsed === 'object' && !Array.isArray(parsed) ? (parsed as Body) : {}
  }
  return decodeForm(raw)
}

/** Checks a control body; the first problem is answered with its message. */
function checked<T extends z.ZodType>(schema: T, body: Body): z.output<T> {
  const result = schema.safeParse(body)
  if (!result.success) throw new ControlError(400, result.error.issues[0]?.message ?? 'Invalid body.')
  return result.data
}

/** A whole number from `min` to `max`, given as a JSON number or a form string. */
const whole = (message: string, min: number, max = Number.MAX_SAFE_INTEGER) =>
  z.coerce.number(message).refine((n) => Number.isInteger(n) && n >= min && n <= max, message)

const advanceSchema = z.object({ seconds: whole('`seconds` must be a whole number of seconds, 0 or more.', 0) })

const secretMessage = '`webhookSecret` must be a non-empty string.'
const urlMessage = '`webhookUrl` must be an http(s) URL or null.'
const eventTypes = '`enabledEvents` must be a list of event types.'
const configSchema = z.object({
  webhookUrl: z.string(urlMessage).regex(/^https?:\/\/\S+$/, urlMessage).nullable().optional(),
  webhookSecret: z.string(secretMessage).min(1, secretMessage).optional(),
  webhookMaxAttempts: whole('`webhookMaxAttempts` must be a whole number.', 1).optional(),
  webhookRetryBaseMs: whole('`webhookRetryBaseMs` must be a whole number.', 0).optional(),
  webhookTimeoutMs: whole('`webhookTimeoutMs` must be a whole number.', 1).optional(),
  enabledEvents: z.array(z.string(eventTypes), eventTypes).optional(),
})

const failNextSchema = z.object({
  status: whole('`status` must be an HTTP error status (400-599).', 400, 599).default(500),
  count: whole('`count` must be 1 or more.', 1).default(1),
  path: z.unknown().optional(),
})

function controlRoutes(fake: Fake): ControlRoute[] {
  const { state } = fake
  const openSession = (id: string) => {
    sweepExpired(fake)
    const session = state.sessions.get(id)
    if (!session) throw new ControlError(404, `No such checkout session: ${id}`)
    if (session.status !== 'open') throw new ControlError(409, `The checkout session is ${session.status}, not open.`)
    return session
  }
  const route = (method: ControlRoute['method'], pattern: RegExp, handle: ControlRoute['handle']): ControlRoute => ({ method, pattern, handle })

  return [
    route('GET', /^\/_fake\/health$/, () => ({ body: { ok: true } })),

    route('POST', /^\/_fake\/sessions\/([^/]+)\/complete$/, async (body, [id]) => {
      const session = openSession(id as string)
      const result = paySession(fake, session, typeof body.card === 'string' && body.card ? body.card : '4242 4242 4242 4242')
      if (result.invalid) throw new ControlError(400, result.invalid)
      const delivery = result.delivered ? await result.delivered : null
      const outcome = result.ok
        ? { redirect: session.success_url ? successUrl(session) : null }
        : { error: result.intent?.last_payment_error ?? null }
      const answer = { session: clone(session), payment_intent: result.intent ? clone(result.intent) : null, delivery, ...outcome }
      return { status: result.ok ? 200 : 402, body: answer }
    }),

    route('POST', /^\/_fake\/sessions\/([^/]+)\/expire$/, async (_body, [id]) => {
      const session = openSession(id as string)
      const delivery = await expireSession(fake, session, null)
      return { body: { session: clone(session), delivery } }
    }),

    route('GET', /^\/_fake\/clock$/, () => ({ body: { now: fake.now(), offset: state.clockOffset } })),

    route('POST', /^\/_fake\/clock\/advance$/, async (body) => {
      state.clockOffset += checked(advanceSchema, body).seconds
      const swept = sweepExpired(fake)
      await Promise.all(swept.delivered)
      return { body: { now: fake.now(), offset: state.clockOffset, expired: swept.ids } }
    }),

    route('POST', /^\/_fake\/events\/([^/]+)\/resend$/, async (_body, [id], url) => {
      const event = state.events.find((e) => e.id === id)
      if (!event) throw new ControlError(404, `No such event: ${id}`)
      if (!state.config.webhookUrl) throw new ControlError(409, 'No webhook URL is configured.')
      const times = url.searchParams.has('duplicate') ? Number(url.searchParams.get('duplicate')) : 1
      if (!Number.isInteger(times) || times < 1 || times > 20) throw new ControlError(400, '`duplicate` must be a whole number from 1 to 20.')
      const sig = url.searchParams.get('signature')
      if (sig !== null && sig !== 'invalid' && sig !== 'stale') throw new ControlError(400, '`signature` must be `invalid` or `stale`.')
      const deliveries: (DeliveryAttempt | null)[] = []
      for (let i = 0; i < times; i++) deliveries.push(await fake.webhooks.deliver(event, sig ?? undefined))
      return { body: { event: clone(event), deliveries } }
    }),

    route('GET', /^\/_fake\/requests$/, (_body, _ids, url) => {
      const wantPath = url.searchParams.get('path')
      const wantMethod = url.searchParams.get('method')
      const data = state.requests.filter(
        (r) => (!wantPath || r.path === wantPath || (wantPath.endsWith('*') && r.path.startsWith(wantPath.slice(0, -1)))) &&
          (!wantMethod || r.method === wantMethod.toUpperCase()),
      )
      return { body: { data } }
    }),

    route('GET', /^\/_fake\/events$/, (_body, _ids, url) => {
      const type = url.searchParams.get('type')
      const data = state.events
        .filter((e) => !type || e.type === type)
        .map((event) => ({ event, deliveries: state.deliveries.filter((d) => d.eventId === event.id) }))
      return { body: { data } }
    }),

    route('POST', /^\/_fake\/reset$/, () => {
      fake.reset()
      return { body: { ok: true } }
    }),

    route('GET', /^\/_fake\/config$/, () => ({ body: { config: state.config } })),

    route('POST', /^\/_fake\/config$/, (body) => {
      // Checked whole before any of it applies; keys left out keep their values.
      Object.assign(state.config, checked(configSchema, body))
      return { body: { config: state.config } }
    }),

    route('POST', /^\/_fake\/fail-next$/, (body) => {
      const { status, count, path } = checked(failNextSchema, body)
      state.failNext = { status, count, path: typeof path === 'string' ? path : null }
      return { body: { failNext: state.failNext } }
    }),
  ]
}

/** The handler of every `/_fake/` request. */
export function controlHandler(fake: Fake): (req: http.IncomingMessage, res: http.ServerResponse, url: URL) => Promise<void> {
  const routes = controlRoutes(fake)
  return async (req, res, url) => {
    const method = req.method ?? 'GET'
    let body: Body
    try {
      body = method === 'POST' ? await readControlBody(req) : {}
    } catch {
      return sendJson(res, 400, { error: { message: 'The body must be JSON or a form.' } })
    }
    for (const r of routes) {
      const m = r.method === method ? r.pattern.exec(url.pathname) : null
      if (!m) continue
      try {
        const answer = await r.handle(body, m.slice(1).map((s) => decodeURIComponent(s)), url)
        return sendJson(res, answer.status ?? 200, answer.body)
      } catch (e) {
        if (e instanceof ControlError) return sendJson(res, e.status, { error: { message: e.message } })
        throw e
      }
    }
    return sendJson(res, 404, { error: { message: `Unknown control route: ${method} ${url.pathname}` } })
  }
}
