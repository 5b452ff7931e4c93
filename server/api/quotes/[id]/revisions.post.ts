/**
 * POST /api/quotes/:id/revisions  -> 201 QuoteDetail of a new draft revision of a quote that has left draft
 * (the old one is kept, superseded; its owner's link then says it was replaced).
 * 401; 404 not this garage's quote; 403 without `quotes.draft`; 409 for a draft or an already replaced revision.
 */
import { editableQuote } from '../../../services/quotes'

export default defineEventHandler(async (event) => {
  const { auth, quote } = await loadOwnQuote(event)
  const revised = await withWrite(async (t) => {
    const { quote: q } = await editableQuote(t, quote, auth.user.id)
    if (q.id === quote.id) throw conflict('A draft is changed as it is; it needs no new revision.')
    await audit(t, { actorUserId: auth.user.id, organisationId: auth.org.id, action: 'quote.revise', entity: 'quote', entityId: q.id, changes: { from: quote.id, revision: q.revision } })
    return q
  })
  setResponseStatus(event, 201)
  return quoteAnswer(revised, auth)
})
