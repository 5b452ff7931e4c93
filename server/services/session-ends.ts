/**
 * Ending a person's sessions inside the write that makes them stale (password set, person removed), so no
 * request between the commit and a later clean-up can still use one. Plain Node.
 */
import { Op, type Transaction } from 'sequelize'
import { SessionRecord } from '../models/accounts'

/** Revokes every live session of these people, except `keepSid` (the one making the change). */
export async function endSessions(t: Transaction, userIds: number[], keepSid?: string): Promise<void> {
  if (!userIds.length) return
  await SessionRecord.update({ revokedAt: new Date() }, {
    where: { userId: { [Op.in]: userIds }, revokedAt: null, ...(keepSid ? { id: { [Op.ne]: keepSid } } : {}) },
    transaction: t,
  })
}
