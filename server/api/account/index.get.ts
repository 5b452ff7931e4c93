/**
 * GET /api/account -> AccountOverview: the signed-in person's profile and their organisation's standing.
 * Tier and terms only for those who handle the garage's money (managers) and for distributor staff.
 * 401 signed out; 403 for a garage that is not approved (it reads /api/trade-applications/mine instead).
 */
import type { AccountOverview } from '#shared/types/trade-accounts'
import { accountOverview } from '../../services/account'

export default defineEventHandler(async (event): Promise<AccountOverview> => {
  const { user, org } = requireAuth(event)
  return accountOverview(user, org)
})
