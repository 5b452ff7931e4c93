/**
 * GET /api/quotes?status=&q=&page=&pageSize=  -> { data: QuoteSummary[], meta: { page, pageSize, total } }
 * The caller's garage's quotes, most recently changed first. `status` filters (`open` = draft or sent); without
 * it, replaced revisions are left out (they show in each quote's revision history). `q` searches the
 * registration and the owner's name. Sent quotes past their validity are marked expired first.
 * 401 signed out; 403 without `quotes.draft`; 422 bad query.
 */
import { Op, Sequelize, type WhereOptions } from 'sequelize'
import { QuoteListQuerySchema } from '#shared/schemas/quotes'
import { quoteTotals } from '#shared/utils/quote-totals'
import { Quote, QuoteLine } from '../../models/quotes'
import { expireDueQuotes, quoteSummary, totalsInput } from '../../services/quotes'

export default defineEventHandler(async (event) => {
  requireAuth(event)
  const query = queryWith(event, QuoteListQuerySchema)
  const { org } = requireAbility(event, 'quotes.draft')
  await expireDueQuotes({ organisationId: org.id })
  const where: WhereOptions = { organisationId: org.id }
  if (!query.status) Object.assign(where, { status: { [Op.ne]: 'superseded' } })
  else if (query.status === 'open') Object.assign(where, { status: { [Op.in]: ['draft', 'sent'] } })
  else Object.assign(where, { status: query.status })
  if (query.q) {
    const q = query.q.toLowerCase()
    // instr, not LIKE: % and _ in the search are plain characters
    Object.assign(where, {
      [Op.or]: ['registration', 'owner_name'].map((c) => Sequelize.where(Sequelize.fn('instr', Sequelize.fn('lower', Sequelize.col(c)), q), Op.gt, 0)),
    })
  }
  const { page, pageSize } = query
  const { rows, count } = await Quote.findAndCountAll({
    where, order: [['updatedAt', 'DESC'], ['id', 'DESC']], limit: pageSize, offset: (page - 1) * pageSize,
  })
  const lines = rows.length ? await QuoteLine.findAll({ where: { quoteId: { [Op.in]: rows.map((r) => r.id) } } }) : []
  const data = rows.map((q) => quoteSummary(q, quoteTotals(totalsInput(lines.filter((l) => l.quoteId === q.id), 'quoted')).grossMinor))
  return { data, meta: { page, pageSize, total: count } }
})
