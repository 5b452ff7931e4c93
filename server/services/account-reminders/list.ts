/** The e-mails about money owed, newest first, a page at a time, for the distributor admin. Plain Node. */
import { Op, type WhereOptions } from 'sequelize'
import { Organisation } from '../../models/accounts'
import { AccountReminder } from '../../models/money-owed'
import { pageOf } from '../../utils/page'
import type { AccountReminderListQuery } from '../../../shared/schemas/money-owed'
import { ACCOUNT_REMINDER_KIND_LABELS, ACCOUNT_REMINDER_STATUS_LABELS, type AccountReminderView } from '../../../shared/types/money-owed'
import type { Page } from '../../../shared/types/page'

type Row = AccountReminder & { organisation?: Organisation }

const aboutOf = (r: AccountReminder) => (r.kind === 'statement' ? r.about : `${r.about.split(':')[1]} days overdue`)

export function listAccountReminders(query: AccountReminderListQuery): Promise<Page<AccountReminderView>> {
  // the lower thresholds recorded as passed when an item was first seen later are not e-mails: not listed
  const where: WhereOptions<AccountReminder> = {
    status: { [Op.ne]: 'passed' },
    ...(query.garageId ? { organisationId: query.garageId } : {}),
    ...(query.kind ? { kind: query.kind } : {}),
  }
  return pageOf(query, (window) => AccountReminder.findAndCountAll({
    where, include: [{ model: Organisation, as: 'organisation', attributes: ['id', 'name'] }],
    order: [['claimedAt', 'DESC'], ['id', 'DESC']], ...window,
  }), (rows) => (rows as Row[]).map((r) => ({
    id: r.id, garage: { id: r.organisationId, name: r.organisation?.name ?? '' }, kind: r.kind, kindLabel: ACCOUNT_REMINDER_KIND_LABELS[r.kind],
    about: aboutOf(r), status: r.status, statusLabel: ACCOUNT_REMINDER_STATUS_LABELS[r.status], recipients: r.recipients, subject: r.subject,
    amountMinor: r.amountMinor, claimedAt: r.claimedAt.toISOString(), sentAt: r.sentAt ? r.sentAt.toISOString() : null,
  })))
}
