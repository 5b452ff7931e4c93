/**
 * POST /api/account/mfa/enrolment/confirm { code } -> { recoveryCodes, status }: the first code from the new app
 * confirms it; ten recovery codes come back, shown this once. 422 on `code` when it does not match (or nothing is
 * being set up); 401; 403 for roles without two-step sign-in; 429 after too many wrong codes.
 */
import { MfaCodeSchema } from '#shared/schemas/auth'
import { confirmAccountEnrolment } from '../../../../services/account-second-factor'

export default defineEventHandler(async (event) => {
  const { user } = requireAuth(event)
  const { code } = await bodyWith(event, MfaCodeSchema)
  return confirmAccountEnrolment(user, code, clientAddress(event))
})
