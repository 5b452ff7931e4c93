/**
 * DELETE /api/staff/:id -> { removed: true }. Removes a colleague: every session of theirs ends at once and
 * their open links stop working. The row stays (the audit log points at it). Same 404/409/403 rules as PATCH.
 */
import { IdParamSchema } from '#shared/schemas/accounts'
import { loadManageable, removeColleague } from '../../services/staff'

export default defineEventHandler(async (event) => {
  const auth = requireStaffManager(event)
  const { id } = paramsWith(event, IdParamSchema)
  await removeColleague(auth, await loadManageable(auth, id))
  return { removed: true }
})
