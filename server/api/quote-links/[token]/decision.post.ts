/**
 * POST /api/quote-links/:token/decision  { lines: [{ id, approved }], signedName }
 * The owner approves or declines every line offered (parts, labour, sundries; a core deposit follows its part,
 * discounts apply to what is approved) and signs with their name. Nothing else can be sent: prices and lines
 * are the garage's (unknown fields are refused, lines not offered on this quote are refused). A required line
 * cannot be declined unless the garage recorded that it told the owner what that means (422 naming the line).
 * Stored with the time and the IP address; the garage is e-mailed; the link then shows the decision read-only.
 * -> OwnerQuoteView. 404 "This link is not valid"; 422 with `data.fields`; 409 already decided or replaced; 429.
 */
import { QuoteDecisionSchema } from '#shared/schemas/quotes'
import { decisionEvent, nextQuoteStatus } from '#shared/utils/quote-states'
import { Quote, QuoteLine } from '../../../models/quotes'
import { checkDecision, isDecidable, linesOf, ownerView } from '../../../services/quotes'

export default defineEventHandler(async (event) => {
  const { quote, address } = await loadLinkedQuote(event)
  const body = await bodyWith(event, QuoteDecisionSchema)
  const decided = await withWrite(async (t) => {
    const q = await Quote.findByPk(quote.id, { transaction: t })
    if (!q) throw quoteLinkNotValid()
    if (q.status === 'superseded') throw conflict('The garage has replaced this quote with a newer one; they will send you the new link.')
    if (q.status !== 'sent') throw conflict('This quote has already been decided.')
    const lines = await linesOf(q.id, t)
    const check = checkDecision(lines, body.lines)
    if (!check.ok) throw invalidInput(check.fields, check.message)
    const offered = lines.filter(isDecidable)
    const status = nextQuoteStatus('sent', decisionEvent(check.approved.size, offered.length))!
    for (const l of offered) {
      await QuoteLine.update({ ownerDecision: check.approved.has(l.id) ? 'approved' : 'declined' }, { where: { id: l.id }, transaction: t })
    }
    const now = new Date()
    const [changed] = await Quote.update({
      status, decidedAt: now, decisionIp: address.slice(0, 64) || null, signedName: body.signedName,
      decisionUserAgent: (getRequestHeader(event, 'user-agent') ?? '').slice(0, 300) || null,
    }, { where: { id: q.id, status: 'sent' }, transaction: t })
    if (changed !== 1) throw conflict('This quote has already been decided.')
    await audit(t, {
      actorUserId: null, organisationId: q.organisationId, action: 'quote.decide', entity: 'quote', entityId: q.id,
      changes: { status, approved: [...check.approved], declined: offered.filter((l) => !check.approved.has(l.id)).map((l) => l.id), ip: address },
    })
    return q
  })
  await decided.reload()
  await mailDecisionToGarage(decided)
  return ownerView(decided, quoteCurrency())
})
