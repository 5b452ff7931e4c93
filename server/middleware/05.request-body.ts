/**
 * Every body sent to a JSON route is looked at before any route reads it (OWASP ASVS 5.0 4.1/13: size and type of
 * what is accepted):
 * - a body must be `application/json` (415 for text/plain, a form, XML or no type: a page on another site could
 *   otherwise post a "simple" request without a preflight);
 * - at most BODY_LIMIT bytes: 413 at once when Content-Length says more, and a chunked body (no length) is read only
 *   up to the limit, then refused the same way. What is read is kept for the route (h3 reads it from the request),
 *   so nothing reads a body twice or without a limit.
 * Multipart uploads go to the one upload intake, which streams them to disk under each upload's own limit
 * (server/services/upload-intake.ts); the routes that take one are listed here. The payment webhook is JSON too,
 * and its raw bytes are what the route verifies.
 */
import type { IncomingMessage } from 'node:http'
import { DomainError } from '../services/errors'

export const BODY_LIMIT = 1024 * 1024
const WITH_BODY = new Set(['POST', 'PUT', 'PATCH', 'DELETE'])
// routes whose body is a multipart upload taken by the upload intake (it refuses anything else itself)
const UPLOAD_ROUTES = [
  /^\/api\/trade-applications$/, /^\/api\/garage\/logo$/, /^\/api\/price-files$/,
  /^\/api\/inspections\/\d+\/photos$/, /^\/api\/returns\/\d+\/photos$/,
]
const RAW_BODY = Symbol.for('h3RawBody')

export default defineEventHandler(async (event) => {
  if (!WITH_BODY.has(event.method)) return
  const path = event.path.split('?')[0]!
  if (!path.startsWith('/api/') || (event.method === 'POST' && UPLOAD_ROUTES.some((r) => r.test(path)))) return
  const req = event.node.req
  const declared = Number.parseInt(req.headers['content-length'] ?? '', 10)
  const chunked = /\bchunked\b/i.test(String(req.headers['transfer-encoding'] ?? ''))
  if (!chunked && !(declared > 0)) return // no body: nothing to check
  const type = String(req.headers['content-type'] ?? '').split(';')[0]!.trim().toLowerCase()
  if (type !== 'application/json') throw refused(req, 'unsupported', 'Send the request body as JSON (Content-Type: application/json).')
  if (declared > BODY_LIMIT) throw refused(req, 'too_large', tooLarge)
  const body = await readUpTo(req, BODY_LIMIT)
  if (!body) throw refused(req, 'too_large', tooLarge)
  ;(req as unknown as Record<symbol, unknown>)[RAW_BODY] = Promise.resolve(body)
})

const tooLarge = `The request body is larger than ${BODY_LIMIT / 1024 / 1024} MB.`

/** The whole body when it fits in `limit` bytes, else null (reading stops at the limit). */
function readUpTo(req: IncomingMessage, limit: number): Promise<Buffer | null> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = []
    let size = 0
    const onData = (chunk: Buffer) => {
      size += chunk.length
      if (size > limit) {
        req.off('data', onData)
        req.off('end', onEnd)
        req.pause()
        resolve(null)
        return
      }
      chunks.push(chunk)
    }
    const onEnd = () => resolve(Buffer.concat(chunks))
    req.on('data', onData).once('end', onEnd).once('error', reject)
  })
}

/**
 * The refusal; the rest of the body is read and thrown away so the client gets the answer on a connection that
 * stays usable, but a body that goes on for more than 10 s after the answer loses its connection.
 */
function refused(req: IncomingMessage, kind: 'too_large' | 'unsupported', message: string): DomainError {
  const cut = setTimeout(() => req.socket?.destroy(), 10_000)
  cut.unref()
  req.once('end', () => clearTimeout(cut))
  req.resume()
  return new DomainError(kind, message, { fields: { _: message } })
}
