/**
 * The statement as a PDF on the one layout (server/services/pdf/document.ts), with the same figures as the screen
 * and the CSVs (it is printed from the same `Statement`): the garage and its terms, the account stop when there is
 * one, the ageing of what is open, each open item with its due day, then the ledger with its running balance.
 * Also what the monthly e-mail attaches. Plain Node.
 */
import { Organisation } from '../models/accounts'
import type { Formats } from '../../shared/utils/format'
import type { Statement } from '../../shared/types/orders'
import { AGEING_BUCKETS, AGEING_LABELS } from '../../shared/types/money-owed'
import type { PdfFonts } from './pdf/document'
import { addressAndFacts, letterheadPage, note, partyOf, table, type Party } from './orders/paperwork'
import { statementOf } from './statement'
import { systemClock, type ViewClock } from './orders/clock'

/** A calendar day as stored (YYYY-MM-DD), read at midday so no time zone moves it to another day. */
const calendarDay = (d: string) => `${d}T12:00:00Z`

export function statementPdf(s: Statement, seller: Party, buyer: Party, fmt: Formats, fonts: PdfFonts): Promise<Buffer> {
  const m = fmt.money
  const day = (d: string) => fmt.day(calendarDay(d))
  const page = letterheadPage(fonts, {
    seller: seller.name, title: 'Statement', reference: s.period ? fmt.month(s.period.month) : 'Every entry', dated: `As at ${day(s.asOf)}`, subject: s.garage.name,
    contact: [seller.address, seller.taxNumber ? `VAT no. ${seller.taxNumber}` : ''],
  })
  const account = s.garage.terms === 'account'
  addressAndFacts(page, 'Statement for', buyer, [
    ['Terms', account ? `On account, ${s.garage.paymentDays} days from the invoice` : 'Card'],
    ...(account ? [['Credit limit', m(s.garage.creditLimitMinor)] as [string, string]] : []),
    ['Balance now', m(s.balanceMinor)],
    ...(s.availableMinor !== null ? [['Available on account', s.stop.onStop ? `${m(0)} (on stop)` : m(Math.max(0, s.availableMinor))] as [string, string]] : []),
  ])
  if (s.stop.onStop) {
    page.heading('Ordering on account is stopped')
    for (const r of s.stop.reasons) note(page, r)
    note(page, `Pay ${m(s.stop.amountToClearMinor)} to order on account again. Orders paid by card still go through.`)
  }
  page.heading(`Still to pay on ${day(s.asOf)}`)
  table(page, [{ header: 'Age', width: 350 }, { header: `Still open (${fmt.currency})`, width: 149, align: 'right' }], [
    ...AGEING_BUCKETS.map((b) => [AGEING_LABELS[b], m(s.ageing[b])]),
    ['Total', m(AGEING_BUCKETS.reduce((sum, b) => sum + s.ageing[b], 0))],
  ])
  if (s.openItems.length) {
    page.doc.moveDown(0.8)
    table(page, [
      { header: 'Reference', width: 95 }, { header: 'Invoice', width: 80 }, { header: 'Due', width: 75 }, { header: 'Overdue (days)', width: 60, align: 'right' },
      { header: 'Amount', width: 63, align: 'right' }, { header: 'Paid', width: 63, align: 'right' }, { header: 'Still open', width: 63, align: 'right' },
    ], s.openItems.map((i) => [
      i.reference, i.invoice ?? 'not yet', i.dueOn ? day(i.dueOn) : 'once invoiced', String(i.daysOverdue), m(i.amountMinor), m(i.paidMinor), m(i.openMinor),
    ]))
  }
  page.heading(s.period ? `Entries in ${fmt.month(s.period.month)}` : 'Every entry')
  const rows = s.entries.map((e) => [fmt.shortDay(e.at), e.kindLabel, e.reference, e.description, m(e.amountMinor), m(e.balanceMinor)])
  if (s.period) rows.unshift(['', 'Brought forward', '', `Balance when ${fmt.month(s.period.month)} began`, '', m(s.period.openingBalanceMinor)])
  table(page, [
    { header: 'Date', width: 62 }, { header: 'Entry', width: 75 }, { header: 'Reference', width: 80 }, { header: 'Details', width: 130 },
    { header: 'Amount', width: 76, align: 'right' }, { header: 'Balance', width: 76, align: 'right' },
  ], rows.length ? rows : [['', '', '', 'Nothing on the statement.', '', '']])
  note(page, `Amounts in ${fmt.currency}, with VAT. Payments settle the oldest items first unless the payment names the invoices it pays.`)
  return page.finish(`Statement for ${s.garage.name} · ${seller.name}`)
}

/** The garage's statement (one month, or every entry) as a PDF, with the distributor's letterhead. */
export async function statementPdfOf(organisationId: number, month: string | undefined, fmt: Formats, fonts: PdfFonts, clock: ViewClock = systemClock(fmt.timeZone)): Promise<Buffer> {
  const [s, seller, buyer] = await Promise.all([
    statementOf(organisationId, month, fmt, clock),
    Organisation.findOne({ where: { kind: 'distributor' } }),
    Organisation.findByPk(organisationId),
  ])
  return statementPdf(s, seller ? partyOf(seller) : { name: 'Distributor', address: '', taxNumber: '' }, partyOf(buyer!), fmt, fonts)
}
