/**
 * Nitro-side helpers for the quote routes (auto-imported): the currency, the PDF with the fonts shipped as
 * server assets, the e-mails, and mapping the quote service's errors onto HTTP answers.
 */
import type { H3Event } from 'h3'
import { getRequestIP, getRouterParams, setResponseHeader, setResponseHeaders } from 'h3'
import { Organisation, User } from '../models/accounts'
import { Quote } from '../models/quotes'
import { expireDueQuotes, findQuoteOf, hashQuoteToken, ownerView, quoteDetail, quoteReference, settingsOf } from '../services/quotes'
import { QuoteParamsSchema, QuoteTokenParamsSchema } from '../../shared/schemas/quotes'
import { renderQuotePdf } from '../services/quote-pdf'
import { pdfFonts } from './pdf-fonts'
import { readLogo } from '../services/garage-logo'
import { admitLinkRequest, countLinkMiss } from '../services/quote-link-throttle'
import { formatMinor } from '../../shared/utils/money'
import { QUOTE_SAFETY_CAUTION } from '../../shared/utils/quote-wording'
import { can, type Ability } from '../../shared/utils/abilities'
import { paramsWith } from './validate'
import { DomainError, forbidden, notFound } from '../services/errors'
import { requireAuth, type AuthContext } from './auth'
import { appLink, sendMail } from './mail'

export function quoteCurrency(): string {
  return String(useRuntimeConfig().public.currency || 'GBP')
}

export function quoteLocale(): string {
  return String(useRuntimeConfig().public.locale || 'en-GB')
}

/** The quote as the owner sees it, rendered to PDF. */
export async function quotePdf(q: Quote): Promise<Buffer> {
  const [view, org, settings, f] = await Promise.all([
    ownerView(q, quoteCurrency()),
    Organisation.findByPk(q.organisationId),
    settingsOf(q.organisationId),
    pdfFonts(),
  ])
  const uploads = String(useRuntimeConfig().uploadsDir)
  const logoData = settings.logoFile ? await readLogo(uploads, settings.logoFile) : null
  return renderQuotePdf(view, {
    name: org?.name ?? '', address: org?.tradingAddress ?? '', phone: org?.phone ?? '', email: org?.email ?? '', taxNumber: org?.taxNumber ?? '',
  }, f, logoData && settings.logoMime ? { data: logoData, mime: settings.logoMime } : null, quoteLocale())
}

export function quotePdfName(q: Pick<Quote, 'number' | 'revision'>): string {
  return `quote-${quoteReference(q).replace(/\s+/g, '-').toLowerCase()}.pdf`
}

/** E-mails the owner the link and the PDF (after the commit; a failed send is reported, never rolls back). */
export async function mailQuoteToOwner(q: Quote, token: string): Promise<boolean> {
  const [org, pdf, view] = await Promise.all([Organisation.findByPk(q.organisationId), quotePdf(q), ownerView(q, quoteCurrency())])
  const link = appLink(`/q/${token}`)
  const garage = org?.name ?? 'Your garage'
  const until = q.expiresAt ? new Intl.DateTimeFormat(quoteLocale(), { dateStyle: 'long' }).format(q.expiresAt) : ''
  const required = view.lines.filter((l) => l.recommendation === 'required').length
  const text = [
    `Hello ${q.ownerName},`,
    '',
    `${garage} has prepared a quote for your ${view.vehicle}${q.registration ? ` (${q.registration})` : ''}: ${quoteReference(q)}, ${formatMinor(view.totals.grossMinor, view.currency, quoteLocale())} including tax.`,
    required ? `${required} of the lines ${required === 1 ? 'is' : 'are'} marked as required for safety.` : '',
    '',
    'Open this link to see each line, approve or decline it, and sign:',
    link,
    '',
    until ? `The link works until ${until}. The quote is attached as a PDF.` : 'The quote is attached as a PDF.',
    '',
    QUOTE_SAFETY_CAUTION,
    '',
    `${garage}${org?.phone ? ` · ${org.phone}` : ''}`,
  ].filter((l, i, all) => !(l === '' && all[i - 1] === '')).join('\n')
  return sendMail({
    to: q.ownerEmail,
    subject: `Your quote from ${garage}${q.registration ? ` for ${q.registration}` : ''}`,
    text,
    attachments: [{ filename: quotePdfName(q), content: pdf, contentType: 'application/pdf' }],
  })
}

