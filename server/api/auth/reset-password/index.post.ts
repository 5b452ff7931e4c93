/**
 * POST /api/auth/reset-password { token, password } -> { reset: true }
 * Uses the single-use link (410 when expired, used or unknown; 422 bad input), sets the new password and ends
 * every session of the person at once. They sign in again with the new password.
 */
import { ResetPasswordSchema } from '#shared/schemas/accounts'
import { resetPassword } from '../../../services/account-links'

export default defineEventHandler(async (event) => {
  const { token, password } = await bodyWith(event, ResetPasswordSchema)
  await resetPassword(token, password)
  return { reset: true }
})
