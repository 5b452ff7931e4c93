/**
 * What each garage still owes, kept by charge in `open_items` instead of worked out from every ledger on each read.
 * Triggers count each write to a garage's ledger, allocations and documents in `open_item_marks.revision`
 * (migration 0021); `refreshOpenItems` works out again, by the statement's own rule (`openItemsOf`, ageing.ts), only
 * the garages written since their items were last worked out, and records the revision it read. A write landing while
 * that runs leaves the revision ahead, so the garage is worked out again next time: the table never claims to be
 * newer than the ledger it came from. What is overdue depends on today and on the garage's payment days, so the
 * ageing itself is done on read, from the open amount and the day the payment days run from. Plain Node.
 */
import type { Ageing } from '../../../shared/types/money-owed'
import { getDb, withWrite } from '../../utils/db'
import { ageingOf, bucketOf, dayPlus, daysPast, openItemsOf } from '../ageing'
import type { ViewClock } from '../orders/clock'
import { localDate } from '../orders/zoned-time'
import { owedLedger } from '../owed-moves'
import { num, rows } from './range'

const FAR_DAY = '9999-12-31'

/** Works out one garage's open items again and records them as of `revision` (read before its ledger was). */
async function workOut(organisationId: number, revision: number, timeZone: string): Promise<void> {
  const { moves, allocations } = await owedLedger(organisationId, timeZone)
  // with no payment days the due day is the day they run from (the invoice's, the booking's, or null)
  const items = openItemsOf(moves, 0, FAR_DAY, allocations)
  await withWrite(async (t) => {
    const db = getDb()
    await db.query('DELETE FROM open_items WHERE organisation_id = :organisationId', { replacements: { organisationId }, transaction: t })
    for (let i = 0; i < items.length; i += 200) {
      const batch = items.slice(i, i + 200)
      const replacements: Record<string, unknown> = { organisationId }
      const values = batch.map((item, k) => {
        Object.assign(replacements, { [`e${k}`]: item.entryId, [`d${k}`]: item.dueOn, [`m${k}`]: item.openMinor })
        return `(:e${k}, :organisationId, :d${k}, :m${k})`
      })
      await db.query(`INSERT INTO open_items (entry_id, organisation_id, due_from, open_minor) VALUES ${values.join(', ')}`, { replacements, transaction: t })
    }
    await db.query('UPDATE open_item_marks SET worked = :revision, time_zone = :timeZone WHERE organisation_id = :organisationId',
      { replacements: { revision, timeZone, organisationId }, transaction: t })
  })
}

/** Brings `open_items` up to date with every ledger; answers how many garages it worked out again. */
export async function refreshOpenItems(timeZone: string): Promise<number> {
  const stale = await rows<{ organisation_id: number; revision: number }>(
    'SELECT organisation_id, revision FROM open_item_marks WHERE worked <> revision OR time_zone <> :timeZone ORDER BY organisation_id', { timeZone },
  )
  for (const m of stale) await workOut(num(m.organisation_id), num(m.revision), timeZone)
  return stale.length
}

interface OpenRow { organisation_id: number; due_from: string | null; open_minor: number; payment_days: number | null }

/** One garage's ageing from the kept items (the same figures as its statement's `ageing`). */
export async function keptAgeingOf(organisationId: number, clock: ViewClock): Promise<Ageing> {
  await refreshOpenItems(clock.timeZone)
  const open = await rows<OpenRow>(`SELECT i.organisation_id, i.due_from, i.open_minor, o.payment_days FROM open_items i
    JOIN organisations o ON o.id = i.organisation_id WHERE i.organisation_id = :organisationId`, { organisationId })
  return ageingByGarage(open, localDate(clock.now, clock.timeZone)).get(organisationId) ?? ageingOf([])
}

/** What every garage on account terms owes today by ageing bucket, and how many of them have something overdue. */
export async function overdueOfAll(clock: ViewClock): Promise<Ageing & { garages: number }> {
  await refreshOpenItems(clock.timeZone)
  const open = await rows<OpenRow>(`SELECT i.organisation_id, i.due_from, i.open_minor, o.payment_days FROM open_items i
    JOIN organisations o ON o.id = i.organisation_id WHERE o.kind = 'garage' AND o.payment_terms = 'account'`, {})
  const total = ageingOf([])
  let owing = 0
  for (const a of ageingByGarage(open, localDate(clock.now, clock.timeZone)).values()) {
    if (a.d1_30 + a.d31_60 + a.d61_90 + a.over90 > 0) owing++
    for (const k of Object.keys(total) as (keyof Ageing)[]) total[k] += a[k]
  }
  return { ...total, garages: owing }
}

/** Each garage's ageing on `today`: due `payment_days` after the day each item runs from; not invoiced = current. */
function ageingByGarage(open: readonly OpenRow[], today: string): Map<number, Ageing> {
  const by = new Map<number, Ageing>()
  for (const r of open) {
    const org = num(r.organisation_id)
    const a = by.get(org) ?? ageingOf([])
    const dueOn = r.due_from === null ? null : dayPlus(r.due_from, num(r.payment_days))
    a[bucketOf(daysPast(dueOn, today))] += num(r.open_minor)
    by.set(org, a)
  }
  return by
}
