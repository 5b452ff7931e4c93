/**
 * POST /api/staff { email, name, role } -> 201 PersonView (status "invited").
 * Invites a colleague by e-mail with a single-use link to set a password (valid 7 days). Inviting someone
 * already invited sends a fresh link; a removed colleague of the same organisation can be invited back.
 * Garage managers and distributor admins; 422 for a role the caller may not give or an e-mail someone else signs
 * in with.
 */
import { InviteSchema } from '#shared/schemas/accounts'
import { inviteColleague } from '../../services/staff'

export default defineEventHandler(async (event) => {
  const auth = requireStaffManager(event)
  const body = await bodyWith(event, InviteSchema)
  const person = await inviteColleague(auth, body)
  setResponseStatus(event, 201)
  return person
})
