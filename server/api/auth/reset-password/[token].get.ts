/** GET /api/auth/reset-password/:token -> { email } while the link is live; 410 when expired, used or unknown; 429 past the address's limit. */
import { TokenParamSchema } from '#shared/schemas/accounts'
import { resetLinkEmail } from '../../../services/account-links'

export default defineEventHandler(async (event) => {
  const { token } = paramsWith(event, TokenParamSchema)
  return resetLinkEmail(token, clientAddress(event))
})
