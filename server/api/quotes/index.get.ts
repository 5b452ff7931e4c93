/**
 * GET /api/quotes?status=&q=&page=&pageSize=  -> Page<QuoteSummary>: { data, meta: { page, pageSize, total, pages } }
 * The caller's garage's quotes, most recently changed first. `status` filters (`open` = draft or sent); without
 * it, replaced revisions are left out (they show in each quote's revision history). `q` searches the
 * registration and the owner's name. Sent quotes past their validity are marked expired first.
 * 401 signed out; 403 without `quotes.draft`; 422 bad query.
 */
import { QuoteListQuerySchema } from '#shared/schemas/quotes'
import { listQuotes } from '../../services/quotes'

export default defineEventHandler(async (event) => {
  requireAuth(event)
  const query = queryWith(event, QuoteListQuerySchema)
  const { org } = requireAbility(event, 'quotes.draft')
  return listQuotes(org.id, query)
})
