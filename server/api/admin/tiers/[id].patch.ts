/**
 * PATCH /api/admin/tiers/:id { name?, percent? } -> TierView. Distributor admin; 404 unknown; 422 bad input or a
 * duplicate name. A new percentage applies to every garage on the tier from its next price lookup; audited.
 */
import { IdParamSchema, TierPatchSchema } from '#shared/schemas/accounts'
import { changeTier, tierOr404 } from '../../../services/discount-tiers'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'tiers.manage')
  const { id } = paramsWith(event, IdParamSchema)
  const body = await bodyWith(event, TierPatchSchema)
  return changeTier(await tierOr404(id), body, user.id)
})
