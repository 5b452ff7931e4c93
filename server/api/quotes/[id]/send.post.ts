/**
 * POST /api/quotes/:id/send  { message? }  (managers only)
 * Sends a draft to the owner: a new link token (256 bits; only its SHA-256 is stored), validity from the garage
 * settings, and an e-mail with the /q/<token> link and the PDF. Sending a quote that is already with the owner
 * sends a new link (the old one stops working) and keeps its validity. -> QuoteDetail + `mailed`.
 * 401; 422 with `data.fields`; 404 not this garage's quote; 403 technicians; 409 decided, expired or replaced.
 */
import { QuoteSendSchema } from '#shared/schemas/quotes'
import { sendQuote } from '../../../services/quotes'

export default defineEventHandler(async (event) => {
  requireAuth(event)
  const body = await bodyWith(event, QuoteSendSchema)
  const { auth, quote } = await loadOwnQuote(event, 'quotes.send')
  const { mailed } = await sendQuote(quote, auth, body.message, quoteOutput(event))
  return { ...(await quoteAnswer(quote, auth)), mailed }
})
