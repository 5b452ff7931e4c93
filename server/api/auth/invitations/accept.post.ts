/**
 * POST /api/auth/invitations/accept { token, password, name? } -> { accepted: true, email }
 * Uses the single-use invitation (410 when expired, used, unknown or the person was removed meanwhile, checked
 * before the password is hashed; 422 bad input or a password too easy to guess; 429 past the address's limit), sets
 * the password and activates the person, who then signs in.
 */
import { AcceptInvitationSchema } from '#shared/schemas/accounts'
import { acceptInvitation } from '../../../services/account-links'

export default defineEventHandler(async (event) => {
  const { token, password, name } = await bodyWith(event, AcceptInvitationSchema)
  return { accepted: true, email: await acceptInvitation(token, password, name, clientAddress(event)) }
})
