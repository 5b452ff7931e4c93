/**
 * First of the Nitro error handlers (nuxt.config.ts puts it before Nuxt's own): a `DomainError` thrown anywhere
 * in a request becomes its HTTP answer through the one mapper (server/utils/errors.ts). It only rewrites the error;
 * the handlers after it (Nuxt's error page for a browser, JSON for the API) send it as usual.
 */
import { setResponseHeader, setResponseStatus } from 'h3'
import { defineNitroErrorHandler } from 'nitropack/runtime'
import { httpAnswerOf } from './utils/errors'

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
})
