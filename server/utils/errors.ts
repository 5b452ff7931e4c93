/**
 * The one mapper from what went wrong to the HTTP answer. Services and routes throw `DomainError`s
 * (server/services/errors.ts); `server/error-handler.ts` runs this on every error a request raises, so no route
 * builds an HTTP error itself. Validation failures that escape as a `ZodError` are answered like any bad input.
 */
import { ZodError } from 'zod'
import { fieldMessages } from '../../shared/utils/field-messages'
import { invalidInput, isDomainError, type DomainError, type DomainErrorKind } from '../services/errors'

export { DomainError, conflict, forbidden, invalidInput, notFound, unauthenticated } from '../services/errors'

const STATUS: Record<DomainErrorKind, [number, string]> = {
  bad_request: [400, 'Bad Request'],
  unauthenticated: [401, 'Unauthorized'],
  payment_required: [402, 'Payment Required'],
  forbidden: [403, 'Forbidden'],
  not_found: [404, 'Not Found'],
  conflict: [409, 'Conflict'],
  gone: [410, 'Gone'],
  too_large: [413, 'Content Too Large'],
  unsupported: [415, 'Unsupported Media Type'],
  invalid: [422, 'Unprocessable Entity'],
  too_many: [429, 'Too Many Requests'],
  failed: [500, 'Internal Server Error'],
  upstream: [502, 'Bad Gateway'],
  unavailable: [503, 'Service Unavailable'],
}

export interface HttpAnswer {
  statusCode: number
  statusMessage: string
  message: string
  /** `{ fields }` for field messages, plus any details the error carries */
  data: Record<string, unknown>
  retryAfterSeconds?: number
}

/** The HTTP answer for an error, or null when it is not one of ours (a bug: the default 500 handling applies). */
export function httpAnswerOf(err: unknown): HttpAnswer | null {
  const domain: DomainError | null = isDomainError(err) ? err : err instanceof ZodError ? invalidInput(fieldMessages(err.issues)) : null
  if (!domain) return null
  const [statusCode, statusMessage] = STATUS[domain.kind]
  const withFields = domain.kind === 'invalid' || Object.keys(domain.fields).length > 0
  return {
    statusCode,
    statusMessage,
    message: domain.message,
    data: { ...domain.details, ...(withFields ? { fields: domain.fields } : {}) },
    ...(domain.retryAfterSeconds !== undefined ? { retryAfterSeconds: domain.retryAfterSeconds } : {}),
  }
}
