/**
 * The e-mails of the trade-account life cycle and of a person's sign-in links, as plain data (subject, text,
 * html) that services send after their commit with `sendMail`. Anything that came from a person is escaped
 * before it goes into HTML.
 */
import { escapeHtml } from '@vue/shared'
import type { Formats } from '../../shared/utils/format'
import { ROLE_LABELS, type PaymentTerms, type Role } from '../../shared/types/accounts'

export { escapeHtml }

export interface MailContent { subject: string; text: string; html: string }

/** Paragraphs of text; a paragraph may carry one link, given as [label, url]. */
type Para = string | [string, string]

function compose(subject: string, paras: Para[]): MailContent {
  const text = paras.map((p) => (typeof p === 'string' ? p : `${p[0]}:\n${p[1]}`)).join('\n\n') + '\n\n— Boreline\n'
  const body = paras.map((p) => (typeof p === 'string'
    ? `<p>${escapeHtml(p).replace(/\n/g, '<br>')}</p>`
    : `<p><a href="${escapeHtml(p[1])}">${escapeHtml(p[0])}</a></p>`)).join('')
  const html = `<!doctype html><html lang="en"><body style="font-family:system-ui,sans-serif;color:#1b2430;max-width:36rem">${body}<p style="color:#5b6878">— Boreline</p></body></html>`
  return { subject: `Boreline: ${subject}`, text, html }
}


/** The payment terms in a sentence; `money` writes an amount (`serverFormats().money`). */
export function termsSentence(terms: PaymentTerms, creditLimitMinor: number, paymentDays: number, money: (minor: number) => string): string {
  return terms === 'account'
    ? `Trade account: credit limit ${money(creditLimitMinor)}, payment within ${paymentDays} days.`
    : 'Payment by card when you order.'
}

export const accountMail = {
  applicationReceived(o: { contactName: string; businessName: string; statusUrl: string }): MailContent {
    return compose('we have your trade account application', [
      `Hello ${o.contactName},`,
      `Thank you for applying for a trade account for ${o.businessName}. The distributor checks every application and its proof-of-trade document by hand; you will get an e-mail as soon as a decision is made.`,
      ['Sign in any time to see where your application stands', o.statusUrl],
    ])
  },
  applicationNotice(o: { businessName: string; contactName: string; email: string; reviewUrl: string }): MailContent {
    return compose(`new trade account application from ${o.businessName}`, [
      `${o.businessName} (${o.contactName}, ${o.email}) has applied for a trade account and is waiting for a decision.`,
      ['Review the application', o.reviewUrl],
    ])
  },
  approved(o: { businessName: string; tierName: string; percentBp: number; terms: string; signInUrl: string }): MailContent {
    return compose('your trade account is open', [
      `Good news: ${o.businessName} is approved as a trade account.`,
      `Discount tier: ${o.tierName} (${o.percentBp / 100} % off list prices).\n${o.terms}`,
      ['Sign in to start', o.signInUrl],
    ])
  },
  rejected(o: { businessName: string; reason: string; applyUrl: string }): MailContent {
    return compose('your trade account application was not approved', [
      `We are sorry: the application for ${o.businessName} was not approved.`,
      `Reason given by the distributor:\n${o.reason}`,
      ['You are welcome to apply again with updated details', o.applyUrl],
    ])
  },
  suspended(o: { businessName: string; reason: string }): MailContent {
    return compose('your trade account is suspended', [
      `The trade account of ${o.businessName} has been suspended, so ordering and quoting are paused.`,
      `Reason given by the distributor:\n${o.reason}`,
      'Please contact the distributor to resolve this.',
    ])
  },
  reactivated(o: { businessName: string; signInUrl: string }): MailContent {
    return compose('your trade account is active again', [
      `The trade account of ${o.businessName} is active again.`,
      ['Sign in', o.signInUrl],
    ])
  },
  paymentReceived(o: { businessName: string; amountMinor: number; reference: string; receivedOn: string; balanceMinor: number; availableMinor: number | null; statementUrl: string }, formats: Pick<Formats, 'money'>): MailContent {
    const m = formats.money
    return compose(`payment of ${m(o.amountMinor)} received`, [
      `The distributor has booked a payment of ${m(o.amountMinor)} from ${o.businessName} to your trade account (reference ${o.reference}, received ${o.receivedOn}).`,
      `Balance now owed: ${m(o.balanceMinor)}.${o.availableMinor === null ? '' : ` Credit available for orders on account: ${m(o.availableMinor)}.`}`,
      ['Your statement', o.statementUrl],
    ])
  },
  termsChanged(o: { businessName: string; tierName: string; percentBp: number; terms: string }): MailContent {
    return compose('your trade terms have changed', [
      `The distributor has updated the terms of ${o.businessName}.`,
      `Discount tier: ${o.tierName} (${o.percentBp / 100} % off list prices).\n${o.terms}`,
    ])
  },
  resetLink(o: { name: string; url: string }): MailContent {
    return compose('reset your password', [
      `Hello ${o.name},`,
      'Someone (hopefully you) asked to reset the password of your Boreline account. The link works once, for one hour. Setting a new password signs you out everywhere else.',
      ['Choose a new password', o.url],
      'If you did not ask for this, ignore this e-mail: your password stays as it is.',
    ])
  },
  invitation(o: { name: string; inviter: string; organisation: string; role: Role; url: string }): MailContent {
    return compose(`${o.inviter} invited you to ${o.organisation}`, [
      `Hello ${o.name},`,
      `${o.inviter} has invited you to join ${o.organisation} on Boreline as ${ROLE_LABELS[o.role].toLowerCase()}.`,
      ['Set your password to accept (the link works once, for 7 days)', o.url],
    ])
  },
  secondFactorReset(o: { name: string; by: string; signInUrl: string }): MailContent {
    return compose('your two-step sign-in was reset', [
      `Hello ${o.name},`,
      `${o.by} has reset the two-step sign-in of your Boreline account, so your authenticator app and recovery codes no longer work for it, and you have been signed out everywhere.`,
      ['Sign in with your password; distributor staff then set up two-step sign-in again', o.signInUrl],
      'If you did not ask for this, tell your administrator.',
    ])
  },
  secondFactorChanged(o: { name: string; what: string }): MailContent {
    return compose('two-step sign-in changed on your account', [
      `Hello ${o.name},`,
      `${o.what} If this was not you, sign in and change your password, or ask your administrator to reset your two-step sign-in.`,
    ])
  },
  applicationWithKnownEmail(o: { signInUrl: string; resetUrl: string }): MailContent {
    return compose('a trade account application used your e-mail address', [
      'Hello,',
      'Someone has just applied for a Boreline trade account with this e-mail address, which already belongs to an account. Nothing was created for that application.',
      ['If it was you, sign in with your existing account', o.signInUrl],
      ['Forgotten your password? Choose a new one', o.resetUrl],
      'If it was not you, you need not do anything.',
    ])
  },
}
