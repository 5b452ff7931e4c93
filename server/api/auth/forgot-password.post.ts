/**
 * POST /api/auth/forgot-password { email } -> 202 { message }: the same answer, at about the same time, whether
 * or not the address has an account. For an active person a single-use link valid for one hour is e-mailed
 * (server/services/account-links.ts); that work goes on after the answer is sent. 422 bad input.
 */
import { ForgotPasswordSchema } from '#shared/schemas/accounts'
import { sendResetLink } from '../../services/account-links'

const ANSWER = 'If an account uses that e-mail address, a link to choose a new password is on its way. It works once, for one hour.'

export default defineEventHandler(async (event) => {
  const { email } = await bodyWith(event, ForgotPasswordSchema)
  event.waitUntil?.(sendResetLink(email, getRequestIP(event, { xForwardedFor: false }) ?? ''))
  setResponseStatus(event, 202)
  return { message: ANSWER }
})
