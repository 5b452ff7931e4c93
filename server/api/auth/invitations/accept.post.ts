/**
 * POST /api/auth/invitations/accept { token, password, name? } -> { accepted: true, email }
 * Uses the single-use invitation (410 when expired, used, unknown or the person was removed meanwhile; 422 bad
 * input), sets the password and activates the person, who then signs in.
 */
import { AcceptInvitationSchema } from '#shared/schemas/accounts'
import { acceptInvitation } from '../../../services/account-links'

export default defineEventHandler(async (event) => {
  const { token, password, name } = await bodyWith(event, AcceptInvitationSchema)
  return { accepted: true, email: await acceptInvitation(token, password, name) }
})
