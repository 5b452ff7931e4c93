/** Reading request bodies and writing the three kinds of answer the fake gives: JSON, HTML and redirects. */
import type http from 'node:http'

export function readBody(req: http.IncomingMessage, limit = 1_000_000): Promise<string> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = []
    let size = 0
    req.on('data', (c: Buffer) => {
      size += c.length
      if (size > limit) {
        reject(new Error('body too large'))
        req.destroy()
      } else chunks.push(c)
    })
    req.on('end', () => resolve(Buffer.concat(chunks).toString('utf8')))
    req.on('error', reject)
  })
}

export function sendJson(res: http.ServerResponse, status: number, body: unknown, headers: Record<string, string> = {}): void {
  const text = JSON.stringify(body, null, 2)
  // observed SDK behaviour: never send Stripe-Notice (the SDK turns it into a process warning)
  res.writeHead(status, { 'content-type': 'application/json', 'content-length': Buffer.byteLength(text), 'cache-control': 'no-store', ...headers })
  res.end(text)
}

export function sendHtml(res: http.ServerResponse, status: number, html: string): void {
  res.writeHead(status, {
    'content-type': 'text/html; charset=utf-8',
    'content-length': Buffer.byteLength(html),
    'cache-control': 'no-store',
    'content-security-policy': "default-src 'none'; style-src 'unsafe-inline'; form-action 'self' http: https:; base-uri 'none'",
    'x-content-type-options': 'nosniff',
  })
  res.end(html)
}

export function redirect(res: http.ServerResponse, location: string): void {
  res.writeHead(303, { location, 'content-length': 0, 'cache-control': 'no-store' })
  res.end()
}
