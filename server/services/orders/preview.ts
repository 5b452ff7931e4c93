/**
 * What an order would be, changing nothing: re-priced lines, changes against the quote, each line's supply
 * (shelf, transfer, back-order, counter) with its promise, and the credit check.
 */
import { Branch, Organisation } from '../../models/accounts'
import type { OrderPreview, PaymentMethod } from '../../../shared/types/orders'
import type { Formats } from '../../../shared/utils/format'
import { notFound } from '../errors'
import { orderAmounts, priceOrder, type OrderSource } from './pricing'
import { creditCheck } from './credit'
import { branchView } from './views'

export async function previewOrder(orgId: number, input: OrderSource & { payment?: PaymentMethod }, fmt: Formats, now = new Date()): Promise<OrderPreview> {
  const org = await Organisation.findByPk(orgId)
  if (!org) throw notFound('Garage')
  const priced = await priceOrder(org, input, { now, timeZone: fmt.timeZone })
  const branches = await Branch.findAll({ order: [['name', 'ASC']] })
  return {
    ...orderAmounts(priced, fmt.currency),
    lines: priced.lines,
    branch: branchView(priced.branch),
    branches: branches.map(branchView),
    fulfilment: priced.fulfilment,
    collect: priced.collect,
    completeAt: priced.completeAt?.toISOString() ?? null,
    changes: priced.lines.filter((l, i, all) => l.priceChangeMinor !== null && all.findIndex((x) => x.group === l.group) === i)
      .map((l) => ({ sku: l.sku, quotedUnitNetMinor: l.quotedUnitNetMinor!, unitNetMinor: l.unitNetMinor })),
    skipped: priced.skipped,
    terms: org.paymentTerms ?? 'card',
    account: org.paymentTerms === 'account' ? await creditCheck(org, priced.totalMinor) : null,
    shortages: priced.shortages,
  }
}
