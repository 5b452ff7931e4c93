/**
 * The owner's page /q/<token> is rendered on the server with the quote already in it, so a wrong or expired
 * link answers a real 404 (and a throttled one 429) rather than a page that fails later. The check is the same
 * as GET /api/quote-links/:token (throttled by the socket's address, misses counted); the page reads the
 * outcome from `event.context.quoteLink` while rendering.
 */
import type { OwnerQuoteView } from '#shared/types/quotes'
import { ownerView } from '../services/quotes'

declare module 'h3' {
  interface H3EventContext {
    quoteLink?: { view: OwnerQuoteView } | { statusCode: number; message: string }
  }
}

export default defineEventHandler(async (event) => {
  if (event.method !== 'GET' && event.method !== 'HEAD') return
  const m = /^\/q\/([^/?#]*)\/?$/.exec(event.path.split('?')[0]!)
  if (!m) return
  setResponseHeaders(event, { 'x-robots-tag': 'noindex', 'x-frame-options': 'DENY' })
  try {
    // a malformed link (`/q/%E0%A4%A`) is one more link that is not valid: a counted miss and a 404, never a 500
    const { quote } = await loadLinkedQuote(event, decodedOrEmpty(m[1]!))
    event.context.quoteLink = { view: await ownerView(quote, serverFormats().currency) }
  } catch (err) {
    const answer = httpAnswerOf(err)
    if (answer?.statusCode !== 404 && answer?.statusCode !== 429) throw err
    event.context.quoteLink = { statusCode: answer.statusCode, message: answer.message || 'This link is not valid.' }
  }
})

function decodedOrEmpty(segment: string): string {
  try {
    return decodeURIComponent(segment)
  } catch {
    return ''
  }
}
