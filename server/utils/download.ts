/**
 * A file the person saves (PDF, CSV): never sniffed, never cached, offered under a name the server made.
 * `inline` shows it in the browser instead of saving it.
 */
import type { H3Event } from 'h3'
import { setResponseHeaders } from 'h3'

export function sendDownload<T extends Buffer | string>(event: H3Event, body: T, file: { name: string; type: string; inline?: boolean }): T {
  setResponseHeaders(event, {
    'content-type': file.type,
    'content-disposition': `${file.inline ? 'inline' : 'attachment'}; filename="${file.name.replace(/["\\\r\n]/g, '')}"`,
    'x-content-type-options': 'nosniff',
    'cache-control': 'private, no-store',
  })
  return body
}
