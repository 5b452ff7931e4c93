/**
 * The owner's decision through the link: every offered line approved or declined (a required line only when
 * the garage recorded that the owner was told what declining it means), signed with a name, stored with the
 * time and the address it came from, then the garage is e-mailed.
 */
import { Quote, QuoteLine } from '../../models/quotes'
import { withWrite } from '../../utils/db'
import { audit } from '../../utils/audit'
import { decisionEvent, nextQuoteStatus } from '../../../shared/utils/quote-states'
import type { QuoteDecisionInput } from '../../../shared/schemas/quotes'
import { conflict, invalidInput } from '../errors'
import type { QuoteOutput } from './document'
import { mailDecisionToGarage } from './mail'
import { linkNotValid } from './references'
import { isDecidable, linesOf } from './rows'

type Choice = { id: number; approved: boolean }

/** Offered lines the decision must cover, and a check of the owner's choices. */
export function checkDecision(
  lines: QuoteLine[], choices: Choice[],
): { ok: true; approved: Set<number> } | { ok: false; fields: Record<string, string>; message: string } {
  const offered = new Map(lines.filter(isDecidable).map((l) => [l.id, l]))
  const fields: Record<string, string> = {}
  const seen = new Set<number>()
  choices.forEach((c, i) => {
    const line = offered.get(c.id)
    if (!line) { fields[`lines.${i}.id`] = `Line ${c.id} was not offered for a choice on this quote.`; return }
    if (seen.has(c.id)) { fields[`lines.${i}.id`] = `"${line.description}" is chosen twice.`; return }
    seen.add(c.id)
    if (!c.approved && line.recommendation === 'required' && !line.toldOwnerDeclinedRequired) {
      fields[`lines.${i}.approved`] = `"${line.description}" is needed for the brakes to be safe and cannot be declined here. Please call the garage to talk it through.`
    }
  })
  const missing = [...offered.values()].filter((l) => !seen.has(l.id))
  if (missing.length) fields.lines = `Approve or decline every line (still open: ${missing.map((l) => `"${l.description}"`).join(', ')}).`
  if (Object.keys(fields).length) {
    const required = Object.entries(fields).find(([k]) => k.endsWith('.approved'))
    return { ok: false, fields, message: required ? required[1] : Object.values(fields)[0]! }
  }
  return { ok: true, approved: new Set(choices.filter((c) => c.approved).map((c) => c.id)) }
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
    for (const l of offered) {
      await QuoteLine.update({ ownerDecision: check.approved.has(l.id) ? 'approved' : 'declined' }, { where: { id: l.id }, transaction: t })
    }
    const [changed] = await Quote.update({
      status, decidedAt: new Date(), decisionIp: origin.address.slice(0, 64) || null, signedName: input.signedName,
      decisionUserAgent: origin.userAgent.slice(0, 300) || null,
    }, { where: { id: q.id, status: 'sent' }, transaction: t })
    if (changed !== 1) throw conflict('This quote has already been decided.')
    await audit(t, {
      actorUserId: null, organisationId: q.organisationId, action: 'quote.decide', entity: 'quote', entityId: q.id,
      changes: { status, approved: [...check.approved], declined: offered.filter((l) => !check.approved.has(l.id)).map((l) => l.id), ip: origin.address },
    })
    return q
  })
  await decided.reload()
  await mailDecisionToGarage(decided, out)
  return decided
}
