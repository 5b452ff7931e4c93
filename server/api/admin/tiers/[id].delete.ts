/** DELETE /api/admin/tiers/:id -> { deleted: true }. Distributor admin; 404 unknown; 409 while any garage is on the tier. */
import { IdParamSchema } from '#shared/schemas/accounts'
import { deleteTier, tierOr404 } from '../../../services/discount-tiers'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'tiers.manage')
  const { id } = paramsWith(event, IdParamSchema)
  await deleteTier(await tierOr404(id), user.id)
  return { deleted: true }
})
