/**
 * GET /api/quotes/:id/pdf  -> application/pdf (as the owner sees it: no trade prices or markups)
 * 401; 404 not this garage's quote; 403 without `quotes.draft`.
 */
export default defineEventHandler(async (event) => {
  const { quote } = await loadOwnQuote(event)
  const pdf = await quotePdf(quote)
  setResponseHeaders(event, {
    'content-type': 'application/pdf',
    'content-disposition': `attachment; filename="${quotePdfName(quote)}"`,
    'x-content-type-options': 'nosniff',
    'cache-control': 'private, no-store',
  })
  return pdf
})
