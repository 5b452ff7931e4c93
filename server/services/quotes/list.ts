/**
 * The garage's list of quotes, one page at a time (the list contract of shared/schemas/page.ts): most recently
 * changed first, replaced revisions left out unless asked for, searched by registration or owner's name.
 */
import { Op, type WhereOptions } from 'sequelize'
import { Quote, QuoteLine } from '../../models/quotes'
import { pageOf } from '../../utils/page'
import { quoteTotals } from '../../../shared/utils/quote-totals'
import type { QuoteListQuery } from '../../../shared/schemas/quotes'
import type { Page } from '../../../shared/types/page'
import type { QuoteSummary } from '../../../shared/types/quotes'
import { quoteSummary } from './garage-view'
import { expireDueQuotes, totalsInput } from './rows'
import { containsText } from '../../utils/sql'

function whereOf(organisationId: number, query: QuoteListQuery): WhereOptions {
  const where: WhereOptions = { organisationId }
  if (!query.status) Object.assign(where, { status: { [Op.ne]: 'superseded' } })
  else if (query.status === 'open') Object.assign(where, { status: { [Op.in]: ['draft', 'sent'] } })
  else Object.assign(where, { status: query.status })
  if (query.q) {
    const q = query.q.toLowerCase()
    // contains, not LIKE: % and _ in the search are plain characters
    Object.assign(where, {
      [Op.or]: ['registration', 'owner_name'].map((c) => containsText(c, q)),
    })
  }
  return where
}

/** Each quote with its gross total as quoted and how many required lines the owner declined. */
async function summaries(rows: Quote[]): Promise<QuoteSummary[]> {
  const lines = rows.length ? await QuoteLine.findAll({ where: { quoteId: { [Op.in]: rows.map((r) => r.id) } } }) : []
  return rows.map((q) => {
    const own = lines.filter((l) => l.quoteId === q.id)
    return quoteSummary(q, quoteTotals(totalsInput(own)).grossMinor, own)
  })
}

/** One page of the garage's quotes; sent quotes past their validity are marked expired first. */
export async function listQuotes(organisationId: number, query: QuoteListQuery): Promise<Page<QuoteSummary>> {
  await expireDueQuotes({ organisationId })
  return pageOf(query, (window) => Quote.findAndCountAll({
    where: whereOf(organisationId, query), order: [['updatedAt', 'DESC'], ['id', 'DESC']], ...window,
  }), summaries)
}
