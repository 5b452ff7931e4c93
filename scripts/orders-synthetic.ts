/**
 * npm run orders:synthetic -- --database <sqlite url or path> [--garages 300] [--lines 200000] [--days 365] [--seed 11]
 *
 * A year of invented trade for the dashboard benchmark, on a migrated and seeded database (the demo seed gives the
 * branches, people, parts and prices): garages on account or card terms, orders every day with their lines (mostly
 * from the home branch's shelf, some by transfer or back-ordered), an invoice for each order sent, the charges and
 * monthly payments on the ledger, and quotes with owners' decisions. Raw multi-row INSERTs, deterministic for a
 * --seed. Refuses a database that already holds synthetic garages.
 */
import { resolve } from 'node:path'
import sqlite3 from 'sqlite3'
import { prng } from '../server/seed/catalogue-data'
import { all, insertAll, run } from './lib/sqlite-bulk'

interface Args { database: string; garages: number; lines: number; days: number; seed: number }

function parseArgs(argv: string[]): Args {
  const out: Args = { database: process.env.DATABASE_URL || '', garages: 300, lines: 200_000, days: 365, seed: 11 }
  for (let i = 0; i < argv.length; i += 2) {
    const [a, v] = [argv[i]!, argv[i + 1]]
    if (a === '--database') { out.database = v ?? ''; continue }
    const n = Number(v)
    if (!Number.isInteger(n) || n < 1) throw new Error(`${a} needs a whole number above 0 (got "${v ?? ''}")`)
    if (a === '--garages') out.garages = n
    else if (a === '--lines') out.lines = n
    else if (a === '--days') out.days = n
    else if (a === '--seed') out.seed = n
    else throw new Error(`Unknown option ${a}. Use --database <url|path> [--garages N] [--lines N] [--days N] [--seed N]`)
  }
  if (!out.database) throw new Error('Give --database <sqlite:./file.sqlite or path> or set DATABASE_URL')
  return out
}

/** Sequelize's SQLite date text, which the app's range parameters compare with. */
const stamp = (d: Date) => `${d.toISOString().replace('T', ' ').replace('Z', '')} +00:00`
const DAY = 86_400_000
const PART_TYPES = ['pad_set', 'disc', 'drum', 'shoe_set', 'caliper', 'wheel_cylinder', 'master_cylinder', 'hose', 'fluid']

