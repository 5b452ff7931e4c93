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
 * ("median"). The distributor's dashboard is timed twice: worked out afresh (its kept answer forgotten before each
 * run, so every figure is read from the database) and answered from the kept answer (nothing written meanwhile).
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
async function firstAndMedian(fn: () => Promise<unknown>, before: () => void = () => {}): Promise<[number, number]> {
  before()
  const first = await timed(fn)
  const times: number[] = []
  for (let i = 0; i < runs; i++) { before(); times.push(await timed(fn)) }
  return [first, times.sort((a, b) => a - b)[Math.floor(times.length / 2)]!]
}

let caughtUp = 0
const catchUp = await timed(async () => { caughtUp = await refreshOpenItems(clock.timeZone) })
console.log(`${Number(lineCount!.n)} order lines; open items brought up to date for ${caughtUp} garages in ${ms(catchUp)} (once, after the migration)`)
const results: [string, [number, number]][] = [
  ['distributor dashboard, a year, worked out afresh', await firstAndMedian(() => freshDistributorDashboard(year, clock, fmt), forgetAnswers)],
  ['distributor dashboard, a year, kept answer', await firstAndMedian(() => distributorDashboard(year, clock, fmt))],
  ['distributor bare SQL, a year', await firstAndMedian(baselineDistributor)],
  ['garage dashboard, a year', await firstAndMedian(() => garageDashboard(garage!.id, year, fmt))],
  ['garage bare SQL, a year', await firstAndMedian(baselineGarage)],
]
for (const [what, [first, median]] of results) console.log(`${what}: first ${ms(first)}; median of ${runs} after it ${ms(median)}`)
console.log(`load average after: ${load()}`)
await closeDb()
