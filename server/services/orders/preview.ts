/** What an order would be, changing nothing: re-priced lines, changes against the quote, stock and the credit check. */
import { Branch, Organisation } from '../../models/accounts'
import type { OrderPreview, PaymentMethod } from '../../../shared/types/orders'
import type { Formats } from '../../../shared/utils/format'
import { notFound } from '../errors'
import { orderAmounts, priceOrder, type OrderSource } from './pricing'
import { creditCheck } from './credit'
import { branchView } from './views'

export async function previewOrder(orgId: number, input: OrderSource & { payment?: PaymentMethod }, fmt: Formats): Promise<OrderPreview> {
  const org = await Organisation.findByPk(orgId)
  if (!org) throw notFound('Garage')
  const priced = await priceOrder(org, input)
  const branches = await Branch.findAll({ order: [['name', 'ASC']] })
  return {
    ...orderAmounts(priced, fmt.currency),
    lines: priced.lines,
    branch: branchView(priced.branch),
    branches: branches.map(branchView),
    changes: priced.lines.filter((l) => l.priceChangeMinor !== null).map((l) => ({ sku: l.sku, quotedUnitNetMinor: l.quotedUnitNetMinor!, unitNetMinor: l.unitNetMinor })),
    skipped: priced.skipped,
    terms: org.paymentTerms ?? 'card',
    account: org.paymentTerms === 'account' ? await creditCheck(org, priced.totalMinor) : null,
    shortages: priced.lines.filter((l) => l.available < l.quantity).map((l) => ({ sku: l.sku, available: l.available, wanted: l.quantity })),
  }
}
