/** GET /api/auth/invitations/:token -> { email, name, role, organisation } while the invitation is live; 410 otherwise; 429 past the address's limit. */
import { TokenParamSchema } from '#shared/schemas/accounts'
import { invitationOf } from '../../../services/account-links'

export default defineEventHandler(async (event) => {
  const { token } = paramsWith(event, TokenParamSchema)
  return invitationOf(token, clientAddress(event))
})