/** Tells the garage the owner has decided (the sender and the garage's own address). */
export async function mailDecisionToGarage(q: Quote): Promise<boolean> {
  const [org, sender, view] = await Promise.all([
    Organisation.findByPk(q.organisationId),
    q.sentByUserId ? User.findByPk(q.sentByUserId) : null,
    ownerView(q, quoteCurrency()),
  ])
  const to = [...new Set([sender?.email, org?.email].filter((e): e is string => !!e))]
  if (!to.length) return false
  const money = (m: number) => formatMinor(m, view.currency, quoteLocale())
  const outcome = { approved: 'approved', partly_approved: 'partly approved', declined: 'declined' }[q.status as 'approved'] ?? q.status
  const lines = view.lines.filter((l) => l.decidable).map((l) => `  ${l.ownerDecision === 'approved' ? 'approved' : 'declined'}  ${l.description}  ${money(l.amountMinor)}`)
  return sendMail({
    to,
    subject: `Quote ${quoteReference(q)}${q.registration ? ` (${q.registration})` : ''} ${outcome} by the owner`,
    text: [
      `${q.signedName ?? q.ownerName} ${outcome} quote ${quoteReference(q)} for ${view.vehicle}${q.registration ? ` (${q.registration})` : ''}.`,
      '',
      ...lines,
      '',
      `Approved total: ${money(view.approvedTotals?.grossMinor ?? 0)} including tax.`,
      '',
      `See it in Boreline: ${appLink(`/quotes/${q.id}`)}`,
    ].join('\n'),
  })
}

/** 403 unless the role may price (managers). */
export function requirePricing(event: H3Event, what = 'change prices'): void {
  const auth = requireAuth(event)
  if (!can(auth.user.role, 'quotes.price')) {
    throw forbidden(`Only a garage manager can ${what}.`)
  }
}

/** The plain answer for a wrong, expired or unknown owner's link. */
export function quoteLinkNotValid(): Error {
  return new DomainError('not_found', 'This link is not valid.')
}

/**
 * Throttles the owner's link routes by the socket's address (429 when over); returns the address.
 * Call `quoteLinkMiss(address)` when the token turns out not valid.
 */
export async function admitQuoteLink(event: H3Event): Promise<string> {
  const address = getRequestIP(event) ?? ''
  const wait = await admitLinkRequest(address)
  if (wait !== null) {
    const minutes = Math.ceil(wait / 60)
    throw new DomainError('too_many', `Too many tries from this connection. Please wait ${minutes} minute${minutes === 1 ? '' : 's'} and open the link from the e-mail again.`, { retryAfterSeconds: wait })
  }
  return address
}

export async function quoteLinkMiss(address: string): Promise<Error> {
  await countLinkMiss(address)
  return quoteLinkNotValid()
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

/** The detail answer for the caller. */
export function quoteAnswer(q: Quote, auth: AuthContext) {
  return quoteDetail(q, { role: auth.user.role, org: auth.org }, quoteCurrency())
}

/**
 * The quote behind an owner's link, or the plain 404 "This link is not valid" (wrong token, or past the
 * quote's validity: the link expires with the quote). Throttled per address; misses are counted.
 */
export async function loadLinkedQuote(event: H3Event, token?: string): Promise<{ quote: Quote; address: string }> {
  setResponseHeaders(event, { 'cache-control': 'no-store', 'referrer-policy': 'no-referrer' })
  const address = await admitQuoteLink(event)
  const parsed = QuoteTokenParamsSchema.safeParse(token === undefined ? getRouterParams(event, { decode: true }) : { token })
  if (!parsed.success) throw await quoteLinkMiss(address)
  const quote = await Quote.findOne({ where: { tokenHash: hashQuoteToken(parsed.data.token) } })
  if (!quote) throw await quoteLinkMiss(address)
  if (quote.expiresAt && quote.expiresAt.getTime() <= Date.now()) {
    await expireDueQuotes({ id: quote.id })
    throw quoteLinkNotValid()
  }
  return { quote, address }
}

/**
 * Streams a garage's stored logo with headers that keep an SVG inert even when opened on its own: nosniff, a
 * CSP with no script, sandboxed. 404 when there is none.
 */
export async function sendGarageLogo(event: H3Event, settings: { logoFile: string | null; logoMime: string | null }, cache = 'private, max-age=300') {
  if (!settings.logoFile || !settings.logoMime) throw notFound('Logo')
  const data = await readLogo(String(useRuntimeConfig().uploadsDir), settings.logoFile)
  if (!data) throw notFound('Logo')
  setResponseHeaders(event, {
    'content-type': settings.logoMime,
    'x-content-type-options': 'nosniff',
    'content-security-policy': "default-src 'none'; style-src 'unsafe-inline'; sandbox",
    'content-disposition': 'inline; filename="logo"',
    'cache-control': cache,
  })
  return data
}
