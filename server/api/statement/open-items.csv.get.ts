/**
 * GET /api/statement/open-items.csv -> what the caller's garage still owes as a CSV download: each open item with
 * the day it was booked and falls due, days overdue, amount, paid and still open, then the ageing (not yet due,
 * 1-30, 31-60, 61-90, over 90 days overdue) and the total. A suspended garage may still read it. 401; 403 without
 * `statement.view`.
 */
import { openItemsCsv, statementOf } from '../../services/statement'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'statement.view', { allowSuspended: true })
  const clock = requestClock(event)
  const csv = openItemsCsv(await statementOf(org.id, undefined, serverFormats(), clock))
  return sendDownload(event, csv, { name: `still-owed-${clock.now.toISOString().slice(0, 10)}.csv`, type: 'text/csv; charset=utf-8' })
})
