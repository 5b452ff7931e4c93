/**
 * DELETE /api/staff/:id -> { removed: true }. Removes a colleague: every session of theirs ends at once and
 * their open links stop working. The row stays (the audit log points at it). Same 404/409/403 rules as PATCH.
 */
import { IdParamSchema } from '#shared/schemas/accounts'
import { User } from '../../models/accounts'
import { loadManageable } from '../../services/staff'
import { voidTokensOf } from '../../services/tokens'

export default defineEventHandler(async (event) => {
  const auth = requireStaffManager(event)
  const { id } = paramsWith(event, IdParamSchema)
  const target = await loadManageable(auth, id)
  await withWrite(async (t) => {
    await User.update({ status: 'removed', sessionVersion: target.sessionVersion + 1 }, { where: { id: target.id }, transaction: t })
    await voidTokensOf(t, [target.id])
    await audit(t, { actorUserId: auth.user.id, organisationId: auth.org.id, action: 'user.removed', entity: 'user', entityId: target.id, changes: { status: { from: target.status, to: 'removed' }, role: target.role } })
  })
  await revokeSessionsOfUsers([target.id])
  return { removed: true }
})
