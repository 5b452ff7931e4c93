/**
 * npx tsx bench/dashboards.ts --database <path> [--runs 7]
 *
 * Times the two dashboards over a year on a database with a year of synthetic trade (`npm run db:seed` then
 * `npm run orders:synthetic`; this script does both when the file does not exist yet, and applies pending
 * migrations), in process, against a bare SQL baseline: the same range's aggregates written directly (sales by
 * branch, top garages and parts, requested lines by fill state, margin against the active prices, balances; quotes
 * and line decisions of one garage), each query run once per timing. SQLite only (the synthetic trade is written
 * with sqlite3).
 *
 * Reported, in ms: once, bringing every garage's open items up to date after the migration that adds them; then for
 * each dashboard and baseline the first run in this process ("first") and the median of the runs after it
 * ("median"). The distributor's dashboard is timed as it is asked on a trading day: with no day kept yet (every day
 * summed from the order lines: the first look after the migration, a price file or a time-zone change); after an
 * order is placed today (today summed again, the other days kept); after a line of an order of three months ago
 * changes (that day summed again); in a new process (the kept days read from the table, nothing summed); and answered
 * from the kept answer (nothing written meanwhile). Beside them, one run of the background job that keeps the days
 * summed when nothing was written since its last run.
 * The load average (1, 5, 15 min) is printed before and after: the machine is shared.
 */
import { existsSync } from 'node:fs'
import { loadavg } from 'node:os'
import { execFileSync } from 'node:child_process'
import { resolve } from 'node:path'

const arg = (name: string, fallback: string) => {
  const i = process.argv.indexOf(name)
  return i >= 0 ? process.argv[i + 1] ?? fallback : fallback
}
const database = resolve(arg('--database', '/tmp/boreline-bench/dashboards.sqlite'))
const runs = Number(arg('--runs', '7'))
const root = resolve(import.meta.dirname, '..')
process.env.DATABASE_URL = `sqlite:${database}`
if (!existsSync(database)) {
  const env = { ...process.env, NUXT_MFA_KEY: process.env.NUXT_MFA_KEY || 'bench-second-factor-key-0123456789-abcdefghij' }
  execFileSync('npx', ['tsx', 'scripts/db-seed.ts'], { cwd: root, env, stdio: 'inherit' })
  execFileSync('npx', ['tsx', 'scripts/orders-synthetic.ts', '--database', database], { cwd: root, env, stdio: 'inherit' })
}

const { getDb, closeDb } = await import('../server/utils/db')
const { migrateUp } = await import('../server/utils/migrate')
const { initModels } = await import('../server/models/index')
const { spanOf, rows } = await import('../server/services/dashboards/range')
const { distributorDashboard, freshDistributorDashboard, SOLD_STATUSES } = await import('../server/services/dashboards/distributor')
const { forgetAnswers } = await import('../server/services/dashboards/answer-cache')
const { refreshOpenItems } = await import('../server/services/dashboards/open-items')
const { forgetParsedDays, keepRecentDays } = await import('../server/services/dashboards/day-figures')
const { withWrite } = await import('../server/utils/db')
const { garageDashboard } = await import('../server/services/dashboards/garage')
const { formatsFor } = await import('../shared/utils/format')

const load = () => loadavg().map((l) => l.toFixed(2)).join(', ')
console.log(`load average before: ${load()}`)
await migrateUp(getDb())
initModels(getDb())
const fmt = formatsFor({ currency: 'GBP', locale: 'en-GB', timeZone: 'Europe/London' })
const clock = { now: new Date(), timeZone: fmt.timeZone }
const span = spanOf({}, clock)
const year = spanOf({ from: new Date(Date.now() - 364 * 86_400_000).toISOString().slice(0, 10), to: span.to }, clock)
const [garage] = await rows<{ id: number }>("SELECT id FROM organisations WHERE name LIKE 'Synthetic Garage %' ORDER BY id LIMIT 1", {})
const [lineCount] = await rows<{ n: number }>('SELECT COUNT(*) AS n FROM order_lines', {})

const p = { start: year.start, end: year.end, sold: SOLD_STATUSES }
const JOIN = 'FROM order_lines l JOIN orders o ON o.id = l.order_id WHERE o.created_at >= :start AND o.created_at < :end AND o.status IN (:sold) AND l.state <> \'cancelled\''
const baselineDistributor = () => Promise.all([
  rows(`SELECT o.branch_id, COUNT(DISTINCT o.id) AS orders, SUM(l.line_net_minor) AS net ${JOIN} GROUP BY o.branch_id`, p),
  rows(`SELECT o.organisation_id, SUM(l.line_net_minor) AS net ${JOIN} GROUP BY o.organisation_id ORDER BY net DESC LIMIT 10`, p),
  rows(`SELECT l.sku, SUM(l.quantity) AS units, SUM(l.line_net_minor) AS net ${JOIN} GROUP BY l.sku ORDER BY net DESC LIMIT 10`, p),
  rows(`SELECT l.order_id, l.line_group, MIN(CASE WHEN l.source = 'home' AND l.split_from_line_id IS NULL THEN 1 ELSE 0 END) AS filled ${JOIN} AND l.state = 'dispatched' GROUP BY l.order_id, l.line_group`, p),
  rows(`SELECT SUM(l.line_net_minor) AS net, SUM(pp.trade_cost_minor * l.quantity) AS cost ${JOIN.replace('WHERE', "JOIN part_prices pp ON pp.part_id = l.part_id JOIN price_versions v ON v.id = pp.price_version_id AND v.status = 'active' WHERE")}`, p),
  rows('SELECT organisation_id, SUM(amount_minor) AS owed FROM ledger_entries GROUP BY organisation_id', {}),
])
const baselineGarage = () => Promise.all([
  rows('SELECT status, COUNT(*) AS n FROM quotes WHERE organisation_id = :org AND sent_at >= :start AND sent_at < :end GROUP BY status', { org: garage!.id, ...p }),
  rows(`SELECT ql.recommendation, ql.owner_decision, ql.part_type, COUNT(*) AS n FROM quote_lines ql JOIN quotes q ON q.id = ql.quote_id
    WHERE q.organisation_id = :org AND q.sent_at >= :start AND q.sent_at < :end GROUP BY ql.recommendation, ql.owner_decision, ql.part_type`, { org: garage!.id, ...p }),
  rows('SELECT created_at, total_minor FROM orders WHERE organisation_id = :org AND created_at >= :start AND created_at < :end AND status IN (:sold)', { org: garage!.id, ...p }),
])

