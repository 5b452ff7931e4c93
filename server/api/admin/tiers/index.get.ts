/**
 * GET /api/admin/tiers?page=&pageSize= -> Page<TierView> (by percentage, with how many garages are on each).
 * Distributor admin (403 otherwise); 422 bad query.
 */
import { PageQuerySchema } from '#shared/schemas/page'
import { listTiers } from '../../../services/discount-tiers'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'tiers.manage')
  return listTiers(queryWith(event, PageQuerySchema))
})
