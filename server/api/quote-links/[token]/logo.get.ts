/**
 * GET /api/quote-links/:token/logo  -> the logo of the garage that sent this quote (for the owner's page)
 * 404 when the link is not valid or the garage has no logo.
 */
import { settingsOf } from '../../../services/quotes'

export default defineEventHandler(async (event) => {
  const { quote } = await loadLinkedQuote(event)
  return sendGarageLogo(event, await settingsOf(quote.organisationId), 'no-store')
})
