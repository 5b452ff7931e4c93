/**
 * POST /api/admin/tiers { name, percent } -> 201 TierView. Percent with at most two decimals (stored as basis
 * points). Distributor admin; 422 with `data.fields` for bad input or a duplicate name.
 */
import { TierSchema } from '#shared/schemas/accounts'
import { createTier } from '../../../services/discount-tiers'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'tiers.manage')
  const body = await bodyWith(event, TierSchema)
  const tier = await createTier(body, user.id)
  setResponseStatus(event, 201)
  return tier
})
