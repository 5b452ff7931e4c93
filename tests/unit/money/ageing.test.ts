/**
 * Open items and ageing by hand-worked calendar days. Due dates count calendar days after the day a charge was
 * booked (the garage's payment days, common practice for "net 30" trade terms); each day below was worked by
 * hand and checked with GNU `date -u -d '2026-01-31 +30 days'` (an outside calendar). 2026 is not a leap year:
 * 31 January + 30 days = 2 March (1 day left in January, 28 in February, 1 in March).
 */
import { describe, expect, it } from 'vitest'
import { ageingOf, bucketOf, dayPlus, openItemsOf, type LedgerMove } from '../../../server/services/ageing'

const charge = (id: number, day: string, amountMinor: number): LedgerMove => ({ id, day, reference: `R${id}`, description: '', amountMinor })

describe('due dates', () => {
  it('counts calendar days across a short February', () => {
    expect(dayPlus('2026-01-31', 30)).toBe('2026-03-02')
    expect(dayPlus('2026-12-15', 30)).toBe('2027-01-14') // 16 days left in December + 14 in January
  })
})

describe('ageing buckets at their boundaries', () => {
  // due 2026-03-02; 30 days later is 2026-04-01, 31 is 04-02, 60 is 05-01, 61 is 05-02, 90 is 05-31, 91 is 06-01
  it.each([
    ['2026-03-01', 0, 'current'], ['2026-03-02', 0, 'current'], ['2026-03-03', 1, 'd1_30'],
    ['2026-04-01', 30, 'd1_30'], ['2026-04-02', 31, 'd31_60'], ['2026-05-01', 60, 'd31_60'],
    ['2026-05-02', 61, 'd61_90'], ['2026-05-31', 90, 'd61_90'], ['2026-06-01', 91, 'over90'],
  ])('on %s an item due 2026-03-02 is %i days overdue (%s)', (today, days, bucket) => {
    const [item] = openItemsOf([charge(1, '2026-01-31', 1_000)], 30, today)
    expect(item).toMatchObject({ dueOn: '2026-03-02', daysOverdue: days, bucket })
    expect(bucketOf(days)).toBe(bucket)
  })
})

describe('allocation of payments, oldest first', () => {
  const moves = [
    charge(3, '2026-03-10', 5_000), // booked later, listed first: order is by day, not by position
    charge(1, '2026-01-31', 10_000),
    charge(2, '2026-02-20', 2_500),
    { ...charge(4, '2026-03-15', -12_000), reference: 'BACS 1' },
  ]
  it('settles the oldest charge in full and the next in part, leaving the newest untouched', () => {
    // 120.00 paid: 100.00 clears R1, the other 20.00 goes to R2 (25.00), leaving 5.00 of it and all of R3 open
    const items = openItemsOf(moves, 30, '2026-04-15')
    expect(items.map((i) => [i.reference, i.paidMinor, i.openMinor, i.dueOn, i.daysOverdue])).toEqual([
      ['R2', 2_000, 500, '2026-03-22', 24], // 20 Feb + 30 = 22 Mar (8 left in Feb + 22); 22 Mar to 15 Apr = 9 + 15 = 24
      ['R3', 0, 5_000, '2026-04-09', 6], // 10 Mar + 30 = 9 Apr (21 left in Mar + 9); 9 to 15 Apr = 6
    ])
    expect(ageingOf(items)).toEqual({ current: 0, d1_30: 5_500, d31_60: 0, d61_90: 0, over90: 0 })
  })

  it('leaves nothing open when credits cover every charge', () => {
    expect(openItemsOf([...moves, charge(5, '2026-03-16', -5_500)], 30, '2026-04-15')).toEqual([])
  })

  it('ages each item from its own due date', () => {
    const items = openItemsOf([charge(1, '2026-01-01', 100), charge(2, '2026-03-01', 200), charge(3, '2026-06-20', 400)], 30, '2026-07-01')
    // due 31 Jan (151 days to 1 Jul: 28+31+30+31+30+1), 31 Mar (92: 30+31+30+1), 20 Jul (not yet due)
    expect(items.map((i) => i.daysOverdue)).toEqual([151, 92, 0])
    expect(ageingOf(items)).toEqual({ current: 400, d1_30: 0, d31_60: 0, d61_90: 0, over90: 300 })
  })
})
