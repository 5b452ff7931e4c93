/**
 * Sending a quote to the owner (managers): a new link token (the old one stops working), validity from the
 * garage settings (a resend keeps the validity it had), then the e-mail with the link and the PDF. A decided,
 * expired or replaced quote is not sent (409): it needs a new revision first.
 */
import { Quote } from '../../models/quotes'
import { withWrite } from '../../utils/db'
import { audit } from '../../utils/audit'
import { effectiveQuoteStatus, nextQuoteStatus } from '../../../shared/utils/quote-states'
import { conflict, invalidInput, notFound } from '../errors'
import type { QuoteOutput } from './document'
import { mailQuoteToOwner } from './mail'
import { newQuoteToken } from './references'
import type { QuoteActor } from './revisions'
import { isDecidable, linesOf } from './rows'
import { settingsOf } from './settings'

const DAY_MS = 86_400_000

/** Sends (or sends again) and e-mails the owner; `quote` is reloaded. `mailed` is false when the e-mail failed. */
export async function sendQuote(quote: Quote, actor: QuoteActor, message: string | undefined, out: QuoteOutput): Promise<{ mailed: boolean }> {
  const { user, org } = actor
  const { token } = await withWrite(async (t) => {
    const q = await Quote.findByPk(quote.id, { transaction: t })
    if (!q) throw notFound('Quote')
    const status = effectiveQuoteStatus(q.status, q.expiresAt ?? null)
    if (nextQuoteStatus(status, 'send') !== 'sent') {
      throw conflict(status === 'superseded' ? 'This revision has been replaced: send the latest one.' : 'This quote has been decided or has expired: make a new revision to send it again.')
    }
    const lines = await linesOf(q.id, t)
    if (!lines.some(isDecidable)) throw invalidInput({ lines: 'Add at least one line before sending.' })
    const settings = await settingsOf(org.id, t)
    const now = new Date()
    const link = newQuoteToken()
    const resend = status === 'sent'
    const [changed] = await Quote.update({
      status: 'sent', tokenHash: link.hash, sentAt: now, sentByUserId: user.id,
      expiresAt: resend && q.expiresAt ? q.expiresAt : new Date(now.getTime() + settings.quoteValidityDays * DAY_MS),
      messageToOwner: message ?? q.messageToOwner,
    }, { where: { id: q.id, status: q.status }, transaction: t })
    if (changed !== 1) throw conflict('The quote changed meanwhile. Reload it and try again.')
    await audit(t, { actorUserId: user.id, organisationId: org.id, action: resend ? 'quote.resend' : 'quote.send', entity: 'quote', entityId: q.id, changes: { lines: lines.length } })
    return { token: link.token }
  })
  await quote.reload()
  return { mailed: await mailQuoteToOwner(quote, token, out) }
}
