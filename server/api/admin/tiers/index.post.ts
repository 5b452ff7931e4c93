/** POST /api/admin/tiers { name, percent } -> 201 TierView. Percent with at most two decimals (stored as basis points). 422 for a duplicate name. */
import { UniqueConstraintError } from 'sequelize'
import { TierSchema, percentToBp } from '#shared/schemas/accounts'
import { DiscountTier } from '../../../models/accounts'
import type { TierView } from '#shared/types/trade-accounts'

const DUPLICATE_TIER = 'A tier with this name already exists.'

export default defineEventHandler(async (event): Promise<TierView> => {
  const { user } = requireAbility(event, 'tiers.manage')
  const body = await bodyWith(event, TierSchema)
  const tier = await withWrite(async (t) => {
    const clash = await DiscountTier.findOne({ where: { name: body.name }, transaction: t })
    if (clash) throw invalidInput({ name: DUPLICATE_TIER })
    const row = await DiscountTier.create({ name: body.name, percentBp: percentToBp(body.percent) }, { transaction: t })
    await audit(t, { actorUserId: user.id, action: 'tier.created', entity: 'discount_tier', entityId: row.id, changes: { name: { from: null, to: row.name }, percentBp: { from: null, to: row.percentBp } } })
    return row
  }).catch((err) => {
    if (err instanceof UniqueConstraintError) throw invalidInput({ name: DUPLICATE_TIER })
    throw err
  })
  setResponseStatus(event, 201)
  return { id: tier.id, name: tier.name, percentBp: tier.percentBp, garages: 0 }
})
