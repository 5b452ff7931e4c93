/**
 * npx tsx bench/dashboards.ts --database <path> [--runs 7]
 *
 * Times the two dashboards over a year on a database with a year of synthetic trade (`npm run db:seed` then
 * `npm run orders:synthetic`; this script does both when the file does not exist yet), in process, against a bare
 * SQL baseline: the same range's aggregates written directly (sales in total and by branch, top garages and parts,
 * requested lines by fill state, margin against the active prices, quotes and line decisions of one garage), each
 * query run once per timing. Reports the median of the runs in ms and the ratio dashboard / baseline.
 */
import { existsSync } from 'node:fs'
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
const { distributorDashboard, SOLD_STATUSES } = await import('../server/services/dashboards/distributor')
const { garageDashboard } = await import('../server/services/dashboards/garage')
const { formatsFor } = await import('../shared/utils/format')

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

async function median(fn: () => Promise<unknown>): Promise<number> {
  await fn()
  const times: number[] = []
  for (let i = 0; i < runs; i++) {
    const t = performance.now()
    await fn()
    times.push(performance.now() - t)
  }
  return times.sort((a, b) => a - b)[Math.floor(times.length / 2)]!
}

const results = [
  ['distributor dashboard, a year', await median(() => distributorDashboard(year, clock, fmt)), await median(baselineDistributor)],
  ['garage dashboard, a year', await median(() => garageDashboard(garage!.id, year, fmt)), await median(baselineGarage)],
] as const
console.log(`${Number(lineCount!.n)} order lines; median of ${runs} runs after one warm-up`)
for (const [what, app, bare] of results) console.log(`${what}: ${app.toFixed(0)} ms; bare SQL ${bare.toFixed(0)} ms; ratio ${(app / bare).toFixed(2)}`)
await closeDb()