const ms = (t: number) => `${t.toFixed(t < 10 ? 1 : 0)} ms`
async function timed(fn: () => Promise<unknown>): Promise<number> {
  const t = performance.now()
  await fn()
  return performance.now() - t
}
/** The first run, then the median of `runs` more. */
async function firstAndMedian(fn: () => Promise<unknown>, before: () => unknown = () => {}): Promise<[number, number]> {
  await before()
  const first = await timed(fn)
  const times: number[] = []
  for (let i = 0; i < runs; i++) { await before(); times.push(await timed(fn)) }
  return [first, times.sort((a, b) => a - b)[Math.floor(times.length / 2)]!]
}

/** A write as the counter makes one: an order placed now with three lines, or a line of an older order changed. */
const [sample] = await rows<{ organisation_id: number; branch_id: number; user_id: number }>(
  "SELECT organisation_id, branch_id, placed_by_user_id AS user_id FROM orders WHERE status = 'confirmed' OR status = 'delivered' ORDER BY id LIMIT 1", {})
const [lineOfOld] = await rows<{ id: number }>(`SELECT l.id FROM order_lines l JOIN orders o ON o.id = l.order_id
  WHERE o.created_at < :at ORDER BY o.created_at DESC LIMIT 1`, { at: new Date(Date.now() - 90 * 86_400_000) })
const placeOrder = () => withWrite(async (t) => {
  const now = new Date()
  await getDb().query(`INSERT INTO orders (organisation_id, branch_id, placed_by_user_id, status, payment_method, payment_state,
    subtotal_minor, tax_rate_bp, tax_minor, total_minor, currency, created_at, updated_at)
    VALUES (:org, :branch, :user, 'confirmed', 'account', 'on_account', 9000, 2000, 1800, 10800, 'GBP', :now, :now)`,
  { replacements: { org: sample!.organisation_id, branch: sample!.branch_id, user: sample!.user_id, now }, transaction: t })
  const [[{ id }]] = await getDb().query('SELECT MAX(id) AS id FROM orders', { transaction: t }) as unknown as [[{ id: number }]]
  for (const [k, sku] of ['KD-1028', 'KD-1029', 'KD-1030'].entries()) {
    await getDb().query(`INSERT INTO order_lines (order_id, part_id, sku, description, quantity, unit_list_minor, unit_net_minor, line_net_minor, position, line_group)
      SELECT :id, id, sku, 'Bench line', 1, 3000, 3000, 3000, :k, :k FROM parts WHERE sku = :sku`, { replacements: { id, sku, k }, transaction: t })
  }
})
const changeOldLine = () => withWrite((t) => getDb().query('UPDATE order_lines SET position = position WHERE id = :id', { replacements: { id: lineOfOld!.id }, transaction: t }))
const forgetDays = () => withWrite((t) => getDb().query('DELETE FROM trade_day_figures', { transaction: t }))

let caughtUp = 0
const catchUp = await timed(async () => { caughtUp = await refreshOpenItems(clock.timeZone) })
console.log(`${Number(lineCount!.n)} order lines; open items brought up to date for ${caughtUp} garages in ${ms(catchUp)} (once, after the migration)`)
const results: [string, [number, number]][] = [
  ['distributor dashboard, a year, no day kept (every day summed)', await firstAndMedian(() => freshDistributorDashboard(year, clock, fmt), async () => { forgetAnswers(); forgetParsedDays(); await forgetDays() })],
  ['distributor dashboard, a year, after an order placed today', await firstAndMedian(() => distributorDashboard(year, clock, fmt), placeOrder)],
  ['distributor dashboard, a year, after a line of 90 days ago changed', await firstAndMedian(() => distributorDashboard(year, clock, fmt), changeOldLine)],
  ['distributor dashboard, a year, kept days read by a new process', await firstAndMedian(() => distributorDashboard(year, clock, fmt), () => { forgetAnswers(); forgetParsedDays() })],
  ['distributor dashboard, a year, kept answer', await firstAndMedian(() => distributorDashboard(year, clock, fmt))],
  ['the dashboard-days job, nothing written since its last run', await firstAndMedian(() => keepRecentDays(clock.now, clock.timeZone))],
  ['distributor bare SQL, a year', await firstAndMedian(baselineDistributor)],
  ['garage dashboard, a year', await firstAndMedian(() => garageDashboard(garage!.id, year, fmt))],
  ['garage bare SQL, a year', await firstAndMedian(baselineGarage)],
]
for (const [what, [first, median]] of results) console.log(`${what}: first ${ms(first)}; median of ${runs} after it ${ms(median)}`)
console.log(`load average after: ${load()}`)
await closeDb()
