/**
 * GET /api/quotes/:id/pdf  -> application/pdf (as the owner sees it: no trade prices or markups)
 * 401; 404 not this garage's quote; 403 without `quotes.draft`.
 */
export default defineEventHandler(async (event) => {
  const { quote } = await loadOwnQuote(event)
  return sendQuotePdf(event, quote)
})
