/**
 * The reminder e-mail: what was recommended and not done, the link to the fresh quote, and a link that stops
 * reminders without signing in. Sent after the commit; a failed send is recorded, never rolls anything back.
 */
import { Organisation } from '../../models/accounts'
import type { FollowUp, GarageCustomer } from '../../models/garage-vehicles'
import type { Quote } from '../../models/quotes'
import type { OutgoingMail } from '../../utils/mail'
import type { Formats } from '../../../shared/utils/format'
import { QUOTE_SAFETY_CAUTION } from '../../../shared/utils/quote-wording'

export interface ReminderOutput {
  formats: Formats
  sendMail: (mail: OutgoingMail) => Promise<boolean>
  appLink: (path: string) => string
}

export async function mailReminder(
  out: ReminderOutput, owner: GarageCustomer, quote: Quote, followUps: FollowUp[], links: { quote: string; unsubscribe: string },
): Promise<boolean> {
  const org = await Organisation.findByPk(quote.organisationId)
  const garage = org?.name ?? 'Your garage'
  const plate = quote.registration ? ` (${quote.registration})` : ''
  const required = followUps.some((f) => f.recommendation === 'required')
  const text = [
    `Hello ${owner.name},`,
    '',
    `At your last visit ${garage} recommended some work on your ${quote.vehicleLabel || 'vehicle'}${plate} that has not been done yet:`,
    ...followUps.map((f) => `  - ${f.description}${f.recommendation === 'required' ? ' (needed for the brakes to be safe)' : ''}`),
    '',
    required ? 'Some of it is needed for your brakes to be safe: please do not leave it long.' : '',
    'We have prepared a new quote at today\'s prices. Open this link to see it, approve or decline each line, and sign:',
    out.appLink(`/q/${links.quote}`),
    quote.expiresAt ? `The link works until ${out.formats.day(quote.expiresAt)}.` : '',
    '',
    QUOTE_SAFETY_CAUTION,
    '',
    `${garage}${org?.phone ? ` · ${org.phone}` : ''}`,
    '',
    'You are receiving this because you agreed to reminders from us. To stop them, open this link (no sign-in needed):',
    out.appLink(`/reminders/stop/${links.unsubscribe}`),
  ].filter((l, i, all) => !(l === '' && all[i - 1] === '')).join('\n')
  return out.sendMail({ to: owner.email, subject: `A reminder from ${garage}${plate}: work still to do`, text })
}
