/**
 * Errors in the API's envelope `{ error: { type, code, message, param, ... } }`. The SDK picks its error class
 * from the HTTP status alone (observed SDK behaviour: 400/404 invalid request, 401 authentication, 402 card,
 * other statuses API error), so every error carries the status the real service would answer with.
 */
import type { PaymentError, PaymentIntent } from './types'

export interface ErrorBody {
  type: 'invalid_request_error' | 'card_error' | 'idempotency_error' | 'api_error'
  message: string
  code?: string
  decline_code?: string
  param?: string
  charge?: string
  payment_intent?: PaymentIntent
  payment_method?: PaymentError['payment_method']
}

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly body: ErrorBody,
    /** Parameter and auth failures happen before the endpoint runs, so they are not saved for the key. */
    readonly savedForIdempotency = true,
  ) {
    super(body.message)
  }
}

export function paramError(message: string, param: string, code = 'parameter_invalid'): ApiError {
  return new ApiError(400, { type: 'invalid_request_error', code, message, param }, false)
}

export function missing(param: string): ApiError {
  // API reference (from memory): "Missing required param: <name>." with code parameter_missing
  return paramError(`Missing required param: ${param}.`, param, 'parameter_missing')
}

export function noSuch(kind: string, id: string, param: string): ApiError {
  // API reference (from memory): 404 resource_missing "No such <object>: '<id>'"
  return new ApiError(404, { type: 'invalid_request_error', code: 'resource_missing', message: `No such ${kind}: '${id}'`, param }, false)
}

/** A parameter that names an object the fake does not hold (stored prices, products, payment methods). */
export function unknownReference(kind: string, id: string, param: string): ApiError {
  return paramError(`No such ${kind}: '${id}'`, param, 'resource_missing')
}

export function stateError(message: string, code = 'payment_intent_unexpected_state', param?: string): ApiError {
  return new ApiError(400, { type: 'invalid_request_error', code, message, ...(param ? { param } : {}) })
}
