/**
 * Sign-in throttling with rate-limiter-flexible (atomic counters in this process): at most 10 failed attempts
 * per e-mail and per client address in 15 minutes.
 *
 * An attempt is *counted before* the password is checked and given back when it succeeds, so 50 parallel
 * attempts cannot all slip past while scrypt (N = 2^17, ~0.3 s each) is still running. The address is the
 * socket's, never `X-Forwarded-For` (anyone can send that header).
 */
import { RateLimiterMemory, RateLimiterRes } from 'rate-limiter-flexible'
import { DomainError } from './errors'

export const SIGN_IN_LIMIT = { points: 10, durationSeconds: 15 * 60 }

const byEmail = new RateLimiterMemory({ keyPrefix: 'sign-in-email', points: SIGN_IN_LIMIT.points, duration: SIGN_IN_LIMIT.durationSeconds })
const byAddress = new RateLimiterMemory({ keyPrefix: 'sign-in-ip', points: SIGN_IN_LIMIT.points, duration: SIGN_IN_LIMIT.durationSeconds })
// forgotten-password requests: quietly capped so the form cannot be used to flood someone's inbox
const resetByEmail = new RateLimiterMemory({ keyPrefix: 'reset-email', points: 3, duration: 15 * 60 })
const resetByAddress = new RateLimiterMemory({ keyPrefix: 'reset-ip', points: 20, duration: 15 * 60 })

export type Attempt = { ok: true; release: () => Promise<void> } | { ok: false; retryAfterSeconds: number }

/** Takes one point for `key`: null when it was free, else the seconds until the next one is. */
export async function take(limiter: RateLimiterMemory, key: string): Promise<number | null> {
  try {
    await limiter.consume(key, 1)
    return null
  } catch (res) {
    if (res instanceof RateLimiterRes) return Math.max(1, Math.ceil(res.msBeforeNext / 1000))
    throw res
  }
}

/**
 * Counts one sign-in attempt for this e-mail and this address. `ok: false` means refuse with 429 now;
 * `ok: true` gives `release()`, to call when the password turned out right (the attempt was no failure).
 */
export async function countSignInAttempt(email: string, address: string): Promise<Attempt> {
  const [a, b] = await Promise.all([take(byEmail, email), take(byAddress, address || 'unknown')])
  if (a !== null || b !== null) return { ok: false, retryAfterSeconds: Math.max(a ?? 0, b ?? 0) }
  return {
    ok: true,
    release: async () => {
      await Promise.all([byEmail.reward(email, 1), byAddress.reward(address || 'unknown', 1)])
    },
  }
}

/**
 * Counts an attempt with a password (a sign-in, or the current password a password change asks for): 429 with
 * the wait once this e-mail or address is over the limit. Returns `release`, to call when the password was right.
 */
export async function passwordAttempt(email: string, address: string): Promise<() => Promise<void>> {
  const attempt = await countSignInAttempt(email, address)
  if (attempt.ok) return attempt.release
  const seconds = attempt.retryAfterSeconds
  throw new DomainError('too_many', retryMessage(seconds), { retryAfterSeconds: seconds, details: { retryAfterSeconds: seconds } })
}

/** After a password reset the owner of the address has proved themselves: let them sign in at once. */
export async function forgetSignInFailures(email: string): Promise<void> {
  await byEmail.delete(email)
}

/** Whether to act on a forgotten-password request (the answer to the caller is the same either way). */
export async function mayRequestReset(email: string, address: string): Promise<boolean> {
  const [a, b] = await Promise.all([take(resetByEmail, email), take(resetByAddress, address || 'unknown')])
  return a === null && b === null
}

export function retryMessage(seconds: number): string {
  const minutes = Math.ceil(seconds / 60)
  return `Too many sign-in attempts. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}.`
}
