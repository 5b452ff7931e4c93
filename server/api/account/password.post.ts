/**
 * POST /api/account/password { currentPassword, newPassword } -> { changed: true }
 * Needs the current password (counted like a sign-in attempt, so a borrowed session cannot guess it);
 * ends every other session of the person at once, keeping this one.
 */
import { PasswordChangeSchema } from '#shared/schemas/accounts'
import { SessionRecord, User } from '../../models/accounts'
import { countSignInAttempt, retryMessage } from '../../services/throttle'

export default defineEventHandler(async (event) => {
  const { user, sessionId } = requireAuth(event)
  const body = await bodyWith(event, PasswordChangeSchema)
  const attempt = await countSignInAttempt(user.email, getRequestIP(event, { xForwardedFor: false }) ?? '')
  if (!attempt.ok) {
    throw new DomainError('too_many', retryMessage(attempt.retryAfterSeconds), { retryAfterSeconds: attempt.retryAfterSeconds })
  }
  if (!user.passwordHash || !(await verifyPassword(user.passwordHash, body.currentPassword))) {
    throw invalidInput({ currentPassword: 'That is not your current password.' })
  }
  await attempt.release()
  if (body.newPassword === body.currentPassword) throw invalidInput({ newPassword: 'Choose a password different from the current one.' })
  const passwordHash = await hashPassword(body.newPassword)
  const version = user.sessionVersion + 1
  await withWrite(async (t) => {
    await User.update({ passwordHash, sessionVersion: version }, { where: { id: user.id }, transaction: t })
    // this session moves to the new version; every other one is now stale
    await SessionRecord.update({ sessionVersion: version }, { where: { id: sessionId }, transaction: t })
    await audit(t, { actorUserId: user.id, organisationId: user.organisationId, action: 'user.password_changed', entity: 'user', entityId: user.id })
  })
  await revokeSessionsOfUsers([user.id], sessionId)
  return { changed: true }
})
