/** GET /api/auth/invitations/:token -> { email, name, role, organisation } while the invitation is live; 410 otherwise. */
import { TokenParamSchema } from '#shared/schemas/accounts'
import { Organisation, User } from '../../../models/accounts'
import { DEAD_LINK_MESSAGE, findLiveToken } from '../../../services/tokens'

export default defineEventHandler(async (event) => {
  const { token } = paramsWith(event, TokenParamSchema)
  const row = await findLiveToken(token, 'invite')
  const user = row ? await User.findOne({ where: { id: row.userId, status: 'invited' } }) : null
  const org = user ? await Organisation.findByPk(user.organisationId) : null
  if (!user || !org) throw new DomainError('gone', DEAD_LINK_MESSAGE)
  return { email: user.email, name: user.name, role: user.role, organisation: org.name }
})
