/**
 * Security events as structured JSON lines (pino), one per event, for whoever watches the server: sign-in failures
 * and throttling, refusals (403, 404 on someone else's record, 413, 415), rejected uploads, bad webhook signatures,
 * second-factor failures, password, role and second-factor changes.
 *
 * What never goes in: passwords, cookies, tokens, codes, card numbers. Callers pass only the fields below; paths
 * go through `safePath`, which drops the query and masks the link tokens that travel in some paths, and pino's
 * `redact` censors the usual secret-bearing keys should one slip into a detail anyway.
 *
 * Lines go to standard output, or to the file named by `BORELINE_SECURITY_LOG` (appended). Plain Node.
 */
import pino, { type Logger } from 'pino'

export type SecurityEvent =
  | 'sign_in.failed' | 'sign_in.throttled' | 'sign_in.slowed' | 'sign_in.succeeded'
  | 'mfa.failed' | 'mfa.throttled' | 'mfa.enrolled' | 'mfa.recovery_code_used' | 'mfa.recovery_codes_renewed'
  | 'mfa.reset' | 'mfa.turned_off'
  | 'password.changed' | 'password.reset' | 'password.refused_weak'
  | 'role.changed' | 'person.removed'
  | 'access.forbidden' | 'access.not_found' | 'request.throttled' | 'request.refused' | 'upload.refused'
  | 'link.invalid' | 'webhook.bad_signature' | 'application.known_email' | 'hashing.busy'

export interface SecurityFields {
  /** who acted, when known */
  userId?: number | null
  organisationId?: number | null
  /** the e-mail a sign-in or application named (an address, not a secret) */
  email?: string
  /** the client's socket address */
  address?: string
  method?: string
  path?: string
  status?: number
  reason?: string
  /** the person acted upon (a role change, a reset of their second factor) */
  targetUserId?: number
  [key: string]: unknown
}

// keys that could carry a secret, wherever they appear in a line
const REDACT = ['password', 'currentPassword', 'newPassword', 'token', 'code', 'secret', 'cookie', 'authorization', 'card', 'cardNumber',
  '*.password', '*.token', '*.code', '*.secret', '*.cookie', '*.authorization', '*.card', '*.cardNumber']

let logger: Logger | undefined

function securityLogger(): Logger {
  if (logger) return logger
  const file = process.env.BORELINE_SECURITY_LOG
  logger = pino({
    base: { log: 'security' },
    messageKey: 'event',
    timestamp: pino.stdTimeFunctions.isoTime,
    redact: { paths: REDACT, censor: '[removed]' },
    formatters: { level: (label) => ({ level: label }) },
  }, pino.destination({ dest: file || 1, sync: false, mkdir: !!file, minLength: 0 }))
  return logger
}

/** Writes one security event. Never throws: a logging problem must not change what the request does. */
export function securityEvent(event: SecurityEvent, fields: SecurityFields = {}, level: 'info' | 'warn' = 'warn'): void {
  try {
    const clean = { ...fields, ...(fields.path ? { path: safePath(fields.path) } : {}) }
    securityLogger()[level](clean, event)
  } catch (err) {
    console.error('[boreline] security log:', (err as Error).message)
  }
}

// path segments that are bearer tokens: the owner's quote link, reset and invitation links
const TOKEN_PATHS = [
  /^(\/q\/)[^/]+/,
  /^(\/api\/quote-links\/)[^/]+/,
  /^(\/api\/auth\/reset-password\/)[^/]+/,
  /^(\/api\/auth\/invitations\/)(?!accept$)[^/]+/,
  /^(\/reset\/)[^/]+/,
  /^(\/invite\/)[^/]+/,
]

/** The path without its query string and with link tokens masked, at most 200 characters. */
export function safePath(path: string): string {
  let p = path.split('?')[0]!.split('#')[0]!
  for (const re of TOKEN_PATHS) p = p.replace(re, '$1:token')
  return p.slice(0, 200)
}
