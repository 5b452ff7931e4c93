/**
 * POST /api/account/password { currentPassword, newPassword } -> { changed: true }
 * 422 for a wrong current password or a new one that is too short or the same; 429 once the current password has
 * been guessed too often (counted like sign-in attempts). Ends every other session of the person, keeping this one.
 */
import { PasswordChangeSchema } from '#shared/schemas/accounts'
import { changePassword } from '../../services/account'

export default defineEventHandler(async (event) => {
  const { user, sessionId } = requireAuth(event)
  const body = await bodyWith(event, PasswordChangeSchema)
  await changePassword(user, sessionId, body, getRequestIP(event, { xForwardedFor: false }) ?? '')
  return { changed: true }
})
