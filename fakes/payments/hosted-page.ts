/**
 * The hosted payment page at a Checkout Session's `url` (`/pay/:id`): a person types a test card; paying
 * completes the session, sends `checkout.session.completed` and redirects to `success_url`; a decline or a
 * mistyped number is shown beside the field and the session stays open; cancel goes back to `cancel_url`.
 */
import type http from 'node:http'
import { DECLINED } from './cards'
import type { Fake } from './context'
import { decodedOrRaw } from './form'
import { closedPage, page, payPage } from './hosted-page-html'
import { readBody, redirect, sendHtml } from './http'
import { paySession, successUrl, sweepExpired } from './session-lifecycle'
import { logRequest } from './store'

type Answer = { status: number; html: string } | { status: 303; location: string }

const notAllowed: Answer = { status: 405, html: page('Not allowed', '<h1>Not allowed</h1>') }

/** Waits for the first delivery attempt (bounded), so a redirected browser usually finds the order settled. */
async function settle(fake: Fake, delivered: Promise<unknown> | undefined): Promise<void> {
  if (!delivered) return
  let timer: NodeJS.Timeout | undefined
  await Promise.race([delivered, new Promise((r) => { timer = setTimeout(r, fake.state.config.webhookTimeoutMs + 500) })])
  if (timer) clearTimeout(timer)
}

async function answer(fake: Fake, path: string, method: string, cardInput: string): Promise<Answer> {
  const m = /^\/pay\/([^/]+)(\/cancel)?$/.exec(path)
  const session = m ? fake.state.sessions.get(decodeURIComponent(m[1] as string)) : undefined
  if (!m || !session) return { status: 404, html: page('Not found', '<h1>No such checkout</h1><p>This payment link is not known.</p>') }
  if (m[2]) {
    if (method !== 'GET') return notAllowed
    // Leaving the page does not end the session; it stays open until it expires (API reference, from memory).
    if (session.cancel_url) return { status: 303, location: session.cancel_url }
    return { status: 200, html: page('Payment cancelled', '<h1>Payment cancelled</h1><p>Nothing was charged.</p>') }
  }
  const lineItems = fake.state.lineItems.get(session.id) ?? []
  if (method === 'GET') return { status: 200, html: session.status === 'open' ? payPage(session, lineItems, null) : closedPage(session) }
  if (method !== 'POST') return notAllowed
  if (session.status !== 'open') return { status: 409, html: closedPage(session) }
  if (cardInput.trim() === '') return { status: 400, html: payPage(session, lineItems, 'Enter a card number.') }
  const result = paySession(fake, session, cardInput)
  if (result.invalid) return { status: 400, html: payPage(session, lineItems, result.invalid, cardInput) }
  if (!result.ok) {
    return { status: 402, html: payPage(session, lineItems, result.intent?.last_payment_error?.message ?? DECLINED, cardInput) }
  }
  await settle(fake, result.delivered)
  if (session.success_url) return { status: 303, location: successUrl(session) }
  return { status: 200, html: closedPage(session) }
}

/** The handler of every `/pay/` request. The log keeps only the card's last four digits. */
export function hostedPageHandler(fake: Fake): (req: http.IncomingMessage, res: http.ServerResponse, url: URL) => Promise<void> {
  return async (req, res, url) => {
    const method = req.method ?? 'GET'
    const raw = method === 'POST' ? await readBody(req, 10_000) : ''
    const cardInput = new URLSearchParams(raw).get('card') ?? ''
    const digits = cardInput.replace(/\D/g, '')
    const entry = logRequest(fake.state, {
      at: new Date().toISOString(), method, path: url.pathname, query: decodedOrRaw(url.search.slice(1)), idempotencyKey: null,
      body: method === 'POST' ? { card: digits.length >= 4 ? `**** ${digits.slice(-4)}` : cardInput } : {},
    })
    sweepExpired(fake)
    const a = await answer(fake, url.pathname, method, cardInput)
    entry.status = a.status
    if ('location' in a) redirect(res, a.location)
    else sendHtml(res, a.status, a.html)
  }
}
