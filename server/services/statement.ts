/**
 * A garage's statement: its ledger in the order it was written, with the running balance (positive = owed to
 * the distributor), and the same as CSV. CSV cells that begin with = + - @ (or tab / CR) are neutralised by
 * the one CSV writer (csv-export.ts), so a garage reference typed as a formula cannot run in a spreadsheet;
 * amounts are numbers and stay numbers. Plain Node.
 */
import { safeCsv } from './csv-export'
import { Organisation } from '../models/accounts'
import { LedgerEntry, Order } from '../models/orders'
import { notFound } from './errors'
import { ageingOf, openItemsOf } from './ageing'
import { stopFrom } from './account-stop'
import { owedLedgerOf } from './owed-moves'
import { localDate } from './orders/zoned-time'
import { systemClock, type ViewClock } from './orders/clock'
import { AGEING_BUCKETS, AGEING_LABELS } from '../../shared/types/money-owed'
import { LEDGER_KIND_LABELS, type Statement } from '../../shared/types/orders'
import type { Formats } from '../../shared/utils/format'

/** First instant of a month and of the month after it (UTC), for `YYYY-MM`. */
function monthBounds(month: string): [Date, Date] {
  const [y, m] = month.split('-').map(Number) as [number, number]
  return [new Date(Date.UTC(y, m - 1, 1)), new Date(Date.UTC(y, m, 1))]
}

/**
 * The garage's ledger with running balances; with `month`, only that month's entries, the running balance still
 * counted from the first entry ever (so the opening balance is what was owed when the month began). The open items,
 * their ageing and the account stop are as on the clock's local day, over the whole ledger.
 */
export async function statementOf(organisationId: number, month: string | undefined, fmt: Formats, clock: ViewClock = systemClock(fmt.timeZone)): Promise<Statement> {
  const org = await Organisation.findByPk(organisationId)
  if (!org) throw notFound('Garage')
  const rows = await LedgerEntry.findAll({
    where: { organisationId },
    include: [{ model: Order, as: 'order', attributes: ['id', 'garageReference'] }],
    order: [['id', 'ASC']],
  })
  const [from, to] = month ? monthBounds(month) : [null, null]
  let balance = 0
  let opening = 0
  const months = new Set<string>()
  const entries: Statement['entries'] = []
  for (const r of rows) {
    balance += r.amountMinor
    months.add(r.createdAt.toISOString().slice(0, 7))
    if (from && r.createdAt < from) { opening = balance; continue }
    if (to && r.createdAt >= to) continue
    entries.push({
      id: r.id,
      at: r.createdAt.toISOString(),
      kind: r.kind,
      kindLabel: LEDGER_KIND_LABELS[r.kind] ?? r.kind,
      reference: r.reference,
      description: r.description,
      amountMinor: r.amountMinor,
      balanceMinor: balance,
      orderId: r.orderId,
      garageReference: (r as LedgerEntry & { order?: Order }).order?.garageReference ?? '',
    })
  }
  const terms = org.paymentTerms ?? 'card'
  const asOf = localDate(clock.now, clock.timeZone)
  const { moves, allocations } = await owedLedgerOf(org.id, rows, clock.timeZone)
  const openItems = openItemsOf(moves, org.paymentDays ?? 0, asOf, allocations)
  return {
    garage: { id: org.id, name: org.name, terms, creditLimitMinor: org.creditLimitMinor ?? 0, paymentDays: org.paymentDays ?? 0 },
    currency: fmt.currency,
    entries,
    balanceMinor: balance,
    availableMinor: terms === 'account' ? (org.creditLimitMinor ?? 0) - balance : null,
    period: month ? { month, openingBalanceMinor: opening, closingBalanceMinor: entries.at(-1)?.balanceMinor ?? opening } : null,
    months: [...months].sort().reverse(),
    asOf,
    openItems,
    ageing: ageingOf(openItems),
    stop: stopFrom(org, balance, openItems, asOf, fmt),
  }
}

/** The CSV's file name: the month shown, or today's date for the whole ledger. */
export function statementFileName(month: string | undefined, now = new Date()): string {
  return `statement-${month ?? now.toISOString().slice(0, 10)}.csv`
}

/** The statement as CSV (UTF-8, header row, amounts in major units with two decimals). */
export function statementCsv(s: Statement): string {
  const records: Record<string, string | number>[] = []
  if (s.period) {
    records.push({ date: `${s.period.month}-01`, kind: 'Brought forward', reference: '', yours: '', description: `Balance when ${s.period.month} began`, amount: 0, balance: s.period.openingBalanceMinor })
  }
  records.push(...s.entries.map((e) => ({
    date: e.at.slice(0, 10),
    kind: e.kindLabel,
    reference: e.reference,
    yours: e.garageReference,
    description: e.description,
    amount: e.amountMinor,
    balance: e.balanceMinor,
  })))
  return safeCsv(records, {
    header: true,
    columns: [
      { key: 'date', header: 'Date' },
      { key: 'kind', header: 'Entry' },
      { key: 'reference', header: 'Reference' },
      { key: 'yours', header: 'Your reference' },
      { key: 'description', header: 'Details' },
      { key: 'amount', header: `Amount (${s.currency})` },
      { key: 'balance', header: `Balance (${s.currency})` },
    ],
    cast: { number: (minor: number) => (minor / 100).toFixed(2) },
  })
}

/**
 * What is still owed as CSV: one row an open item (booked, due, days overdue, amount, paid, still open), then one row
 * an ageing bucket, then the total; amounts in major units with two decimals, days as YYYY-MM-DD.
 */
export function openItemsCsv(s: Statement): string {
  const records: Record<string, string | number>[] = s.openItems.map((i) => ({
    reference: i.reference, details: i.invoice ? `${i.description} (invoice ${i.invoice})` : i.description, booked: i.bookedOn, due: i.dueOn ?? 'not invoiced yet', overdue: i.daysOverdue,
    amount: i.amountMinor, paid: i.paidMinor, open: i.openMinor,
  }))
  const summary = (details: string, open: number) => ({ reference: '', details, booked: '', due: '', overdue: '', amount: '', paid: '', open })
  records.push(...AGEING_BUCKETS.map((b) => summary(AGEING_LABELS[b], s.ageing[b])))
  records.push(summary(`Total still open on ${s.asOf}`, s.openItems.reduce((sum, i) => sum + i.openMinor, 0)))
  return safeCsv(records, {
    header: true,
    columns: [
      { key: 'reference', header: 'Reference' },
      { key: 'details', header: 'Details' },
      { key: 'booked', header: 'Booked' },
      { key: 'due', header: 'Due' },
      { key: 'overdue', header: 'Days overdue' },
      { key: 'amount', header: `Amount (${s.currency})` },
      { key: 'paid', header: `Paid (${s.currency})` },
      { key: 'open', header: `Still open (${s.currency})` },
    ],
    cast: { number: (v: number, ctx: { column?: string | number }) => (ctx.column === 'overdue' ? String(v) : (v / 100).toFixed(2)) },
  })
}
