/**
 * When overdue reminders go: BORELINE_OVERDUE_REMINDER_DAYS, days past the due date, comma-separated (default
 * "7,21"; whole days 1-365, at most five). Anything else falls back to the default and says so in the log. Plain Node.
 */
export const DEFAULT_OVERDUE_REMINDER_DAYS = [7, 21] as const

export function overdueReminderDays(raw: string | undefined = process.env.BORELINE_OVERDUE_REMINDER_DAYS): number[] {
  if (raw === undefined || raw.trim() === '') return [...DEFAULT_OVERDUE_REMINDER_DAYS]
  const days = raw.split(',').map((s) => Number(s.trim()))
  if (days.length > 5 || days.some((d) => !Number.isInteger(d) || d < 1 || d > 365)) {
    console.warn(`[boreline] BORELINE_OVERDUE_REMINDER_DAYS="${raw}" is not a list of whole days 1-365; using ${DEFAULT_OVERDUE_REMINDER_DAYS.join(',')}`)
    return [...DEFAULT_OVERDUE_REMINDER_DAYS]
  }
  return [...new Set(days)].sort((a, b) => a - b)
}

/** The largest threshold an item `daysOverdue` days late has reached, or null. */
export function reachedThreshold(daysOverdue: number, thresholds: readonly number[]): number | null {
  const reached = thresholds.filter((d) => daysOverdue >= d)
  return reached.length ? reached[reached.length - 1]! : null
}
