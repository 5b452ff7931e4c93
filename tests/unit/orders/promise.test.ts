/**
 * Delivery promises and split supply, worked by hand from a schedule written here: runs at 08:30, 11:00, 14:30 and
 * 16:30 on weekdays with a 30-minute cut-off and 45 minutes' transit (common practice for a trade counter's vans),
 * counter 07:30-17:30, 15 minutes to the counter. Local times in Europe/London: GMT (UTC+0) in winter, BST
 * (UTC+1) from the last Sunday in March to the last Sunday in October (gov.uk "When the clocks change";
 * 2026: 29 March and 25 October). Calendar days checked against a printed 2026 calendar (9 December 2026 is a
 * Wednesday: from memory, and Date.UTC agrees).
 */
import { describe, expect, it } from 'vitest'
import { collectFrom, nextRun, promiseWords, supplierArrival, whenReady, type BranchTimes } from '../../../server/services/orders/promise'
import { planSupply, stockKey } from '../../../server/services/orders/supply-plan'
import { localInstant, localParts } from '../../../server/services/orders/zoned-time'

const TZ = 'Europe/London'
const hm = (h: number, m = 0) => h * 60 + m
const home: BranchTimes = {
  id: 1, code: 'HOM', name: 'Home', collection: true, counterOpensMinute: hm(7, 30), counterClosesMinute: hm(17, 30),
  collectionMinutes: 15, transferMinutes: 180,
  runs: [hm(8, 30), hm(11), hm(14, 30), hm(16, 30)].map((departsMinute) => ({ departsMinute, cutoffMinutes: 30, transitMinutes: 45, weekdays: '12345' })),
}
const away: BranchTimes = { ...home, id: 2, code: 'AWY', name: 'Away', transferMinutes: 240, runs: [] }
const far: BranchTimes = { ...home, id: 3, code: 'FAR', name: 'Far', transferMinutes: 600, runs: [] }

describe('local time', () => {
  it('reads the wall clock in GMT and BST', () => {
    expect(localParts(new Date('2026-12-09T13:59:00Z'), TZ)).toMatchObject({ year: 2026, month: 12, day: 9, minute: hm(13, 59), weekday: 3 })
    expect(localParts(new Date('2026-07-15T12:59:00Z'), TZ)).toMatchObject({ minute: hm(13, 59), weekday: 3 })
    expect(localInstant({ year: 2026, month: 7, day: 15 }, hm(14, 30), TZ).toISOString()).toBe('2026-07-15T13:30:00.000Z')
    // the morning the clocks go back (25 October 2026): 08:30 local is already GMT
    expect(localInstant({ year: 2026, month: 10, day: 25 }, hm(8, 30), TZ).toISOString()).toBe('2026-10-25T08:30:00.000Z')
  })
})

describe('the next run', () => {
  it('takes a part ready at or before the cut-off, and not a minute after', () => {
    const at = (iso: string) => nextRun(home, new Date(iso), TZ)
    // cut-off of the 14:30 run: 14:00
    expect(at('2026-12-09T14:00:00Z')).toMatchObject({ departsAt: new Date('2026-12-09T14:30:00Z'), arrivesAt: new Date('2026-12-09T15:15:00Z') })
    expect(at('2026-12-09T14:01:00Z')!.departsAt.toISOString()).toBe('2026-12-09T16:30:00.000Z')
    // Friday after the last cut-off: Monday's first run
    expect(at('2026-12-11T16:01:00Z')!.departsAt.toISOString()).toBe('2026-12-14T08:30:00.000Z')
    // a Saturday morning: Monday
    expect(at('2026-12-12T07:00:00Z')!.departsAt.toISOString()).toBe('2026-12-14T08:30:00.000Z')
    expect(nextRun(away, new Date('2026-12-09T10:00:00Z'), TZ)).toBeNull()
  })

  it('says it in words, relative to now', () => {
    const now = new Date('2026-12-09T13:59:00Z')
    expect(promiseWords(nextRun(home, now, TZ), now, TZ)).toBe('next run 14:30, about 15:15')
    const late = new Date('2026-12-09T16:01:00Z')
    expect(promiseWords(nextRun(home, late, TZ), late, TZ)).toBe("tomorrow's 08:30 run, about 09:15")
    const friday = new Date('2026-12-11T16:01:00Z')
    expect(promiseWords(nextRun(home, friday, TZ), friday, TZ)).toBe("Monday's 08:30 run, about 09:15")
  })
})

