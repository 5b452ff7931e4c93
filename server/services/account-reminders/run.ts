/**
 * The account reminder job: on or after the 1st of a month, each garage on account terms is e-mailed the
 * statement of the month before (PDF attached); and each open item that has reached an overdue threshold
 * (settings.ts, default 7 and 21 days) is named in one reminder to the garage's managers. Every e-mail is claimed
 * first by inserting its row under the unique (garage, kind, about) key in its own write, so two runs at once (the
 * server's timer and `npm run accounts:remind`) never send one twice; the row then says sent or failed, and the
 * admin reads them (list.ts). An item first seen past both thresholds is reminded once, at the higher one (the
 * lower is recorded as passed). Plain Node.
 */
import { UniqueConstraintError } from 'sequelize'
import { Organisation } from '../../models/accounts'
import { AccountReminder, type AccountReminderKind } from '../../models/money-owed'
import { withWrite } from '../../utils/db'
import type { OutgoingMail } from '../../utils/mail'
import type { Formats } from '../../../shared/utils/format'
import type { OpenItem } from '../../../shared/types/money-owed'
import type { PdfFonts } from '../pdf/document'
import { owedNow } from '../account-stop'
import { garageRecipients } from '../trade-accounts'
import { localDate } from '../orders/zoned-time'
import { statementPdfOf } from '../statement-pdf'
import { overdueReminderDays, reachedThreshold } from './settings'
import { overdueMail, statementMail } from './mail'

export interface AccountReminderDeps {
  formats: Formats
  appLink: (path: string) => string
  sendMail: (mail: OutgoingMail) => Promise<boolean>
  fonts: () => Promise<PdfFonts>
}

export interface AccountReminderRun { statements: number; overdue: number; failed: number; noRecipient: number }

interface Claim { kind: AccountReminderKind; about: string; amountMinor: number; passed?: boolean }

/** Inserts the claim rows; false when another run holds any of them (then nothing of this e-mail is sent here). */
async function claim(organisationId: number, claims: readonly Claim[], now: Date): Promise<number[] | null> {
  try {
    return await withWrite(async (t) => {
      const rows = await AccountReminder.bulkCreate(claims.map(({ passed, ...c }) => ({ organisationId, ...c, status: passed ? 'passed' as const : 'sending' as const, claimedAt: now })), { transaction: t })
      return rows.map((r) => r.id)
    })
  } catch (err) {
    if (err instanceof UniqueConstraintError) return null
    throw err
  }
}

async function settle(ids: number[], sent: boolean, recipients: string[], subject: string, now: Date): Promise<void> {
  const status = recipients.length === 0 ? 'no_recipient' : sent ? 'sent' : 'failed'
  await withWrite((t) => AccountReminder.update(
    { status, recipients: recipients.join(', '), subject, sentAt: sent ? now : null, error: sent ? null : recipients.length ? 'The e-mail could not be sent.' : 'The garage has no manager with an e-mail address.' },
    { where: { id: ids, status: 'sending' }, transaction: t },
  ))
}

/** Claims, sends and records one e-mail; the outcome for the run's counts, or null when another run had it. */
async function sendClaimed(org: Organisation, claims: Claim[], mail: () => Promise<Omit<OutgoingMail, 'to'>>, now: Date, deps: AccountReminderDeps): Promise<'sent' | 'failed' | 'noRecipient' | null> {
  const ids = await claim(org.id, claims, now)
  if (!ids) return null
  const to = await garageRecipients(org)
  const body = await mail()
  const sent = to.length > 0 && await deps.sendMail({ to, ...body })
  await settle(ids, sent, to, body.subject, now)
  return to.length === 0 ? 'noRecipient' : sent ? 'sent' : 'failed'
}

/** The month before the one `today` (YYYY-MM-DD) falls in, YYYY-MM. */
export function monthBefore(today: string): string {
  const [y, m] = today.split('-').map(Number) as [number, number]
  return m === 1 ? `${y - 1}-12` : `${y}-${String(m - 1).padStart(2, '0')}`
}

/**
 * Open items that reached a threshold not yet claimed for them, with the threshold each reached, and the claims:
 * the reached threshold and any lower one not yet recorded (so a later run does not send those late).
 */
async function newlyOverdue(org: Organisation, items: readonly OpenItem[], thresholds: readonly number[]): Promise<{ due: { item: OpenItem; days: number }[]; claims: Claim[] }> {
  const reached = items.flatMap((item) => {
    const days = reachedThreshold(item.daysOverdue, thresholds)
    return days === null ? [] : [{ item, days }]
  })
  if (!reached.length) return { due: [], claims: [] }
  const done = new Set((await AccountReminder.findAll({ where: { organisationId: org.id, kind: 'overdue' }, attributes: ['about'] })).map((r) => r.about))
  const due = reached.filter(({ item, days }) => !done.has(`${item.entryId}:${days}`))
  const claims = due.flatMap(({ item, days }) => thresholds.filter((d) => d <= days && !done.has(`${item.entryId}:${d}`))
    .map((d) => ({ kind: 'overdue' as const, about: `${item.entryId}:${d}`, amountMinor: d === days ? item.openMinor : 0, passed: d !== days })))
  return { due, claims }
}

/** One run at `now` (moved forward by the tests and by `npm run accounts:remind -- --now`). */
export async function runAccountReminders(now: Date, deps: AccountReminderDeps): Promise<AccountReminderRun> {
  const fmt = deps.formats
  const clock = { now, timeZone: fmt.timeZone }
  const today = localDate(now, fmt.timeZone)
  const month = monthBefore(today)
  const thresholds = overdueReminderDays()
  const run: AccountReminderRun = { statements: 0, overdue: 0, failed: 0, noRecipient: 0 }
  const count = (o: 'sent' | 'failed' | 'noRecipient' | null, kind: 'statements' | 'overdue') => { if (o) run[o === 'sent' ? kind : o]++ }
  const garages = await Organisation.findAll({ where: { kind: 'garage', paymentTerms: 'account', status: ['approved', 'suspended'] }, order: [['id', 'ASC']] })
  for (const org of garages) {
    const { balanceMinor, items } = await owedNow(org, clock)
    const overdueMinor = items.filter((i) => i.daysOverdue > 0).reduce((s, i) => s + i.openMinor, 0)
    const hasStatement = await AccountReminder.count({ where: { organisationId: org.id, kind: 'statement', about: month } })
    if (!hasStatement) {
      count(await sendClaimed(org, [{ kind: 'statement', about: month, amountMinor: balanceMinor }], async () => ({
        ...statementMail(org.name, month, balanceMinor, overdueMinor, deps.appLink('/statement'), fmt),
        attachments: [{ filename: `statement-${month}.pdf`, content: await statementPdfOf(org.id, month, fmt, await deps.fonts(), clock), contentType: 'application/pdf' }],
      }), now, deps), 'statements')
    }
    const { due, claims } = await newlyOverdue(org, items, thresholds)
    if (!due.length) continue
    count(await sendClaimed(org, claims, async () => overdueMail(org.name, due, deps.appLink('/statement'), fmt), now, deps), 'overdue')
  }
  return run
}
