/**
 * Throttling of the owner's link routes (rate-limiter-flexible, atomic counters in this process), keyed on
 * the socket's address (never X-Forwarded-For, which anyone can send):
 *  - every request to /api/quote-links/*: 60 a minute per address (a phone reloading is far below that);
 *  - links that turn out not valid: 10 per 15 minutes per address; past that, every link request from that
 *    address is refused until the window ends, so tokens cannot be guessed even slowly from one address.
 * Guessing is hopeless anyway (256-bit tokens); this keeps the cost of trying, and the noise, down.
 */
import { Limiter } from './limiter'
import { take } from './throttle'

export const LINK_LIMITS = {
  requests: { points: 60, durationSeconds: 60 },
  misses: { points: 10, durationSeconds: 15 * 60 },
}

const requests = new Limiter({ keyPrefix: 'quote-link', points: LINK_LIMITS.requests.points, duration: LINK_LIMITS.requests.durationSeconds })
const misses = new Limiter({ keyPrefix: 'quote-link-miss', points: LINK_LIMITS.misses.points, duration: LINK_LIMITS.misses.durationSeconds })

/** null when the request may go ahead, else the seconds to wait. */
export async function admitLinkRequest(address: string): Promise<number | null> {
  const key = address || 'unknown'
  const missed = await misses.get(key)
  if (missed && missed.consumedPoints >= LINK_LIMITS.misses.points) return Math.max(1, Math.ceil(missed.msBeforeNext / 1000))
  return take(requests, key)
}

/** Counts a link that was not valid. */
export async function countLinkMiss(address: string): Promise<void> {
  await take(misses, address || 'unknown')
}
