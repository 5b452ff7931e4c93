/**
 * The owner's decision through the link: every offered line approved or declined, signed with a name, stored
 * with the time and the address it came from, then the garage is e-mailed at once. Declining a line marked
 * required takes the owner's signed acknowledgement of the plain statement of what that means: the statement
 * shown, the name, the time, the address and the browser are kept on the line.
 */
import { Quote, QuoteLine } from '../../models/quotes'
import { withWrite } from '../../utils/db'
import { audit } from '../../utils/audit'
import { decisionEvent, nextQuoteStatus } from '../../../shared/utils/quote-states'
import type { QuoteDecisionInput } from '../../../shared/schemas/quotes'
import { signedDeclineText } from '../../../shared/utils/quote-declines'
import { conflict, invalidInput } from '../errors'
import type { QuoteOutput } from './document'
import { mailDecisionToGarage } from './mail'
import { linkNotValid } from './references'
import { isDecidable, linesOf } from './rows'

type Choice = QuoteDecisionInput['lines'][number]
type Acknowledgement = NonNullable<Choice['acknowledgement']>

/** Offered lines the decision must cover, and a check of the owner's choices. */
export function checkDecision(
  lines: QuoteLine[], choices: Choice[],
): { ok: true; approved: Set<number>; acknowledged: Map<number, Acknowledgement> } | { ok: false; fields: Record<string, string>; message: string } {
  const offered = new Map(lines.filter(isDecidable).map((l) => [l.id, l]))
  const fields: Record<string, string> = {}
  const seen = new Set<number>()
  const acknowledged = new Map<number, Acknowledgement>()
  choices.forEach((c, i) => {
    const line = offered.get(c.id)
    if (!line) { fields[`lines.${i}.id`] = `Line ${c.id} was not offered for a choice on this quote.`; return }
    if (seen.has(c.id)) { fields[`lines.${i}.id`] = `"${line.description}" is chosen twice.`; return }
    seen.add(c.id)
    const required = line.recommendation === 'required'
    if (!c.approved && required && !c.acknowledgement) {
      fields[`lines.${i}.acknowledgement`] = `"${line.description}" is needed for the brakes to be safe. To decline it, read what declining means, tick and sign below it.`
    } else if (c.acknowledgement && (c.approved || !required)) {
      fields[`lines.${i}.acknowledgement`] = 'A signed acknowledgement goes only with declining a line marked required.'
    } else if (c.acknowledgement) {
      acknowledged.set(c.id, c.acknowledgement)
    }
  })
  const missing = [...offered.values()].filter((l) => !seen.has(l.id))
  if (missing.length) fields.lines = `Approve or decline every line (still open: ${missing.map((l) => `"${l.description}"`).join(', ')}).`
  if (Object.keys(fields).length) {
    const unsigned = Object.entries(fields).find(([k]) => k.endsWith('.acknowledgement'))
    return { ok: false, fields, message: unsigned ? unsigned[1] : Object.values(fields)[0]! }
  }
  return { ok: true, approved: new Set(choices.filter((c) => c.approved).map((c) => c.id)), acknowledged }
}

/** Where the decision came from: the socket's address and the browser's own description. */
export interface DecisionOrigin { address: string; userAgent: string }

/** Records the owner's decision on a sent quote and tells the garage; returns the decided quote. */
export async function decideQuote(quoteId: number, input: QuoteDecisionInput, origin: DecisionOrigin, out: QuoteOutput): Promise<Quote> {
  const decided = await withWrite(async (t) => {
    const q = await Quote.findByPk(quoteId, { transaction: t })
    if (!q) throw linkNotValid()
    if (q.status === 'superseded') throw conflict('The garage has replaced this quote with a newer one; they will send you the new link.')
    if (q.status !== 'sent') throw conflict('This quote has already been decided.')
    const lines = await linesOf(q.id, t)
    const check = checkDecision(lines, input.lines)
    if (!check.ok) throw invalidInput(check.fields, check.message)
    const offered = lines.filter(isDecidable)
    const status = nextQuoteStatus('sent', decisionEvent(check.approved.size, offered.length))!
    const now = new Date()
    const address = origin.address.slice(0, 64) || null
    const userAgent = origin.userAgent.slice(0, 300) || null
    for (const l of offered) {
      const ack = check.acknowledged.get(l.id)
      await QuoteLine.update({
        ownerDecision: check.approved.has(l.id) ? 'approved' : 'declined',
        ...(ack ? { declineStatement: signedDeclineText(l), declineSignedName: ack.signedName, declineSignedAt: now, declineAddress: address, declineUserAgent: userAgent } : {}),
      }, { where: { id: l.id }, transaction: t })
    }
    const [changed] = await Quote.update({
      status, decidedAt: now, decisionIp: address, signedName: input.signedName, decisionUserAgent: userAgent,
    }, { where: { id: q.id, status: 'sent' }, transaction: t })
    if (changed !== 1) throw conflict('This quote has already been decided.')
    await audit(t, {
      actorUserId: null, organisationId: q.organisationId, action: 'quote.decide', entity: 'quote', entityId: q.id,
      changes: {
        status, approved: [...check.approved], declined: offered.filter((l) => !check.approved.has(l.id)).map((l) => l.id),
        declinedRequired: [...check.acknowledged.keys()], ip: origin.address,
      },
    })
    return q
  })
  await decided.reload()
  await mailDecisionToGarage(decided, out)
  return decided
}
