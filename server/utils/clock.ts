/**
 * "Now" for a request: the system clock, or, only when the server runs with BORELINE_TEST_HOOKS=1 (the e2e
 * setup), the instant in the `x-boreline-test-now` header, so tests can stand a minute either side of a cut-off
 * without waiting for it. Delivery promises, picking (a transfer due later), return periods and documents' dates
 * all read it. With the configured time zone, it is the clock order services take.
 */
import type { H3Event } from 'h3'
import { getRequestHeader } from 'h3'
import type { ViewClock } from '../services/orders/clock'
import { serverFormats } from './format'

export function requestNow(event: H3Event): Date {
  if (process.env.BORELINE_TEST_HOOKS === '1') {
    const moved = getRequestHeader(event, 'x-boreline-test-now')
    const at = moved ? new Date(moved) : null
    if (at && !Number.isNaN(at.getTime())) return at
  }
  return new Date()
}

export function requestClock(event: H3Event): ViewClock {
  return { now: requestNow(event), timeZone: serverFormats().timeZone }
}
