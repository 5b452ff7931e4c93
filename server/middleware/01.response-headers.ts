/**
 * What every answer says about caching and framing, beside the headers of the security module (nuxt-security,
 * nuxt.config.ts: CSP with nonces on pages, nosniff, Referrer-Policy, HSTS, no X-Powered-By):
 * - API answers and pages are never stored by a browser or a proxy (`Cache-Control: no-store`): they carry a
 *   person's prices, orders and details. Built assets under /_nuxt/ keep their own long caching. A route may still
 *   set its own caching afterwards (a garage's logo does).
 * - API answers carry a CSP of their own that allows nothing (OWASP's advice for APIs): a JSON answer opened as a
 *   page runs nothing and cannot be framed. Routes that serve a document set theirs.
 */
const API_CSP = "default-src 'none'; frame-ancestors 'none'; base-uri 'none'; form-action 'none'"

export default defineEventHandler((event) => {
  const path = event.path.split('?')[0]!
  if (path.startsWith('/api/')) {
    setResponseHeaders(event, { 'cache-control': 'no-store', 'content-security-policy': API_CSP })
    return
  }
  // built and public assets (a dot in the name) keep their caching; pages and the owner's link do not
  if (path.startsWith('/_nuxt/') || (path.includes('.') && !path.startsWith('/q/'))) return
  setResponseHeader(event, 'cache-control', 'no-store')
})
