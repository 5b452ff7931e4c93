/**
 * POST /api/quotes/:id/send  { message? }  (managers only)
 * Sends a draft to the owner: a new link token (256 bits; only its SHA-256 is stored), validity from the garage
 * settings, and an e-mail with the /q/<token> link and the PDF. Sending a quote that is already with the owner
 * sends a new link (the old one stops working) and keeps its validity. -> QuoteDetail + `mailed`.
 * 401; 422 with `data.fields`; 404 not this garage's quote; 403 technicians; 409 decided, expired or replaced.
 */
import { QuoteSendSchema } from '#shared/schemas/quotes'
import { nextQuoteStatus, effectiveQuoteStatus } from '#shared/utils/quote-states'
import { Quote } from '../../../models/quotes'
import { isDecidable, linesOf, newQuoteToken, settingsOf } from '../../../services/quotes'

export default defineEventHandler(async (event) => {
  requireAuth(event)
  const body = await bodyWith(event, QuoteSendSchema)
  const { auth, quote } = await loadOwnQuote(event, 'quotes.send')
  const { token } = await withWrite(async (t) => {
    const q = await Quote.findByPk(quote.id, { transaction: t })
    if (!q) throw notFound('Quote')
    const status = effectiveQuoteStatus(q.status, q.expiresAt ?? null)
    if (nextQuoteStatus(status, 'send') !== 'sent') {
      throw conflict(status === 'superseded' ? 'This revision has been replaced: send the latest one.' : 'This quote has been decided or has expired: make a new revision to send it again.')
    }
    const lines = await linesOf(q.id, t)
    if (!lines.some(isDecidable)) throw invalidInput({ lines: 'Add at least one line before sending.' })
    const settings = await settingsOf(auth.org.id, t)
    const now = new Date()
    const link = newQuoteToken()
    const resend = status === 'sent'
    const [changed] = await Quote.update({
      status: 'sent', tokenHash: link.hash, sentAt: now, sentByUserId: auth.user.id,
      expiresAt: resend && q.expiresAt ? q.expiresAt : new Date(now.getTime() + settings.quoteValidityDays * 86_400_000),
      messageToOwner: body.message ?? q.messageToOwner,
    }, { where: { id: q.id, status: q.status }, transaction: t })
    if (changed !== 1) throw conflict('The quote changed meanwhile. Reload it and try again.')
    await audit(t, { actorUserId: auth.user.id, organisationId: auth.org.id, action: resend ? 'quote.resend' : 'quote.send', entity: 'quote', entityId: q.id, changes: { lines: lines.length } })
    return { token: link.token }
  })
  await quote.reload()
  const mailed = await mailQuoteToOwner(quote, token)
  return { ...(await quoteAnswer(quote, auth)), mailed }
})
