/**
 * Local mail catcher: SMTP (smtp-server) in, parsed (mailparser) into memory, read back over HTTP.
 *   GET    /messages        caught messages as JSON: [{ id, to, subject, text, html, date, attachments }]
 *   GET    /messages?to=x   only those addressed to x
 *   DELETE /messages        forget them all (tests)
 *   GET    /                a page listing them, newest first
 */
import { createServer, type Server } from 'node:http'
import type { AddressInfo } from 'node:net'
import { simpleParser } from 'mailparser'
import { SMTPServer } from 'smtp-server'

export interface CaughtMessage {
  id: number
  to: string[]
  from: string
  subject: string
  text: string
  html: string
  date: string
  attachments: { filename: string; contentType: string; size: number; contentBase64: string }[]
}

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`)

export function createMailCatcher(options: { smtpPort?: number; httpPort?: number; host?: string } = {}) {
  const host = options.host ?? '127.0.0.1'
  const messages: CaughtMessage[] = []
  let nextId = 1

  const smtp = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    size: 30 * 1024 * 1024,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((mail) => {
          const rcpt = session.envelope.rcptTo.map((r) => r.address.toLowerCase())
          messages.push({
            id: nextId++,
            to: rcpt,
            from: mail.from?.text ?? '',
            subject: mail.subject ?? '',
            text: mail.text ?? '',
            html: typeof mail.html === 'string' ? mail.html : '',
            date: (mail.date ?? new Date()).toISOString(),
            attachments: mail.attachments.map((a) => ({
              filename: a.filename ?? '', contentType: a.contentType, size: a.size, contentBase64: a.content.toString('base64'),
            })),
          })
          callback()
        })
        .catch((err: Error) => callback(err))
    },
  })

  const http: Server = createServer((req, res) => {
    const url = new URL(req.url ?? '/', 'http://x')
    if (url.pathname === '/messages' && req.method === 'DELETE') {
      messages.length = 0
      res.writeHead(204).end()
      return
    }
    if (url.pathname === '/messages' && req.method === 'GET') {
      const to = url.searchParams.get('to')?.toLowerCase()
      const list = to ? messages.filter((m) => m.to.includes(to)) : messages
      res.writeHead(200, { 'content-type': 'application/json' }).end(JSON.stringify(list))
      return
    }
    if (url.pathname === '/' && req.method === 'GET') {
      const rows = [...messages].reverse().map((m) => `<article><h2>${esc(m.subject)}</h2><p><b>To:</b> ${esc(m.to.join(', '))} · <time>${esc(m.date)}</time>${m.attachments.length ? ` · ${m.attachments.length} attachment(s)` : ''}</p><pre>${esc(m.text)}</pre></article>`).join('')
      res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' })
        .end(`<!doctype html><html lang="en"><meta charset="utf-8"><title>Boreline mail catcher</title><style>body{font:14px system-ui;margin:2rem;max-width:60rem}article{border-top:1px solid #ccc;padding:.5rem 0}pre{white-space:pre-wrap}</style><h1>Caught e-mail (${messages.length})</h1>${rows || '<p>Nothing caught yet.</p>'}</html>`)
      return
    }
    res.writeHead(404, { 'content-type': 'application/json' }).end('{"error":"not found"}')
  })

  return {
    messages,
    async listen(): Promise<{ smtpPort: number; httpPort: number }> {
      await new Promise<void>((r, j) => { smtp.once('error', j); smtp.listen(options.smtpPort ?? 1025, host, () => r()) })
      await new Promise<void>((r, j) => { http.once('error', j); http.listen(options.httpPort ?? 8025, host, () => r()) })
      const smtpPort = (smtp.server.address() as AddressInfo).port
      const httpPort = (http.address() as AddressInfo).port
      return { smtpPort, httpPort }
    },
    async close(): Promise<void> {
      await new Promise<void>((r) => smtp.close(() => r()))
      await new Promise<void>((r) => http.close(() => r()))
    },
  }
}
