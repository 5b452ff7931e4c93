/**
 * POST /api/staff/:id/mfa-reset -> PersonView. Resets a colleague's two-step sign-in (a lost phone): their app and
 * recovery codes stop working and every session of theirs ends; distributor staff set up an app again at their next
 * sign-in. Audited (`user.mfa_reset`) and e-mailed to them. 404 for someone of another organisation, 409 for oneself
 * or someone without two-step sign-in, 403 for a person the caller may not manage.
 */
import { IdParamSchema } from '#shared/schemas/accounts'
import { loadManageable, resetSecondFactor } from '../../../services/staff'

export default defineEventHandler(async (event) => {
  const auth = requireStaffManager(event)
  const { id } = paramsWith(event, IdParamSchema)
  return resetSecondFactor(auth, await loadManageable(auth, id))
})
