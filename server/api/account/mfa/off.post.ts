/**
 * POST /api/account/mfa/off { code } -> SecondFactorStatus: turns two-step sign-in off, given a current code (a
 * garage manager's choice). 409 for distributor staff, who must keep it, or when it is already off; 422 on `code`;
 * 401; 429.
 */
import { MfaCodeSchema } from '#shared/schemas/auth'
import type { SecondFactorStatus } from '#shared/types/second-factor'
import { turnOffSecondFactor } from '../../../services/account-second-factor'

export default defineEventHandler(async (event): Promise<SecondFactorStatus> => {
  const { user } = requireAuth(event)
  const { code } = await bodyWith(event, MfaCodeSchema)
  return turnOffSecondFactor(user, code, clientAddress(event))
})
