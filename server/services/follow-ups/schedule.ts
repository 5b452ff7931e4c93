/**
 * Scheduling: every line an owner declined (required or advised) on a decided quote of a garage vehicle gets one
 * follow-up, due the garage's weeks after the decision. It reads the decisions as stored, so the quote code needs
 * no hook: the reminder job and the garage's list call it first. Idempotent (one follow-up per line, a unique key).
 * A quote replaced by a new revision after the decision is left alone: the garage is already talking to the owner.
 * Plain Node.
 */
import { QueryTypes } from 'sequelize'
import { FollowUp } from '../../models/garage-vehicles'
import { getDb, withWrite } from '../../utils/db'
import { followUpWeeks } from './settings'

const WEEK_MS = 7 * 86_400_000

interface Unscheduled {
  lineId: number; quoteId: number; description: string; recommendation: 'required' | 'advised'
  organisationId: number; garageVehicleId: number; decidedAt: string
}

/** Creates the missing follow-ups; returns how many. */
export async function scheduleFollowUps(organisationId?: number): Promise<number> {
  const rows = await getDb().query<Unscheduled>(
    `SELECT l.id AS lineId, l.quote_id AS quoteId, l.description, l.recommendation, q.organisation_id AS organisationId,
            q.garage_vehicle_id AS garageVehicleId, q.decided_at AS decidedAt
       FROM quote_lines l
       JOIN quotes q ON q.id = l.quote_id
       JOIN garage_vehicles gv ON gv.id = q.garage_vehicle_id AND gv.organisation_id = q.organisation_id
       LEFT JOIN follow_ups f ON f.quote_line_id = l.id
      WHERE f.id IS NULL AND l.owner_decision = 'declined' AND l.recommendation IN ('required', 'advised')
        AND q.decided_at IS NOT NULL AND q.status IN ('declined', 'partly_approved')
        ${organisationId ? 'AND q.organisation_id = :org' : ''}`,
    { type: QueryTypes.SELECT, replacements: { org: organisationId ?? null } },
  )
  if (!rows.length) return 0
  return withWrite(async (t) => {
    const weeks = new Map<number, Awaited<ReturnType<typeof followUpWeeks>>>()
    let made = 0
    for (const r of rows) {
      if (!weeks.has(r.organisationId)) weeks.set(r.organisationId, await followUpWeeks(r.organisationId, t))
      const w = weeks.get(r.organisationId)!
      const due = new Date(new Date(r.decidedAt).getTime() + (r.recommendation === 'required' ? w.requiredWeeks : w.advisedWeeks) * WEEK_MS)
      const [, created] = await FollowUp.findOrCreate({
        where: { quoteLineId: r.lineId },
        defaults: {
          organisationId: r.organisationId, garageVehicleId: r.garageVehicleId, quoteId: r.quoteId, quoteLineId: r.lineId,
          recommendation: r.recommendation, description: r.description.slice(0, 255), dueAt: due,
        },
        transaction: t,
      })
      if (created) made++
    }
    return made
  })
}
