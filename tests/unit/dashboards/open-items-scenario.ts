/**
 * The scenario of the open-items tests (open-items.test.ts on SQLite, open-items-pg.test.ts on PostgreSQL): the open
 * items kept as the ledger is written (`open_items`, refreshed for the garages written since) give the same ageing as
 * the garage's statement, which works it out from the whole ledger, over a scenario with partial payments
 * and an allocation, and follow a later payment. Expected figures are worked by hand below from the rule in
 * ageing.ts (allocations first, then the rest of the credit oldest charge first; due 30 days after booking for a
 * charge without an invoice; buckets by whole days past due). Calendar days: 2031 is not a leap year (February 28).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'

/** Runs the scenario on the database DATABASE_URL names (set before this is called); `cleanUp` runs after it. */
export async function openItemsScenario(cleanUp: () => Promise<void>): Promise<void> {
  const { getDb, closeDb, withWrite } = await import('../../../server/utils/db')
  const { migrateUp } = await import('../../../server/utils/migrate')
  const { initModels, Organisation, LedgerEntry, PaymentAllocation } = await import('../../../server/models/index')
  const { keptAgeingOf, overdueOfAll, refreshOpenItems } = await import('../../../server/services/dashboards/open-items')
  const { statementOf } = await import('../../../server/services/statement')
  const { formatsFor } = await import('../../../shared/utils/format')

  const fmt = formatsFor({ currency: 'GBP', locale: 'en-GB', timeZone: 'Europe/London' })
  const clock = { now: new Date('2031-06-30T12:00:00Z'), timeZone: 'Europe/London' }
  let garage = 0

  const book = (kind: 'order' | 'account_payment', amountMinor: number, day: string) => withWrite(async (t) => (await LedgerEntry.create({
    organisationId: garage, orderId: null, kind, amountMinor, reference: `OI-${day}`, description: '', createdAt: new Date(`${day}T11:00:00Z`),
  }, { transaction: t })).id)

  beforeAll(async () => {
    await migrateUp(getDb())
    initModels(getDb())
    garage = await withWrite(async (t) => (await Organisation.create({
      kind: 'garage', name: 'Open Items Garage', status: 'approved', paymentTerms: 'account', paymentDays: 30, creditLimitMinor: 1_000_000,
    }, { transaction: t })).id)
    await book('order', 10_000, '2031-02-01') // C1
    const c2 = await book('order', 6_000, '2031-03-15') // C2
    await book('order', 4_000, '2031-05-20') // C3
    const p1 = await book('account_payment', -7_000, '2031-04-10') // P1, 50.00 of it allocated to C2
    await book('account_payment', -3_000, '2031-06-01') // P2
    await withWrite((t) => PaymentAllocation.create({ organisationId: garage, paymentEntryId: p1, chargeEntryId: c2, amountMinor: 5_000, createdAt: new Date() }, { transaction: t }))
  }, 120_000) // every migration on a fresh database, slow on a busy PostgreSQL server
  afterAll(async () => { await closeDb(); await cleanUp() }, 60_000) // dropping a PostgreSQL database waits for its connections

  describe('open items kept as the ledger is written', () => {
    it('age the same as the statement, and as worked by hand', async () => {
      const statement = await statementOf(garage, undefined, fmt, clock)
      const kept = await keptAgeingOf(garage, clock)
      // P1's 50.00 pays C2 (allocation); the 20.00 left of P1 and P2's 30.00 (50.00 pooled) pay C1 first:
      // C1 open 100.00 - 50.00 = 50.00, due 1 Feb + 30 = 3 Mar, 28 + 30 + 31 + 30 = 119 days past on 30 Jun: over 90
      // C2 open 60.00 - 50.00 = 10.00, due 15 Mar + 30 = 14 Apr, 16 + 31 + 30 = 77 days past: 61-90
      // C3 open 40.00, due 20 May + 30 = 19 Jun, 11 days past: 1-30
      const hand = { current: 0, d1_30: 4_000, d31_60: 0, d61_90: 1_000, over90: 5_000 }
      expect(statement.ageing).toEqual(hand)
      expect(kept).toEqual(statement.ageing)
      expect(await overdueOfAll(clock)).toEqual({ ...hand, garages: 1 })
    })

    it('follow a payment booked later: only that garage is worked out again', async () => {
      expect(await refreshOpenItems(clock.timeZone)).toBe(0) // nothing written since
      await book('account_payment', -1_000, '2031-06-20') // pooled: C1 open 50.00 - 10.00 = 40.00
      expect(await refreshOpenItems(clock.timeZone)).toBe(1)
      const kept = await keptAgeingOf(garage, clock)
      expect(kept).toEqual({ current: 0, d1_30: 4_000, d31_60: 0, d61_90: 1_000, over90: 4_000 })
      expect(kept).toEqual((await statementOf(garage, undefined, fmt, clock)).ageing)
    })

    it('follow an allocation removed: the pooled credit then pays oldest first', async () => {
      await withWrite((t) => PaymentAllocation.destroy({ where: { organisationId: garage }, transaction: t }))
      // 110.00 of payments pooled: C1 100.00 paid in full, C2 10.00 of 60.00: C2 50.00 open (61-90), C3 40.00 (1-30)
      const kept = await keptAgeingOf(garage, clock)
      expect(kept).toEqual({ current: 0, d1_30: 4_000, d31_60: 0, d61_90: 5_000, over90: 0 })
      expect(kept).toEqual((await statementOf(garage, undefined, fmt, clock)).ageing)
    })
  })
}
