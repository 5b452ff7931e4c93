/**
 * When overdue reminders go and which month a statement covers. Thresholds default to 7 and 21 days past due
 * (common practice for trade-account dunning: a first reminder after a week, a firmer one after three).
 */
import { describe, expect, it } from 'vitest'
import { overdueReminderDays, reachedThreshold } from '../../../server/services/account-reminders/settings'
import { monthBefore } from '../../../server/services/account-reminders/run'

describe('overdue reminder days', () => {
  it('defaults to 7 and 21, reads a list, and falls back on nonsense', () => {
    expect(overdueReminderDays(undefined)).toEqual([7, 21])
    expect(overdueReminderDays('30, 10,10')).toEqual([10, 30])
    expect(overdueReminderDays('7,x')).toEqual([7, 21])
    expect(overdueReminderDays('0')).toEqual([7, 21])
  })

  it.each([[6, null], [7, 7], [20, 7], [21, 21], [90, 21]])('an item %i days overdue has reached %s', (days, reached) => {
    expect(reachedThreshold(days, [7, 21])).toBe(reached)
  })
})

describe('the statement month', () => {
  it('is the month before, across a year end', () => {
    expect(monthBefore('2026-12-01')).toBe('2026-11')
    expect(monthBefore('2027-01-15')).toBe('2026-12')
  })
})
