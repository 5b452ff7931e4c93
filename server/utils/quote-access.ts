/**
 * How a request reaches a quote (auto-imported by the quote routes): the caller's own quote (404 when it is
 * not theirs, then the ability: 403), the quote behind an owner's link (throttled per socket address, one plain
 * 404 for every link that is not valid), the quote's PDF and the garage's logo as answers, and what the quote
 * services need from the server around them (formats, fonts, uploads folder, mailer).
 */
import type { H3Event } from 'h3'
import { getRequestIP, getRouterParams, setResponseHeaders } from 'h3'
import { Organisation } from '../models/accounts'
import { Quote } from '../models/quotes'
import { expireDueQuotes, findQuoteOf, hashQuoteToken, linkNotValid, quoteDetail, quotePdf, quotePdfName, type QuoteOutput } from '../services/quotes'
import { readLogo } from '../services/garage-logo'
import { admitLinkRequest, countLinkMiss } from '../services/quote-link-throttle'
import { DomainError, conflict, forbidden, notFound } from '../services/errors'
import { QuoteParamsSchema, QuoteTokenParamsSchema } from '../../shared/schemas/quotes'
import { can, type Ability } from '../../shared/utils/abilities'
import { requireAuth, type AuthContext } from './auth'
import { sendDownload } from './download'
import { serverFormats } from './format'
import { appLink, sendMail } from './mail'
import { pdfFonts } from './pdf-fonts'
import { paramsWith } from './validate'

/** What the quote services need from Nitro to write documents and e-mails. */
export function quoteOutput(event?: H3Event): QuoteOutput {
  return { formats: serverFormats(), fonts: pdfFonts, uploadsDir: String(useRuntimeConfig(event).uploadsDir), sendMail, appLink }
}

/**
 * The caller's own quote for a route: params checked, the row loaded scoped to the caller's garage (404 when
 * it is not theirs, never saying whether it exists), then the ability (403). Validate the body before calling.
 */
export async function loadOwnQuote(event: H3Event, ability: Ability = 'quotes.draft') {
  const auth = requireAuth(event)
  const { id } = paramsWith(event, QuoteParamsSchema)
  const quote = await findQuoteOf(auth.org.id, id)
  if (!quote) throw notFound('Quote')
  if (!can(auth.user.role, ability)) {
    throw forbidden(ability === 'quotes.send' ? 'Only a garage manager can send a quote.' : 'Your role does not allow this.')
  }
  return { auth, quote }
}

/** The detail answer for the caller (trade prices only for those who may see them). */
export function quoteAnswer(q: Quote, auth: AuthContext) {
  return quoteDetail(q, { role: auth.user.role, org: auth.org }, serverFormats().currency)
}

/** The quote's PDF as a download: the same document the owner is e-mailed (no trade prices or markups). */
export async function sendQuotePdf(event: H3Event, quote: Quote) {
  return sendDownload(event, await quotePdf(quote, quoteOutput(event)), { name: quotePdfName(quote), type: 'application/pdf' })
}

/** 429 when the socket's address has tried too often (see quote-link-throttle.ts); returns the address. */
async function admitQuoteLink(event: H3Event): Promise<string> {
  const address = getRequestIP(event) ?? ''
  const wait = await admitLinkRequest(address)
  if (wait !== null) {
    const minutes = Math.ceil(wait / 60)
    throw new DomainError('too_many', `Too many tries from this connection. Please wait ${minutes} minute${minutes === 1 ? '' : 's'} and open the link from the e-mail again.`, { retryAfterSeconds: wait })
  }
  return address
}

async function linkMiss(address: string): Promise<Error> {
  await countLinkMiss(address)
  return linkNotValid()
}

/**
 * The quote behind an owner's link, or the plain 404 "This link is not valid" (wrong token, or past the
 * quote's validity: the link expires with the quote). Throttled per address; misses are counted.
 */
export async function loadLinkedQuote(event: H3Event, token?: string): Promise<{ quote: Quote; address: string }> {
  setResponseHeaders(event, { 'cache-control': 'no-store', 'referrer-policy': 'no-referrer' })
  const address = await admitQuoteLink(event)
  const parsed = QuoteTokenParamsSchema.safeParse(token === undefined ? getRouterParams(event, { decode: true }) : { token })
  if (!parsed.success) throw await linkMiss(address)
  const quote = await Quote.findOne({ where: { tokenHash: hashQuoteToken(parsed.data.token) } })
  if (!quote) throw await linkMiss(address)
  if (quote.expiresAt && quote.expiresAt.getTime() <= Date.now()) {
    await expireDueQuotes({ id: quote.id })
    throw linkNotValid()
  }
  return { quote, address }
}

/**
 * 409 while the garage's trade account is not in good standing (suspended): the owner's decisions are not taken, and
 * the message tells them to contact the garage. The quote itself stays readable.
 */
export async function refuseWhileGarageSuspended(quote: Quote): Promise<void> {
  const org = await Organisation.findByPk(quote.organisationId, { attributes: ['name', 'phone', 'status'] })
  if (!org || org.status === 'approved') return
  throw conflict(`${org.name} cannot take decisions through this link at the moment. Please contact them${org.phone ? ` on ${org.phone}` : ''} directly.`)
}

/**
 * Sends a garage's stored logo with headers that keep an SVG inert even when opened on its own: nosniff, a
 * CSP with no script, sandboxed. 404 when there is none.
 */
export async function sendGarageLogo(event: H3Event, settings: { logoFile: string | null; logoMime: string | null }, cache = 'private, max-age=300') {
  const data = settings.logoFile && settings.logoMime ? await readLogo(String(useRuntimeConfig(event).uploadsDir), settings.logoFile) : null
  if (!data) throw notFound('Logo')
  setResponseHeaders(event, {
    'content-type': settings.logoMime!,
    'x-content-type-options': 'nosniff',
    'content-security-policy': "default-src 'none'; style-src 'unsafe-inline'; sandbox",
    'content-disposition': 'inline; filename="logo"',
    'cache-control': cache,
  })
  return data
}
