/**
 * POST /api/auth/reset-password { token, password } -> { reset: true }
 * Uses the single-use link (410 when expired, used or unknown, checked before the password is hashed; 422 bad input
 * or a password too easy to guess; 429 when this address has presented too many links), sets the new password and
 * ends every session of the person at once. They sign in again with the new password.
 */
import { ResetPasswordSchema } from '#shared/schemas/accounts'
import { resetPassword } from '../../../services/account-links'

export default defineEventHandler(async (event) => {
  const { token, password } = await bodyWith(event, ResetPasswordSchema)
  await resetPassword(token, password, clientAddress(event))
  return { reset: true }
})
