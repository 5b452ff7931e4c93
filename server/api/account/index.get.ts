/**
 * GET /api/account -> AccountOverview: the signed-in person's profile and their organisation's standing.
 * Tier and terms only for those who handle the garage's money (managers) and for distributor staff.
 * Approved organisations only (a pending or rejected garage reads /api/trade-applications/mine instead).
 */
import { can } from '#shared/utils/abilities'
import { DiscountTier } from '../../models/accounts'
import { personView, tierView } from '../../services/trade-accounts'
import type { AccountOverview } from '#shared/types/trade-accounts'

export default defineEventHandler(async (event): Promise<AccountOverview> => {
  const { user, org } = requireAuth(event)
  const seesTerms = org.kind === 'distributor' || can(user.role, 'statement.view')
  const tier = seesTerms && org.tierId ? await DiscountTier.findByPk(org.tierId) : null
  return {
    profile: personView(user),
    organisation: {
      id: org.id, name: org.name, kind: org.kind, status: org.status, decisionReason: org.decisionReason ?? null,
      tier: tierView(tier),
      terms: seesTerms && org.kind === 'garage' ? org.paymentTerms : null,
      creditLimitMinor: seesTerms && org.kind === 'garage' ? org.creditLimitMinor : null,
      paymentDays: seesTerms && org.kind === 'garage' ? org.paymentDays : null,
    },
  }
})
