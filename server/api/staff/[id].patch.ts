/**
 * PATCH /api/staff/:id { role } -> PersonView. Changes a colleague's role within what the caller may give (422
 * otherwise). 404 for someone of another organisation, 409 for oneself, 403 for a person the caller may not manage.
 * Takes effect on the colleague's next request (roles are read from the database every time).
 */
import { IdParamSchema, StaffPatchSchema } from '#shared/schemas/accounts'
import { changeRole, loadManageable } from '../../services/staff'

export default defineEventHandler(async (event) => {
  const auth = requireStaffManager(event)
  const { id } = paramsWith(event, IdParamSchema)
  const { role } = await bodyWith(event, StaffPatchSchema)
  return changeRole(auth, await loadManageable(auth, id), role)
})
