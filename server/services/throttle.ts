/**
 * Throttles, with rate-limiter-flexible (atomic counters in this process; shared by every process on PostgreSQL,
 * see ./limiter.ts), keyed on the socket's address (never
 * `X-Forwarded-For`: anyone can send that header).
 *
 * Password guessing is held back without letting anyone lock the owner out of their own account:
 * - per e-mail *and* address: 10 failed attempts in 15 minutes, then 429 for that pair only;
 * - per address: 30 failed attempts in 15 minutes, whatever the e-mails (one address spraying many accounts);
 * - per e-mail, from any addresses: no hard lock, but a rising delay once it has failed FREE_FAILURES times in 15
 *   minutes (0.25 s doubling to MAX_DELAY_MS before the password is checked), so guessing one account from many
 *   addresses is slow while the owner still gets in; a used reset link clears it.
 * An attempt is *counted before* the password is checked and given back when it succeeds, so 50 parallel attempts
 * cannot all slip past while scrypt (~0.3 s each) is still running.
 *
 * Also here: the forgotten-password requests (quietly capped), the e-mailed links (reset, invitation) and trade
 * applications per address, and second-factor codes per person.
 */
import { RateLimiterRes } from 'rate-limiter-flexible'
import { Limiter } from './limiter'
import { DomainError } from './errors'
import { securityEvent } from './security-log'

const MINUTES_15 = 15 * 60
export const SIGN_IN_LIMIT = { pointsPerPair: 10, pointsPerAddress: 30, durationSeconds: MINUTES_15 }
export const FREE_FAILURES = 5
export const MAX_DELAY_MS = 8_000

const byPair = new Limiter({ keyPrefix: 'sign-in-pair', points: SIGN_IN_LIMIT.pointsPerPair, duration: MINUTES_15 })
const byAddress = new Limiter({ keyPrefix: 'sign-in-ip', points: SIGN_IN_LIMIT.pointsPerAddress, duration: MINUTES_15 })
// failures per e-mail only set the delay: never refused here
const byEmail = new Limiter({ keyPrefix: 'sign-in-email', points: 1_000_000, duration: MINUTES_15 })
// a used reset link starts the e-mail's pairs afresh: its generation is part of their keys. Kept in the same store
// as the counters (the database on PostgreSQL), so a reset through one process frees the pairs counted by all of
// them; never expires (duration 0), so a generation cannot fall back to keys still counting: one row per person
// who has ever reset a password
const generations = new Limiter({ keyPrefix: 'sign-in-generation', points: Number.MAX_SAFE_INTEGER, duration: 0 })
// forgotten-password requests: quietly capped so the form cannot be used to flood someone's inbox
const resetByEmail = new Limiter({ keyPrefix: 'reset-email', points: 3, duration: MINUTES_15 })
const resetByAddress = new Limiter({ keyPrefix: 'reset-ip', points: 20, duration: MINUTES_15 })
// every request that presents an e-mailed link (reset, invitation): reading it and using it
export const LINK_LIMIT = { points: 60, durationSeconds: MINUTES_15 }
const linksByAddress = new Limiter({ keyPrefix: 'account-link-ip', points: LINK_LIMIT.points, duration: LINK_LIMIT.durationSeconds })
// trade applications: each creates a garage, a person and a stored document
export const APPLICATION_LIMIT = { points: 10, durationSeconds: 60 * 60 }
const applicationsByAddress = new Limiter({ keyPrefix: 'application-ip', points: APPLICATION_LIMIT.points, duration: APPLICATION_LIMIT.durationSeconds })
// wrong second-factor codes per person
export const CODE_LIMIT = { points: 10, durationSeconds: MINUTES_15 }
const codesByUser = new Limiter({ keyPrefix: 'mfa-user', points: CODE_LIMIT.points, duration: CODE_LIMIT.durationSeconds })

/** Takes one point for `key`: null when it was free, else the seconds until the next one is. */
export async function take(limiter: Limiter, key: string): Promise<number | null> {
  try {
    await limiter.consume(key, 1)
    return null
  } catch (res) {
    if (res instanceof RateLimiterRes) return Math.max(1, Math.ceil(res.msBeforeNext / 1000))
    throw res
  }
}

const addressKey = (address: string) => address || 'unknown'
async function pairKey(email: string, address: string): Promise<string> {
  const generation = (await generations.get(email))?.consumedPoints ?? 0
  return `${email}|${generation}|${addressKey(address)}`
}

