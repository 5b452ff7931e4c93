/**
 * POST /api/account/mfa/recovery-codes { code } -> { recoveryCodes }: ten new recovery codes (the old ones stop
 * working), given a current code. 422 on `code`; 409 when two-step sign-in is off; 401; 429.
 */
import { MfaCodeSchema } from '#shared/schemas/auth'
import { renewRecoveryCodes } from '../../../services/account-second-factor'

export default defineEventHandler(async (event) => {
  const { user } = requireAuth(event)
  const { code } = await bodyWith(event, MfaCodeSchema)
  return renewRecoveryCodes(user, code, clientAddress(event))
})
