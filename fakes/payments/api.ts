/**
 * The `/v1` API as the SDK meets it: test-key authentication, form decoding, idempotency keys (the first answer
 * for a key is replayed, whatever its status; the same key with other parameters is refused), failures injected
 * by the control routes, and the endpoints' answers with a `Request-Id`.
 */
import type http from 'node:http'
import { checkoutSessionRoutes } from './checkout-sessions'
import type { Fake, RequestContext, Route } from './context'
import { ApiError } from './errors'
import { eventRoutes } from './events'
import { decodedOrRaw, decodeForm, type FormObject } from './form'
import { readBody, sendJson } from './http'
import { paymentIntentRoutes } from './payment-intents'
import { refundRoutes } from './refunds'
import { sweepExpired } from './session-lifecycle'
import { logRequest, randomId } from './store'

function authError(header: string | undefined): ApiError | null {
  if (!header) {
    // API reference (from memory)
    return new ApiError(401, {
      type: 'invalid_request_error',
      message: "You did not provide an API key. You need to provide your API key in the Authorization header, using Bearer auth (e.g. 'Authorization: Bearer YOUR_SECRET_KEY').",
    }, false)
  }
  const key = /^Bearer (.+)$/.exec(header)?.[1] ?? ''
  if (key.startsWith('sk_test_')) return null
  const masked = key.length > 12 ? `${key.slice(0, 8)}${'*'.repeat(Math.max(0, key.length - 12))}${key.slice(-4)}` : '****'
  return new ApiError(401, {
    type: 'invalid_request_error',
    code: 'api_key_invalid',
    message: key.startsWith('sk_live_') ? 'The payments fake accepts only test keys (sk_test_...).' : `Invalid API Key provided: ${masked}`,
  }, false)
}

function idempotencyMismatch(key: string): unknown {
  // observed SDK behaviour: this envelope type becomes StripeIdempotencyError
  return {
    error: {
      type: 'idempotency_error',
      message: `Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${key}' if you meant to execute a different request.`,
    },
  }
}

function findRoute(routes: Route[], method: string, path: string): { route: Route; ids: string[] } | null {
  for (const route of routes) {
    const m = route.method === method ? route.pattern.exec(path) : null
    if (m) return { route, ids: m.slice(1).map((s) => decodeURIComponent(s)) }
  }
  return null
}

/** Runs the endpoint; any error becomes its envelope, and an unexpected one a 500. */
function run(route: Route, params: FormObject, ids: string[], ctx: RequestContext): { status: number; body: unknown; saved: boolean } {
  try {
    const result = route.handler(params, ids, ctx)
    return { status: result.status ?? 200, body: result.body, saved: true }
  } catch (e) {
    if (e instanceof ApiError) return { status: e.status, body: { error: e.body }, saved: e.savedForIdempotency }
    const message = `The payments fake failed: ${e instanceof Error ? e.message : String(e)}`
    return { status: 500, body: { error: { type: 'api_error', message } }, saved: true }
  }
}

/** The handler of every `/v1` request. */
export function apiHandler(fake: Fake): (req: http.IncomingMessage, res: http.ServerResponse, url: URL) => Promise<void> {
  const { state } = fake
  const routes = [...checkoutSessionRoutes(fake), ...paymentIntentRoutes(fake), ...refundRoutes(fake), ...eventRoutes(fake)]

  return async (req, res, url) => {
    const method = req.method ?? 'GET'
    const requestId = randomId('req_', 14)
    const keyHeader = req.headers['idempotency-key']
    const idempotencyKey = method === 'POST' && typeof keyHeader === 'string' && keyHeader !== '' ? keyHeader : null
    const version = req.headers['stripe-version']
    if (typeof version === 'string' && version) state.apiVersion = version
    const baseHeaders: Record<string, string> = { 'request-id': requestId, 'stripe-version': state.apiVersion }
    if (idempotencyKey) baseHeaders['idempotency-key'] = idempotencyKey

    const rawBody = method === 'GET' || method === 'DELETE' ? url.search.slice(1) : await readBody(req)
    const entry = logRequest(state, {
      at: new Date().toISOString(), method, path: url.pathname, query: decodedOrRaw(url.search.slice(1)), idempotencyKey, body: decodedOrRaw(rawBody), requestId,
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
    sweepExpired(fake)

    const fingerprint = JSON.stringify([method, url.pathname, params])
    if (idempotencyKey) {
      if (idempotencyKey.length > 255) {
        return respond(400, { error: { type: 'invalid_request_error', message: 'Idempotency-Key must be at most 255 characters long.', param: 'Idempotency-Key' } })
      }
      const stored = state.idempotency.get(idempotencyKey)
      if (stored && stored.fingerprint !== fingerprint) return respond(400, idempotencyMismatch(idempotencyKey))
      if (stored) {
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

    const found = findRoute(routes, method, url.pathname)
    if (!found) {
      const message = `Unrecognized request URL (${method}: ${url.pathname}). The payments fake does not implement this endpoint.`
      return respond(404, { error: { type: 'invalid_request_error', message } })
    }
    const result = run(found.route, params, found.ids, { requestId, idempotencyKey })
    if (result.saved) save(result.status, result.body)
    return respond(result.status, result.body)
  }
}
