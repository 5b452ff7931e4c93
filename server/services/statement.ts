/**
 * A garage's statement: its ledger in the order it was written, with the running balance (positive = owed to
 * the distributor), and the same as CSV. CSV cells that begin with = + - @ (or tab / CR) are neutralised by
 * csv-stringify's `escape_formulas`, so a garage reference typed as a formula cannot run in a spreadsheet;
 * amounts are numbers and stay numbers. Plain Node.
 */
import { stringify } from 'csv-stringify/sync'
import { Organisation } from '../models/accounts'
import { LedgerEntry, Order } from '../models/orders'
import { notFound } from '../utils/validate'
import { LEDGER_KIND_LABELS, type Statement } from '../../shared/types/orders'
import { ORDER_CURRENCY } from './orders'

export async function statementOf(organisationId: number): Promise<Statement> {
  const org = await Organisation.findByPk(organisationId)
  if (!org) throw notFound('Garage')
  const rows = await LedgerEntry.findAll({
    where: { organisationId },
    include: [{ model: Order, as: 'order', attributes: ['id', 'garageReference'] }],
    order: [['id', 'ASC']],
  })
  let balance = 0
  const entries = rows.map((r) => {
    balance += r.amountMinor
    return {
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
    }
  })
  const terms = org.paymentTerms ?? 'card'
  return {
    garage: { id: org.id, name: org.name, terms, creditLimitMinor: org.creditLimitMinor ?? 0, paymentDays: org.paymentDays ?? 0 },
    currency: ORDER_CURRENCY,
    entries,
    balanceMinor: balance,
    availableMinor: terms === 'account' ? (org.creditLimitMinor ?? 0) - balance : null,
  }
}

/** The statement as CSV (UTF-8, header row, amounts in major units with two decimals). */
export function statementCsv(s: Statement): string {
  const records = s.entries.map((e) => ({
    date: e.at.slice(0, 10),
    kind: e.kindLabel,
    reference: e.reference,
    yours: e.garageReference,
    description: e.description,
    amount: e.amountMinor,
    balance: e.balanceMinor,
  }))
  return stringify(records, {
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
    escape_formulas: true,
    cast: { number: (minor: number) => (minor / 100).toFixed(2) },
  })
}
