/**
 * The quote's e-mails, sent after the commit (a failed send is reported, never rolls anything back): to the
 * owner, the link, the garage's note and the PDF; to the garage, the owner's decision line by line, declined safety work first.
 */
import { Organisation, User } from '../../models/accounts'
import type { Quote } from '../../models/quotes'
import { QUOTE_SAFETY_CAUTION, RECOMMENDATION_WORDS } from '../../../shared/utils/quote-wording'
import { quotePdf, type QuoteOutput } from './document'
import { ownerView } from './owner-view'
import { quotePdfName, quoteReference } from './references'

const plate = (q: Pick<Quote, 'registration'>) => (q.registration ? ` (${q.registration})` : '')

/** E-mails the owner the link and the PDF. */
export async function mailQuoteToOwner(q: Quote, token: string, out: QuoteOutput): Promise<boolean> {
  const { money, day } = out.formats
  const [org, pdf, view] = await Promise.all([Organisation.findByPk(q.organisationId), quotePdf(q, out), ownerView(q, out.formats.currency)])
  const garage = org?.name ?? 'Your garage'
  const until = day(q.expiresAt)
  const required = view.lines.filter((l) => l.recommendation === 'required').length
  const text = [
    `Hello ${q.ownerName},`,
    '',
    `${garage} has prepared a quote for your ${view.vehicle}${plate(q)}: ${quoteReference(q)}, ${money(view.totals.grossMinor)} including tax.`,
    required ? `${required} of the lines ${required === 1 ? 'is' : 'are'} marked "${RECOMMENDATION_WORDS.required}": needed for the brakes to be safe.` : '',
    '',
    ...(view.messageToOwner ? [`A note from ${garage}:`, view.messageToOwner, ''] : []),
    'Open this link to see each line, approve or decline it, and sign:',
    out.appLink(`/q/${token}`),
    '',
    until ? `The link works until ${until}. The quote is attached as a PDF.` : 'The quote is attached as a PDF.',
    '',
    QUOTE_SAFETY_CAUTION,
    '',
    `${garage}${org?.phone ? ` · ${org.phone}` : ''}`,
  ].filter((l, i, all) => !(l === '' && all[i - 1] === '')).join('\n')
  return out.sendMail({
    to: q.ownerEmail,
    subject: `Your quote from ${garage}${q.registration ? ` for ${q.registration}` : ''}`,
    text,
    attachments: [{ filename: quotePdfName(q), content: pdf, contentType: 'application/pdf' }],
  })
}

const OUTCOME_WORDS: Record<string, string> = { approved: 'approved', partly_approved: 'partly approved', declined: 'declined' }

/** Who hears of a decision: the person who sent the quote, the garage's own address and, for declined safety work, every manager. */
async function decisionRecipients(q: Quote, org: Organisation | null, everyManager: boolean): Promise<string[]> {
  const [sender, managers] = await Promise.all([
    q.sentByUserId ? User.findByPk(q.sentByUserId) : null,
    everyManager ? User.findAll({ where: { organisationId: q.organisationId, role: 'garage_manager', status: 'active' } }) : [],
  ])
  return [...new Set([sender?.email, org?.email, ...managers.map((m) => m.email)].filter((e): e is string => !!e))]
}

/**
 * Tells the garage the owner has decided, at once (after the commit). Required lines the owner declined come
 * first, in the subject too, with what the owner signed: then every manager hears of it.
 */
export async function mailDecisionToGarage(q: Quote, out: QuoteOutput): Promise<boolean> {
  const [org, view] = await Promise.all([Organisation.findByPk(q.organisationId), ownerView(q, out.formats.currency)])
  const { money, moment } = out.formats
  const unsafe = view.lines.filter((l) => l.decidable && l.needsAcknowledgement && l.ownerDecision === 'declined')
  const to = await decisionRecipients(q, org, unsafe.length > 0)
  if (!to.length) return false
  const outcome = OUTCOME_WORDS[q.status] ?? q.status
  const lines = view.lines.filter((l) => l.decidable).map((l) => `  ${l.ownerDecision === 'approved' ? 'approved' : 'declined'}  ${l.description}  ${money(l.grossMinor)} incl. tax`)
  const declined = unsafe.flatMap((l) => [
    `  ${l.description}`,
    `    signed by ${l.declineAcknowledgement?.signedName ?? view.signedName} on ${moment(l.declineAcknowledgement?.signedAt)}${l.declineAcknowledgement?.address ? ` from ${l.declineAcknowledgement.address}` : ''}`,
  ])
  return out.sendMail({
    to,
    subject: unsafe.length
      ? `Safety work declined: quote ${quoteReference(q)}${plate(q)} ${outcome} by the owner`
      : `Quote ${quoteReference(q)}${plate(q)} ${outcome} by the owner`,
    text: [
      `${q.signedName ?? q.ownerName} ${outcome} quote ${quoteReference(q)} for ${view.vehicle}${plate(q)}.`,
      ...(unsafe.length
        ? ['', `The owner declined ${unsafe.length === 1 ? 'a line' : `${unsafe.length} lines`} marked required for safety, and signed that they were told what it means:`, ...declined]
        : []),
      '',
      ...lines,
      '',
      `Approved total: ${money(view.approvedTotals?.grossMinor ?? 0)} including tax.`,
      '',
      `See it in Boreline: ${out.appLink(`/quotes/${q.id}`)}`,
    ].join('\n'),
  })
}
