/**
 * The scenario of the day-figures tests (day-figures.test.ts on SQLite, day-figures-pg.test.ts on PostgreSQL): the
 * distributor's sold figures summed per local day and kept (`trade_day_figures`) follow every write to the orders and
 * lines of a day already kept, whoever writes, and a day is summed again only when it was written. Written straight
 * in the database, as another process or a script would. Expected figures are worked by hand in the comments: local
 * days in Europe/London, which is on summer time (UTC+1) from 30 March to 26 October 2031 (gov.uk "When do the
 * clocks change?"), so 23:30 UTC on 14 June 2031 is 00:30 on 15 June there.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'

/** Runs the scenario on the database DATABASE_URL names (set before this is called); `cleanUp` runs after it. */
export async function dayFiguresScenario(cleanUp: () => Promise<void>): Promise<void> {
  const { getDb, closeDb, withWrite } = await import('../../../server/utils/db')
  const { migrateUp } = await import('../../../server/utils/migrate')
  const { initModels } = await import('../../../server/models/index')
  const { rangeFigures, forgetParsedDays, hourOf, keepRecentDays, priceActivations } = await import('../../../server/services/dashboards/day-figures')
  const { spanOf } = await import('../../../server/services/dashboards/range')

  const clock = { now: new Date('2031-06-20T12:00:00Z'), timeZone: 'Europe/London' }
  const span = spanOf({ from: '2031-06-13', to: '2031-06-16' }, clock)
  const versions = [{ id: 0, at: new Date('2031-01-01T00:00:00Z') }]
  const ids = { org: 0, branch: 0, user: 0, partA: 0, partB: 0, first: 0 }
  const exec = (sql: string, replacements: Record<string, unknown> = {}) => withWrite((t) => getDb().query(sql, { replacements, transaction: t }))
  const one = async (sql: string, replacements: Record<string, unknown> = {}) =>
    Number(((await getDb().query(sql, { replacements, plain: true })) as Record<string, unknown>).id)
  const at = (iso: string) => new Date(iso)

  /** An order confirmed at `when` with lines [part, quantity, net, state]. */
  async function order(when: string, lines: [number, number, number, string][]): Promise<number> {
    await exec(`INSERT INTO orders (organisation_id, branch_id, placed_by_user_id, status, payment_method, payment_state, subtotal_minor,
      tax_rate_bp, tax_minor, total_minor, currency, created_at, updated_at)
      VALUES (:org, :branch, :user, 'confirmed', 'account', 'on_account', 0, 2000, 0, 0, 'GBP', :at, :at)`, { ...ids, at: at(when) })
    const id = await one('SELECT MAX(id) AS id FROM orders')
    for (const [k, [part, quantity, net, state]] of lines.entries()) {
      await exec(`INSERT INTO order_lines (order_id, part_id, sku, description, quantity, unit_list_minor, unit_net_minor, line_net_minor, position, line_group, state)
        SELECT :id, id, sku, description, :quantity, :unit, :unit, :net, :k, :k, :state FROM parts WHERE id = :part`,
      { id, part, quantity, unit: Math.round(net / quantity), net, k, state })
    }
    return id
  }

  beforeAll(async () => {
    await migrateUp(getDb())
    initModels(getDb())
    const now = new Date()
    await exec(`INSERT INTO organisations (kind, name, status, payment_terms, payment_days, credit_limit_minor, created_at, updated_at)
      VALUES ('garage', 'Day Figures Garage', 'approved', 'account', 30, 100000, :now, :now)`, { now })
    ids.org = await one("SELECT id FROM organisations WHERE name = 'Day Figures Garage'")
    await exec("INSERT INTO branches (code, name, created_at, updated_at) VALUES ('DFG', 'Day Figures Branch', :now, :now)", { now })
    ids.branch = await one("SELECT id FROM branches WHERE code = 'DFG'")
    await exec(`INSERT INTO users (organisation_id, email, name, role, created_at, updated_at)
      VALUES (:org, 'day.figures@example.test', 'Day Figures', 'garage_manager', :now, :now)`, { ...ids, now })
    ids.user = await one("SELECT id FROM users WHERE email = 'day.figures@example.test'")
    for (const sku of ['DF-A', 'DF-B']) {
      await exec(`INSERT INTO parts (sku, type, description, created_at, updated_at) VALUES (:sku, 'pad_set', :d, :now, :now)`, { sku, d: `Pad set ${sku}`, now })
    }
    ids.partA = await one("SELECT id FROM parts WHERE sku = 'DF-A'")
    ids.partB = await one("SELECT id FROM parts WHERE sku = 'DF-B'")
    await exec(`INSERT INTO price_versions (version, status, activated_at, created_at, updated_at) VALUES (901, 'active', :at, :now, :now)`, { at: versions[0]!.at, now })
    versions[0]!.id = await one('SELECT id FROM price_versions WHERE version = 901')
    // 13 June 10:00 BST: A x2 = 60.00 dispatched, B x1 = 15.00 dispatched
    ids.first = await order('2031-06-13T09:00:00Z', [[ids.partA, 2, 6_000, 'dispatched'], [ids.partB, 1, 1_500, 'dispatched']])
    // 14 June 23:30 UTC = 15 June 00:30 BST: B x4 = 60.00, waiting
    await order('2031-06-14T23:30:00Z', [[ids.partB, 4, 6_000, 'waiting']])
  }, 120_000) // every migration on a fresh database, slow on a busy PostgreSQL server
  afterAll(async () => { await closeDb(); await cleanUp() }, 60_000)

  describe('sold figures kept per local day', () => {
    it('sum each order on its local day, and keep the days', async () => {
      const f = await rangeFigures(span, versions)
      // 13 June: 60.00 + 15.00 in one order; 14 June: nothing (23:30 UTC is the 15th in London); 15 June: 60.00
      expect(f.byDay).toEqual([{ net: 7_500, orders: 1 }, { net: 0, orders: 0 }, { net: 6_000, orders: 1 }, { net: 0, orders: 0 }])
      expect(f.summed).toBe(4)
      // A: 2 units, 60.00; B: 1 + 4 = 5 units, 15.00 + 60.00 = 75.00
      expect([...f.bySku.values()].map((s) => [s.sku, s.units, s.net]).sort()).toEqual([['DF-A', 2, 6_000], ['DF-B', 5, 7_500]])
      // both lines of the first order sent complete from the home shelf; the 15th's line still waits: not counted
      const g = [...f.byGarageBranch.values()]
      expect(g.map((x) => [x.orders, x.net, x.counted, x.filled])).toEqual([[2, 13_500, 2, 2]])
      // no price row was set by version 1 for either part: every line is without a cost
      expect(f.margin).toEqual({ netMinor: 0, costMinor: 0, linesWithoutCost: 3 })
      expect((await rangeFigures(span, versions)).summed).toBe(0)
      forgetParsedDays() // as a new process: read from the table, nothing summed
      const again = await rangeFigures(span, versions)
      expect([again.summed, again.byDay]).toEqual([0, f.byDay])
    })

    it('sum again only the day a write touched, whoever wrote it', async () => {
      // the 13th's B line cancelled: that day 60.00 left; its requested line never sent, so no longer counted
      await exec("UPDATE order_lines SET state = 'cancelled' WHERE order_id = :id AND part_id = :part", { id: ids.first, part: ids.partB })
      const f = await rangeFigures(span, versions)
      expect(f.summed).toBe(1)
      expect(f.byDay.map((d) => d.net)).toEqual([6_000, 0, 6_000, 0])
      expect([...f.byGarageBranch.values()].map((x) => [x.net, x.counted, x.filled])).toEqual([[12_000, 1, 1]])
    })

    it('move an order to another day with both days summed again', async () => {
      // the 15th's order moved to 16 June 08:00 BST (07:00 UTC): the 15th and the 16th change
      await exec("UPDATE orders SET created_at = :at WHERE id <> :id AND organisation_id = :org", { at: at('2031-06-16T07:00:00Z'), id: ids.first, org: ids.org })
      const f = await rangeFigures(span, versions)
      expect(f.summed).toBe(2)
      expect(f.byDay.map((d) => d.net)).toEqual([6_000, 0, 0, 6_000])
    })

    it('sum every day again when the prices the margin reads change', async () => {
      // A's price row set by version 1 with a trade cost of 20.00: the 13th's A line (2 units, 60.00) is costed at 40.00
      await exec('INSERT INTO part_prices (part_id, list_price_minor, trade_cost_minor, price_version_id) VALUES (:part, 3500, 2000, :version)',
        { part: ids.partA, version: versions[0]!.id })
      const f = await rangeFigures(span, versions)
      expect(f.summed).toBe(4)
      // costed: 60.00 net, 2 x 20.00 = 40.00 cost; without a cost: the 16th's B line
      expect(f.margin).toEqual({ netMinor: 6_000, costMinor: 4_000, linesWithoutCost: 1 })
    })

    it('keep a whole month as one, made again from its days when one of them is written', async () => {
      // 1 June to 2 July: June whole (kept as a month), 1-2 July as days; June holds the 13th (60.00) and the 16th (60.00)
      const long = spanOf({ from: '2031-06-01', to: '2031-07-02' }, clock)
      const first = await rangeFigures(long, versions)
      expect(first.byDay).toHaveLength(32)
      expect(first.byDay[12]).toEqual({ net: 6_000, orders: 1 })
      expect(first.byDay.reduce((s, d) => s + d.net, 0)).toBe(12_000)
      forgetParsedDays()
      const read = await rangeFigures(long, versions) // a new process: the month and the two days read, nothing summed
      expect([read.summed, read.byDay]).toEqual([0, first.byDay])
      // A's line of the 13th back to one unit, 30.00: June is made again from its days, only the 13th summed
      await exec('UPDATE order_lines SET quantity = 1, line_net_minor = 3000 WHERE order_id = :id AND part_id = :part', { id: ids.first, part: ids.partA })
      const after = await rangeFigures(long, versions)
      expect(after.summed).toBe(1)
      expect(after.byDay[12]).toEqual({ net: 3_000, orders: 1 })
      expect([...after.bySku.values()].map((x) => [x.sku, x.units, x.net]).sort()).toEqual([['DF-A', 1, 3_000], ['DF-B', 4, 6_000]])
    })

    it('keep the recent days in the background, summing only what was written since', async () => {
      // the versions as the job reads them from the database: the one activated 1 January 2031 00:00 UTC, read back
      // to the same instant (a shifted time would change the context and sum every day again)
      expect((await priceActivations()).map((v) => [v.id, v.at.toISOString()])).toEqual([[versions[0]!.id, '2031-01-01T00:00:00.000Z']])
      // 10 days to 20 June: 11 to 20 June, every one kept above (June was made from its days) at this context
      expect(await keepRecentDays(clock.now, clock.timeZone, 10)).toBe(0)
      // an order on 19 June 09:00 BST (08:00 UTC): that day only
      await order('2031-06-19T08:00:00Z', [[ids.partA, 1, 3_000, 'waiting']])
      expect(await keepRecentDays(clock.now, clock.timeZone, 10)).toBe(1)
      expect(await keepRecentDays(clock.now, clock.timeZone, 10)).toBe(0)
      forgetParsedDays() // the dashboard in a new process then finds 19 June kept: 30.00, one order
      const f = await rangeFigures(spanOf({ from: '2031-06-11', to: '2031-06-20' }, clock), versions)
      expect([f.summed, f.byDay[8]]).toEqual([0, { net: 3_000, orders: 1 }])
    })

    it('names the UTC hour as the triggers do', async () => {
      expect(hourOf(Date.parse('2031-06-14T23:30:00Z'))).toBe('2031-06-14 23')
      const marks = await getDb().query('SELECT hour FROM trade_day_marks ORDER BY hour', { raw: true, plain: false }) as unknown as [{ hour: string }[]]
      // every hour written above: 13 June 09, 14 June 23 (the order before it moved), 16 June 07, 19 June 08
      expect(marks[0].map((m) => m.hour)).toEqual(['2031-06-13 09', '2031-06-14 23', '2031-06-16 07', '2031-06-19 08'])
    })
  })
}