describe('collection', () => {
  it('is out on the counter 15 minutes after it is ready, within opening hours', () => {
    const now = new Date('2026-12-09T10:00:00Z')
    const when = collectFrom(home, now, TZ)!
    expect(when.arrivesAt.toISOString()).toBe('2026-12-09T10:15:00.000Z')
    expect(promiseWords(when, now, TZ)).toBe('collect from the counter now')
    // 17:20: 17:35 would be after closing, so 07:45 the next morning
    const evening = new Date('2026-12-09T17:20:00Z')
    expect(collectFrom(home, evening, TZ)!.arrivesAt.toISOString()).toBe('2026-12-10T07:45:00.000Z')
    expect(promiseWords(collectFrom(home, evening, TZ), evening, TZ)).toBe('collect from the counter tomorrow from 07:45')
    // a branch without vans still has its counter
    expect(whenReady(away, now, false, TZ)).toMatchObject({ kind: 'collect' })
  })
})

describe('the supplier', () => {
  it('delivers a back-order at opening, two working days on', () => {
    // Wednesday -> Friday 07:30; Thursday -> Monday 07:30 (the weekend does not count)
    expect(supplierArrival(home, new Date('2026-12-09T10:00:00Z'), 2, TZ).toISOString()).toBe('2026-12-11T07:30:00.000Z')
    expect(supplierArrival(home, new Date('2026-12-10T10:00:00Z'), 2, TZ).toISOString()).toBe('2026-12-14T07:30:00.000Z')
  })
})

describe('split supply', () => {
  const now = new Date('2026-12-09T10:00:00Z')
  const base = { home, others: [far, away], now, timeZone: TZ, collect: false, fulfilment: 'ship_available' as const, supplierLeadDays: 2 }

  it('fills from the shelf, then the quickest transfer, then the supplier', () => {
    const available = new Map([[stockKey(1, 7), 2], [stockKey(2, 7), 3], [stockKey(3, 7), 10]])
    const pieces = planSupply([{ group: 0, partId: 7, quantity: 9, fulfilment: undefined }], { ...base, available })
    // 2 here; Away (240 min) before Far (600 min): 3 from Away, 4 from Far; nothing left to back-order
    expect(pieces.map((p) => [p.source, p.quantity, p.branch?.code])).toEqual([['home', 2, 'HOM'], ['transfer', 3, 'AWY'], ['transfer', 4, 'FAR']])
    // here at 10:00: the 11:00 run (cut-off 10:30), 11:45. Away's transfer ready at 14:00: the 14:30 run (cut-off 14:00), 15:15.
    // Far's ready at 20:00: tomorrow's 08:30, 09:15
    expect(pieces.map((p) => p.arrivesAt!.toISOString())).toEqual(['2026-12-09T11:45:00.000Z', '2026-12-09T15:15:00.000Z', '2026-12-10T09:15:00.000Z'])
    expect(pieces[1]!.promise).toBe('by transfer from Away: next run 14:30, about 15:15')
  })

  it('back-orders what no branch has, and "wait for all" holds the line\'s shelf part back with it', () => {
    const available = new Map([[stockKey(1, 7), 1]])
    const wanted = [{ group: 0, partId: 7, quantity: 3, fulfilment: 'wait_for_all' as const }]
    const pieces = planSupply(wanted, { ...base, available })
    expect(pieces.map((p) => [p.source, p.quantity])).toEqual([['home', 1], ['back_order', 2]])
    // supplier: Friday 07:30, then the 08:30 run (cut-off 08:00), arriving 09:15; the shelf part waits for it
    expect(pieces.map((p) => p.arrivesAt!.toISOString())).toEqual(['2026-12-11T09:15:00.000Z', '2026-12-11T09:15:00.000Z'])
    expect(pieces[0]!.promise).toBe("sent with the rest: Friday's 08:30 run, about 09:15")
    expect(pieces[1]!.promise).toBe("back-ordered from the supplier: Friday's 08:30 run, about 09:15")
    const now2 = planSupply([{ ...wanted[0]!, fulfilment: 'ship_available' }], { ...base, available })
    expect(now2[0]!.arrivesAt!.toISOString()).toBe('2026-12-09T11:45:00.000Z')
  })

  it('never gives the same units twice', () => {
    const available = new Map([[stockKey(1, 7), 4]])
    const pieces = planSupply([{ group: 0, partId: 7, quantity: 3, fulfilment: undefined }, { group: 1, partId: 7, quantity: 3, fulfilment: undefined }], { ...base, available })
    expect(pieces.map((p) => [p.group, p.source, p.quantity])).toEqual([[0, 'home', 3], [1, 'home', 1], [1, 'back_order', 2]])
  })
})
