/**
 * First of the Nitro error handlers (nuxt.config.ts puts it before Nuxt's own): a `DomainError` thrown anywhere
 * in a request becomes its HTTP answer through the one mapper (server/utils/errors.ts). It only rewrites the error;
 * the handlers after it (Nuxt's error page for a browser, JSON for the API) send it as usual. Refusals that say
 * something about who tried what (403, 404 on the API for a signed-in caller, 413, 415, 429) are written to the
 * security log here, in one place.
 */
import type { H3Event } from 'h3'
import { getRequestIP, setResponseHeader, setResponseStatus } from 'h3'
import { defineNitroErrorHandler } from 'nitropack/runtime'
import { securityEvent, type SecurityEvent } from './services/security-log'
import { httpAnswerOf } from './utils/errors'

const UPLOADS = /^\/api\/(trade-applications|garage\/logo|price-files)$/

function logRefusal(event: H3Event, status: number, message: string): void {
  const path = event.path.split('?')[0]!
  const auth = event.context.auth
  let what: SecurityEvent | null = null
  if (status === 403) what = 'access.forbidden'
  else if (status === 404 && auth && path.startsWith('/api/')) what = 'access.not_found'
  else if (status === 413 || status === 415) what = UPLOADS.test(path) ? 'upload.refused' : 'request.refused'
  else if (status === 429) what = 'request.throttled'
  if (!what) return
  securityEvent(what, {
    userId: auth?.user.id ?? null, organisationId: auth?.org.id ?? null, address: getRequestIP(event) ?? '',
    method: event.method, path, status, reason: message.slice(0, 200),
  })
}

export default defineNitroErrorHandler((error, event) => {
  const answer = httpAnswerOf(error.cause) ?? httpAnswerOf(error)
  if (!answer) return
  Object.assign(error, {
    statusCode: answer.statusCode,
    statusMessage: answer.statusMessage,
    message: answer.message,
    data: answer.data,
    unhandled: false,
  })
  setResponseStatus(event, answer.statusCode, answer.statusMessage)
  if (answer.retryAfterSeconds !== undefined) setResponseHeader(event, 'retry-after', answer.retryAfterSeconds)
  // a body refused as too large may still be arriving: the connection ends with this answer, so the next request
  // goes on a fresh one instead of after bytes the server will not read
  if (answer.statusCode === 413) setResponseHeader(event, 'connection', 'close')
  logRefusal(event, answer.statusCode, answer.message)
})
