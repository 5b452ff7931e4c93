/**
 * GET /api/quote-links/:token/pdf  -> the quote as a PDF, for the owner (the same document as the e-mail's)
 * 404 "This link is not valid"; 429.
 */
export default defineEventHandler(async (event) => {
  const { quote } = await loadLinkedQuote(event)
  return sendQuotePdf(event, quote)
})
