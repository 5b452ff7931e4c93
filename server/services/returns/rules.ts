/**
 * When a sent part may come back and on what terms, from the dispatch date and the configured periods
 * (counter-settings.ts): wrong or unneeded parts within the return period, faulty ones within the warranty period;
 * an unneeded part sent back later than the restocking threshold is credited less the restocking charge. Pure.
 */
import type { ReturnReason } from '../../../shared/types/returns'
import type { CounterSettings } from '../orders/counter-settings'
import { daysBetween } from '../orders/zoned-time'

export interface ReturnTerms {
  /** days since the part was sent, counted in local calendar days */
  days: number
  allowed: boolean
  /** the last day, counted from the dispatch */
  limitDays: number
  restockingBp: number
}

export function returnTerms(reason: ReturnReason, sentAt: Date, now: Date, s: CounterSettings, timeZone: string): ReturnTerms {
  const days = daysBetween(sentAt, now, timeZone)
  const limitDays = reason === 'faulty' ? s.warrantyDays : s.returnDays
  return {
    days, limitDays, allowed: days <= limitDays,
    restockingBp: reason === 'not_needed' && days > s.restockingAfterDays ? s.restockingBp : 0,
  }
}
