/**
 * GET /api/quote-links/:token/pdf  -> the quote as a PDF, for the owner (the same document as the e-mail's)
 * 404 "This link is not valid"; 429.
 */
export default defineEventHandler(async (event) => {
  const { quote } = await loadLinkedQuote(event)
  const pdf = await quotePdf(quote)
  setResponseHeaders(event, {
    'content-type': 'application/pdf',
    'content-disposition': `attachment; filename="${quotePdfName(quote)}"`,
    'x-content-type-options': 'nosniff',
  })
  return pdf
})
