/** GET /api/account/mfa -> SecondFactorStatus: whether the caller's role may or must use two-step sign-in, and theirs. 401. */
import type { SecondFactorStatus } from '#shared/types/second-factor'
import { secondFactorStatus } from '../../../services/second-factor'

export default defineEventHandler(async (event): Promise<SecondFactorStatus> => {
  const { user } = requireAuth(event)
  return secondFactorStatus(user)
})
