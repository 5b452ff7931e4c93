/** GET /api/auth/reset-password/:token -> { email } while the link is live; 410 when expired, used or unknown. */
import { TokenParamSchema } from '#shared/schemas/accounts'
import { User } from '../../../models/accounts'
import { DEAD_LINK_MESSAGE, findLiveToken } from '../../../services/tokens'

export default defineEventHandler(async (event) => {
  const { token } = paramsWith(event, TokenParamSchema)
  const row = await findLiveToken(token, 'reset')
  const user = row ? await User.findOne({ where: { id: row.userId, status: 'active' } }) : null
  if (!user) throw new DomainError('gone', DEAD_LINK_MESSAGE)
  return { email: user.email }
})