/** How long to hold an attempt for an e-mail that has already failed `failures` times in the window. */
export function delayFor(failures: number): number {
  if (failures < FREE_FAILURES) return 0
  return Math.min(MAX_DELAY_MS, 250 * 2 ** (failures - FREE_FAILURES))
}

export type Attempt = { ok: true; delayMs: number; release: () => Promise<void> } | { ok: false; retryAfterSeconds: number }

/**
 * Counts one sign-in attempt for this e-mail from this address. `ok: false` means refuse with 429 now; `ok: true`
 * gives the delay to wait before checking, and `release()`, to call when the password turned out right.
 */
export async function countSignInAttempt(email: string, address: string): Promise<Attempt> {
  const pair = await pairKey(email, address)
  const [a, b] = await Promise.all([take(byPair, pair), take(byAddress, addressKey(address))])
  if (a !== null || b !== null) return { ok: false, retryAfterSeconds: Math.max(a ?? 0, b ?? 0) }
  const counted = await byEmail.consume(email, 1)
  return {
    ok: true,
    delayMs: delayFor(counted.consumedPoints - 1),
    release: async () => {
      await Promise.all([byPair.reward(pair, 1), byAddress.reward(addressKey(address), 1), byEmail.reward(email, 1)])
    },
  }
}

/**
 * Counts an attempt with a password (a sign-in, or the current password a password change asks for): 429 with the
 * wait once this pair or address is over its limit, else waits the e-mail's delay. Returns `release`, to call when
 * the password was right.
 */
export async function passwordAttempt(email: string, address: string): Promise<() => Promise<void>> {
  const attempt = await countSignInAttempt(email, address)
  if (!attempt.ok) {
    const seconds = attempt.retryAfterSeconds
    securityEvent('sign_in.throttled', { email, address, reason: `retry after ${seconds} s` })
    throw tooMany(retryMessage(seconds), seconds)
  }
  if (attempt.delayMs > 0) {
    securityEvent('sign_in.slowed', { email, address, reason: `held ${attempt.delayMs} ms` }, 'info')
    await new Promise((r) => setTimeout(r, attempt.delayMs))
  }
  return attempt.release
}

/** After a password reset the owner of the address has proved themselves: no delay, every address starts afresh. */
export async function forgetSignInFailures(email: string): Promise<void> {
  await Promise.all([generations.consume(email, 1), byEmail.delete(email)])
}

/** Whether to act on a forgotten-password request (the answer to the caller is the same either way). */
export async function mayRequestReset(email: string, address: string): Promise<boolean> {
  const [a, b] = await Promise.all([take(resetByEmail, email), take(resetByAddress, addressKey(address))])
  return a === null && b === null
}

/** 429 once this address has presented e-mailed links (read or used) too often. */
export async function admitLinkUse(address: string): Promise<void> {
  const wait = await take(linksByAddress, addressKey(address))
  if (wait === null) return
  throw tooMany(`Too many tries from this connection. Please wait ${minutes(wait)} and open the link from the e-mail again.`, wait)
}

/** 429 once this address has sent too many trade applications. */
export async function admitApplication(address: string): Promise<void> {
  const wait = await take(applicationsByAddress, addressKey(address))
  if (wait === null) return
  throw tooMany(`Too many applications from this connection. Please wait ${minutes(wait)} and send it again.`, wait)
}

/** Counts a wrong second-factor code for this person; 429 once they are over the limit. */
export async function countWrongCode(userId: number): Promise<void> {
  const wait = await take(codesByUser, String(userId))
  if (wait !== null) throw codesThrottled(userId, wait)
}

/** 429 when this person has given too many wrong codes lately (checked before a code is looked at). */
export async function admitCode(userId: number): Promise<void> {
  const res = await codesByUser.get(String(userId))
  if (res && res.consumedPoints >= CODE_LIMIT.points) throw codesThrottled(userId, Math.max(1, Math.ceil(res.msBeforeNext / 1000)))
}

function codesThrottled(userId: number, seconds: number): DomainError {
  securityEvent('mfa.throttled', { userId, reason: `retry after ${seconds} s` })
  return tooMany(`Too many wrong codes. Try again in ${minutes(seconds)}.`, seconds)
}

function minutes(seconds: number): string {
  const m = Math.ceil(seconds / 60)
  return `${m} minute${m === 1 ? '' : 's'}`
}

function tooMany(message: string, seconds: number): DomainError {
  return new DomainError('too_many', message, { retryAfterSeconds: seconds, details: { retryAfterSeconds: seconds } })
}

export function retryMessage(seconds: number): string {
  return `Too many sign-in attempts. Try again in ${minutes(seconds)}.`
}
