/**
 * POST /api/auth/reset-password { token, password } -> { reset: true }
 * Uses the single-use link (410 when expired, used or unknown), sets the new password and ends every session
 * of the person at once (session version bumped, records revoked). They sign in again with the new password.
 */
import { ResetPasswordSchema } from '#shared/schemas/accounts'
import { User } from '../../../models/accounts'
import { DEAD_LINK_MESSAGE, useToken } from '../../../services/tokens'
import { forgetSignInFailures } from '../../../services/throttle'

export default defineEventHandler(async (event) => {
  const { token, password } = await bodyWith(event, ResetPasswordSchema)
  const passwordHash = await hashPassword(password)
  const user = await withWrite(async (t) => {
    const row = await useToken(t, token, 'reset')
    const user = row ? await User.findOne({ where: { id: row.userId, status: 'active' }, transaction: t }) : null
    if (!user) throw new DomainError('gone', DEAD_LINK_MESSAGE)
    await User.update({ passwordHash, sessionVersion: user.sessionVersion + 1 }, { where: { id: user.id }, transaction: t })
    await audit(t, { actorUserId: user.id, organisationId: user.organisationId, action: 'user.password_reset', entity: 'user', entityId: user.id })
    return user
  })
  await revokeSessionsOfUsers([user.id])
  await forgetSignInFailures(user.email)
  return { reset: true }
})
