/**
 * What went wrong, in the product's words and without HTTP. Services and routes throw a `DomainError`; one mapper
 * (`server/utils/errors.ts`, applied by the Nitro error handler `server/error-handler.ts`) turns its kind into the
 * HTTP answer. Plain Node: scripts and the seed call the same services and catch the same errors.
 */

export type DomainErrorKind =
  | 'bad_request' // the request itself cannot be read (a webhook whose signature does not verify)
  | 'unauthenticated' // nobody is signed in
  | 'forbidden' // signed in, but the role or the organisation's standing does not allow it
  | 'not_found' // does not exist, or is not the caller's (never say which)
  | 'conflict' // the record is not in a state that allows this (decided, changed meanwhile, duplicate)
  | 'invalid' // the input is wrong: `fields` says which field and why
  | 'payment_required' // the card was declined or the checkout could not be paid
  | 'gone' // a link or token that has been used or has lapsed
  | 'too_large' // a body or file over its limit
  | 'unsupported' // a body or file of a type this route does not take
  | 'too_many' // throttled: try again after `retryAfterSeconds`
  | 'unavailable' // busy: try again shortly
  | 'upstream' // a service behind us (card payments) did not answer properly; nothing was done
  | 'failed' // the operation stopped and was undone; the message says so and is safe to show

export interface DomainErrorOptions {
  /** field path -> message, shown next to the field (`_` for the whole input) */
  fields?: Record<string, string>
  /** further facts for the caller (an order id, the shortages, the balance owed) */
  details?: Record<string, unknown>
  retryAfterSeconds?: number
  cause?: unknown
}

export class DomainError extends Error {
  override readonly name = 'DomainError'
  readonly kind: DomainErrorKind
  readonly fields: Record<string, string>
  readonly details: Record<string, unknown>
  readonly retryAfterSeconds: number | undefined

  constructor(kind: DomainErrorKind, message: string, options: DomainErrorOptions = {}) {
    super(message, options.cause === undefined ? undefined : { cause: options.cause })
    this.kind = kind
    this.fields = options.fields ?? {}
    this.details = options.details ?? {}
    this.retryAfterSeconds = options.retryAfterSeconds
  }
}

/** True for a `DomainError`, also one from another copy of this module (a worker bundle, a test import). */
export function isDomainError(err: unknown): err is DomainError {
  return err instanceof DomainError || (err instanceof Error && err.name === 'DomainError' && typeof (err as DomainError).kind === 'string')
}

/** The input is wrong: a message per field (`_` for the whole input); the summary names the fields. */
export function invalidInput(fields: Record<string, string>, message = 'Some fields need attention.', details?: Record<string, unknown>): DomainError {
  const named = Object.keys(fields).filter((k) => k !== '_')
  const summary = named.length ? `${message} (${named.join(', ')})` : (fields._ ?? message)
  return new DomainError('invalid', summary, { fields, details })
}

/** A record that does not exist or is not the caller's (never reveal which). */
export function notFound(what = 'Record'): DomainError {
  return new DomainError('not_found', `${what} not found.`)
}

export function conflict(message: string, details?: Record<string, unknown>, fields?: Record<string, string>): DomainError {
  return new DomainError('conflict', message, { details, fields })
}

export function forbidden(message = 'Your role does not allow this.'): DomainError {
  return new DomainError('forbidden', message)
}

export function unauthenticated(message = 'Please sign in.'): DomainError {
  return new DomainError('unauthenticated', message)
}
