/**
 * What a garage still owes, item by item, and whether its trade account is on stop (shared by the statement API,
 * its screen and the admin's view). Amounts in minor units; days are local calendar days, YYYY-MM-DD.
 */

export type AgeingBucket = 'current' | 'd1_30' | 'd31_60' | 'd61_90' | 'over90'
export type Ageing = Record<AgeingBucket, number>

export const AGEING_BUCKETS: readonly AgeingBucket[] = ['current', 'd1_30', 'd31_60', 'd61_90', 'over90']

export const AGEING_LABELS: Record<AgeingBucket, string> = {
  current: 'Not yet due', d1_30: '1-30 days overdue', d31_60: '31-60 days overdue', d61_90: '61-90 days overdue', over90: 'Over 90 days overdue',
}

export interface OpenItem {
  entryId: number
  reference: string
  description: string
  bookedOn: string
  /** the invoice that charged it and its date; null when its order is not invoiced yet (or it has no document) */
  invoice: string | null
  invoicedOn: string | null
  /** payment days after the invoice's date (the booked day when it has no document); null until it is invoiced */
  dueOn: string | null
  amountMinor: number
  paidMinor: number
  openMinor: number
  /** whole days past the due date, 0 when not yet overdue */
  daysOverdue: number
  bucket: AgeingBucket
}

/** A trade account's stop: why orders on account are refused, and what to pay to end it. */
export interface AccountStop {
  onStop: boolean
  /** sentences for a person, empty when not on stop */
  reasons: string[]
  /** paying this much (oldest items first) ends every reason */
  amountToClearMinor: number
  overLimitMinor: number
  /** open amount on items overdue by more than `stopAfterDays` */
  longOverdueMinor: number
  stopAfterDays: number
  /** an admin's lift in force: orders on account allowed until the end of `until` despite the reasons */
  lift: { until: string; reason: string } | null
}

export type AccountReminderKind = 'statement' | 'overdue'
/** `passed`: a lower overdue threshold an item was already past when first seen; recorded, never e-mailed */
export type AccountReminderStatus = 'sending' | 'sent' | 'failed' | 'no_recipient' | 'passed'

export const ACCOUNT_REMINDER_KIND_LABELS: Record<AccountReminderKind, string> = { statement: 'Monthly statement', overdue: 'Overdue reminder' }
export const ACCOUNT_REMINDER_STATUS_LABELS: Record<AccountReminderStatus, string> = {
  sending: 'Being sent', sent: 'Sent', passed: 'Covered by a later reminder', failed: 'Not sent (mail failed)', no_recipient: 'Not sent (no manager e-mail)',
}

/** One e-mail about money owed, as the admin reads it: an overdue reminder names the items (one row each). */
export interface AccountReminderView {
  id: number
  garage: { id: number; name: string }
  kind: AccountReminderKind
  kindLabel: string
  /** the statement's month (YYYY-MM), or "<n> days overdue" */
  about: string
  status: AccountReminderStatus
  statusLabel: string
  recipients: string
  subject: string
  amountMinor: number
  claimedAt: string
  sentAt: string | null
}
