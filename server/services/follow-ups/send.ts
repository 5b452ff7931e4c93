/**
 * The reminder job: schedule what the owners declined since the last run, then, for every garage vehicle with
 * follow-ups due at `now`, e-mail the owner one reminder with a fresh quote, only when the owner agreed to
 * reminders (otherwise the follow-ups are held, and the garage sees them to call instead). Each vehicle's
 * follow-ups are claimed by a guarded UPDATE in the transaction that makes the quote, so two runs at once (the
 * server's timer and `npm run reminders:run`) never send twice. Plain Node.
 */
import { createHash, randomBytes } from 'node:crypto'
import { Op } from 'sequelize'
import { FollowUp, GarageCustomer, GarageVehicle } from '../../models/garage-vehicles'
import { withWrite } from '../../utils/db'
import { audit } from '../../utils/audit'
import { mailReminder, type ReminderOutput } from './mail'
import { freshQuoteFor } from './new-quote'
import { scheduleFollowUps } from './schedule'

export interface ReminderRun { scheduled: number; sent: number; held: number; failed: number }

export const hashReminderToken = (token: string) => createHash('sha256').update(token, 'utf8').digest('hex')

async function hold(ids: number[], note: string): Promise<void> {
  await withWrite((t) => FollowUp.update({ status: 'held', statusNote: note }, { where: { id: ids, status: 'scheduled' }, transaction: t }))
}

/** Why an owner cannot be e-mailed a reminder, or null. */
function noReminderBecause(owner: GarageCustomer | null | undefined): string | null {
  if (!owner) return 'The vehicle has no owner on record.'
  if (!owner.reminderConsent) return 'The owner has not agreed to reminders: call them instead.'
  if (!owner.email) return 'The owner has no e-mail address on record.'
  return null
}

async function remindOne(v: GarageVehicle, due: FollowUp[], now: Date, out: ReminderOutput): Promise<keyof Omit<ReminderRun, 'scheduled'> | null> {
  const ids = due.map((f) => f.id)
  const why = noReminderBecause(v.customer)
  if (why) { await hold(ids, why); return 'held' }
  const owner = v.customer!
  const unsubscribe = randomBytes(32).toString('base64url')
  const made = await withWrite(async (t) => {
    const [claimed] = await FollowUp.update(
      { status: 'sent', sentAt: now, unsubscribeHash: hashReminderToken(unsubscribe), statusNote: '' },
      { where: { id: ids, status: 'scheduled' }, transaction: t },
    )
    if (claimed !== ids.length) throw new ClaimedElsewhere()
    const fresh = await freshQuoteFor(t, due, v, owner, now)
    if (!fresh.offered) throw new NothingToOffer()
    await FollowUp.update({ newQuoteId: fresh.quote.id }, { where: { id: ids }, transaction: t })
    await audit(t, {
      actorUserId: null, organisationId: v.organisationId, action: 'followUp.send', entity: 'quote', entityId: fresh.quote.id,
      changes: { followUps: ids, fromQuotes: [...new Set(due.map((f) => f.quoteId))], lines: fresh.offered },
    })
    return fresh
  }).catch((err: unknown) => {
    if (err instanceof ClaimedElsewhere) return null
    if (err instanceof NothingToOffer) return 'nothing' as const
    throw err
  })
  if (made === null) return null
  if (made === 'nothing') { await hold(ids, 'None of the declined parts can be priced today: quote them by hand.'); return 'held' }
  const mailed = await mailReminder(out, owner, made.quote, due, { quote: made.token, unsubscribe })
  if (mailed) return 'sent'
  await withWrite((t) => FollowUp.update({ status: 'mail_failed', statusNote: 'The e-mail could not be sent.' }, { where: { id: ids }, transaction: t }))
  return 'failed'
}

class ClaimedElsewhere extends Error {}
class NothingToOffer extends Error {}

/** One run of the job at `now` (moved forward by the tests and by `npm run reminders:run -- --now`). */
export async function runReminders(now: Date, out: ReminderOutput): Promise<ReminderRun> {
  const run: ReminderRun = { scheduled: await scheduleFollowUps(), sent: 0, held: 0, failed: 0 }
  const due = await FollowUp.findAll({ where: { status: 'scheduled', dueAt: { [Op.lte]: now } }, order: [['dueAt', 'ASC'], ['id', 'ASC']] })
  const byVehicle = new Map<number, FollowUp[]>()
  for (const f of due) byVehicle.set(f.garageVehicleId, [...(byVehicle.get(f.garageVehicleId) ?? []), f])
  for (const [vehicleId, followUps] of byVehicle) {
    const v = await GarageVehicle.findByPk(vehicleId, { include: [{ model: GarageCustomer, as: 'customer' }] })
    if (!v) continue
    const outcome = await remindOne(v, followUps, now, out)
    if (outcome) run[outcome]++
  }
  return run
}
