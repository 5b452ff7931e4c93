/** GET /api/admin/tiers -> { data: TierView[] } with how many garages use each, by percentage. Distributor admin. */
import { fn, col } from 'sequelize'
import { DiscountTier, Organisation } from '../../../models/accounts'
import type { TierView } from '#shared/types/trade-accounts'

export default defineEventHandler(async (event) => {
  requireAbility(event, 'tiers.manage')
  const tiers = await DiscountTier.findAll({ order: [['percentBp', 'ASC'], ['name', 'ASC']] })
  const usage = await Organisation.findAll({
    attributes: ['tierId', [fn('COUNT', col('id')), 'n']], where: { kind: 'garage' }, group: ['tierId'], raw: true,
  }) as unknown as { tierId: number | null; n: number }[]
  const counts = new Map(usage.map((u) => [u.tierId, Number(u.n)]))
  const data: TierView[] = tiers.map((t) => ({ id: t.id, name: t.name, percentBp: t.percentBp, garages: counts.get(t.id) ?? 0 }))
  return { data }
})
