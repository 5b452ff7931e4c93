/**
 * PATCH /api/staff/:id { role } -> PersonView. Changes a colleague's role within what the caller may give.
 * 404 for someone of another organisation, 409 for oneself, 403 for a person the caller may not manage.
 * Takes effect on the colleague's next request (roles are read from the database every time).
 */
import { IdParamSchema, StaffPatchSchema } from '#shared/schemas/accounts'
import { ROLE_LABELS } from '#shared/types/accounts'
import { User } from '../../models/accounts'
import { personView } from '../../services/trade-accounts'
import { assignableRoles, loadManageable } from '../../services/staff'

export default defineEventHandler(async (event) => {
  const auth = requireStaffManager(event)
  const { id } = paramsWith(event, IdParamSchema)
  const { role } = await bodyWith(event, StaffPatchSchema)
  const target = await loadManageable(auth, id)
  const roles = assignableRoles(auth)
  if (!roles.includes(role)) throw invalidInput({ role: `Choose ${roles.map((r) => ROLE_LABELS[r].toLowerCase()).join(' or ')}.` })
  if (role !== target.role) {
    await withWrite(async (t) => {
      await User.update({ role }, { where: { id: target.id }, transaction: t })
      await audit(t, { actorUserId: auth.user.id, organisationId: auth.org.id, action: 'user.role_changed', entity: 'user', entityId: target.id, changes: { role: { from: target.role, to: role } } })
    })
  }
  return personView((await User.findByPk(target.id))!)
})