export async function writeSyntheticOrders(args: Args): Promise<{ garages: number; orders: number; lines: number; quotes: number }> {
  const db = new sqlite3.Database(args.database.replace(/^sqlite:/, ''))
  const rnd = prng(args.seed)
  const pick = <T>(list: readonly T[]): T => list[Math.floor(rnd() * list.length)]!
  if ((await all<{ n: number }>(db, "SELECT COUNT(*) AS n FROM organisations WHERE name LIKE 'Synthetic Garage %'"))[0]!.n > 0) throw new Error('This database already holds synthetic garages.')
  const branches = (await all<{ id: number }>(db, 'SELECT id FROM branches ORDER BY id')).map((b) => b.id)
  const [user] = await all<{ id: number }>(db, "SELECT id FROM users WHERE role = 'garage_manager' ORDER BY id LIMIT 1")
  const parts = await all<{ id: number; sku: string; description: string; list: number }>(db, `SELECT p.id, p.sku, p.description, pp.list_price_minor AS list
    FROM parts p JOIN part_prices pp ON pp.part_id = p.id JOIN price_versions v ON v.id = pp.price_version_id AND v.status = 'active' ORDER BY p.id LIMIT 2000`)
  if (!branches.length || !user || !parts.length) throw new Error('Seed the database first (npm run db:seed): branches, people and prices are needed.')
  const now = Date.now()
  const firstOrg = 1 + (await all<{ n: number }>(db, 'SELECT COALESCE(MAX(id), 0) AS n FROM organisations'))[0]!.n
  const garages = Array.from({ length: args.garages }, (_, i) => ({ id: firstOrg + i, account: i % 3 !== 0, branch: branches[i % branches.length]! }))
  await insertAll(db, 'organisations', ['id', 'kind', 'name', 'status', 'payment_terms', 'credit_limit_minor', 'payment_days', 'home_branch_id', 'email', 'created_at', 'updated_at'],
    garages.map((g) => [g.id, 'garage', `Synthetic Garage ${g.id}`, 'approved', g.account ? 'account' : 'card', g.account ? 5_000_000 : 0, g.account ? 30 : 0, g.branch, `office-${g.id}@synthetic.test`, stamp(new Date(now - 400 * DAY)), stamp(new Date(now))]))

  const firstOrder = 1 + (await all<{ n: number }>(db, 'SELECT COALESCE(MAX(id), 0) AS n FROM orders'))[0]!.n
  const firstInvoice = (await all<{ n: number }>(db, "SELECT next_number AS n FROM document_series WHERE series = 'INV'"))[0]!.n
  const orders: unknown[][] = [], lines: unknown[][] = [], docs: unknown[][] = [], ledger: unknown[][] = []
  let orderId = firstOrder, lineCount = 0, invoice = firstInvoice
  const owedByMonth = new Map<string, number>()
  while (lineCount < args.lines) {
    const g = pick(garages)
    const created = new Date(now - Math.floor(rnd() * args.days * DAY))
    const sent = now - created.getTime() > 2 * DAY
    const n = 1 + Math.floor(rnd() * 5)
    let subtotal = 0
    for (let k = 0; k < n; k++) {
      const p = pick(parts), qty = 1 + Math.floor(rnd() * 4), unit = Math.round(p.list * 0.8)
      const r = rnd()
      const source = r < 0.9 ? 'home' : r < 0.96 ? 'transfer' : 'back_order'
      lines.push([orderId, p.id, p.sku, p.description, qty, p.list, unit, unit * qty, source, sent ? 'dispatched' : 'reserved', k, 0])
      subtotal += unit * qty
    }
    lineCount += n
    const tax = Math.round(subtotal * 0.2)
    orders.push([orderId, g.id, g.branch, user.id, sent ? 'delivered' : 'confirmed', g.account ? 'account' : 'card', g.account ? 'on_account' : 'paid', subtotal, 2000, tax, subtotal + tax, 'GBP', stamp(created), stamp(created)])
    if (sent) {
      const issued = new Date(created.getTime() + DAY)
      docs.push(['invoice', 'INV', invoice, `INV-${String(invoice).padStart(6, '0')}`, g.id, orderId, stamp(issued), issued.toISOString().slice(0, 10), 'GBP', subtotal, tax, subtotal + tax, '{}', stamp(issued)])
      invoice++
    }
    if (g.account) {
      ledger.push([g.id, orderId, 'order', subtotal + tax, `BL-${String(orderId).padStart(6, '0')}`, stamp(created)])
      const key = `${g.id}:${created.toISOString().slice(0, 7)}`
      owedByMonth.set(key, (owedByMonth.get(key) ?? 0) + subtotal + tax)
    }
    orderId++
  }
  // each account garage pays 95 % of a month's charges on the 20th of the month after: some stays overdue
  for (const [key, owed] of owedByMonth) {
    const [org, month] = key.split(':') as [string, string]
    const paidOn = new Date(`${month}-20T10:00:00Z`)
    paidOn.setUTCMonth(paidOn.getUTCMonth() + 1)
    if (paidOn.getTime() < now) ledger.push([Number(org), null, 'account_payment', -Math.round(owed * 0.95), `SYN-${org}-${month}`, stamp(paidOn)])
  }
  await insertAll(db, 'orders', ['id', 'organisation_id', 'branch_id', 'placed_by_user_id', 'status', 'payment_method', 'payment_state', 'subtotal_minor', 'tax_rate_bp', 'tax_minor', 'total_minor', 'currency', 'created_at', 'updated_at'], orders)
  await insertAll(db, 'order_lines', ['order_id', 'part_id', 'sku', 'description', 'quantity', 'unit_list_minor', 'unit_net_minor', 'line_net_minor', 'source', 'state', 'position', 'line_group'], lines)
  await insertAll(db, 'documents', ['kind', 'series', 'number', 'reference', 'organisation_id', 'order_id', 'issued_at', 'tax_point', 'currency', 'net_minor', 'tax_minor', 'total_minor', 'body', 'created_at'], docs)
  await run(db, `UPDATE document_series SET next_number = ${invoice} WHERE series = 'INV'`)
  await insertAll(db, 'ledger_entries', ['organisation_id', 'order_id', 'kind', 'amount_minor', 'reference', 'created_at'], ledger)

  // quotes: about 100 a garage over the period, three decided lines each
  const firstQuote = 1 + (await all<{ n: number }>(db, 'SELECT COALESCE(MAX(id), 0) AS n FROM quotes'))[0]!.n
  const quotes: unknown[][] = [], quoteLines: unknown[][] = []
  let quoteId = firstQuote
  for (const g of garages) {
    for (let number = 1; number <= 100; number++) {
      const sentAt = new Date(now - Math.floor(rnd() * args.days * DAY))
      const decisions = [rnd() < 0.85, rnd() < 0.5, rnd() < 0.4]
      const status = decisions.every(Boolean) ? 'approved' : decisions.some(Boolean) ? 'partly_approved' : 'declined'
      quotes.push([quoteId, g.id, number, status, 'Synthetic Owner', 'owner@synthetic.test', user.id, stamp(sentAt), stamp(sentAt), stamp(sentAt)])
      decisions.forEach((ok, k) => quoteLines.push([quoteId, k, 'part', pick(PART_TYPES), 'Synthetic work', 2000, 1, 5_000, 5_000, k === 0 ? 'required' : 'advised', ok ? 'approved' : 'declined', stamp(sentAt), stamp(sentAt)]))
      quoteId++
    }
  }
  await insertAll(db, 'quotes', ['id', 'organisation_id', 'number', 'status', 'owner_name', 'owner_email', 'created_by_user_id', 'sent_at', 'created_at', 'updated_at'], quotes)
  await insertAll(db, 'quote_lines', ['quote_id', 'position', 'kind', 'part_type', 'description', 'tax_bp', 'quantity', 'unit_price_minor', 'amount_minor', 'recommendation', 'owner_decision', 'created_at', 'updated_at'], quoteLines)
  await run(db, 'ANALYZE')
  await new Promise<void>((res) => db.close(() => res()))
  return { garages: garages.length, orders: orders.length, lines: lineCount, quotes: quotes.length }
}

if (process.argv[1] && resolve(process.argv[1]) === resolve(import.meta.filename)) {
  const made = await writeSyntheticOrders(parseArgs(process.argv.slice(2)))
  console.log(`synthetic trade: ${made.garages} garages, ${made.orders} orders, ${made.lines} order lines, ${made.quotes} quotes`)
}
