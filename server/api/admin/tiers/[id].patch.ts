/**
 * PATCH /api/admin/tiers/:id { name?, percent? } -> TierView. Distributor admin; 404 unknown; 422 duplicate name.
 * A new percentage applies to every garage on the tier from its next price lookup; the change is audited.
 */
import { Op, UniqueConstraintError } from 'sequelize'
import { IdParamSchema, TierPatchSchema, percentToBp } from '#shared/schemas/accounts'
import { DiscountTier } from '../../../models/accounts'
import { diff } from '../../../services/trade-accounts'
import type { TierView } from '#shared/types/trade-accounts'

const DUPLICATE_TIER = 'A tier with this name already exists.'

export default defineEventHandler(async (event): Promise<TierView> => {
  const { user } = requireAbility(event, 'tiers.manage')
  const { id } = paramsWith(event, IdParamSchema)
  const body = await bodyWith(event, TierPatchSchema)
  const tier = await DiscountTier.findByPk(id)
  if (!tier) throw notFound('Tier')
  const next = { name: body.name ?? tier.name, percentBp: body.percent === undefined ? tier.percentBp : percentToBp(body.percent) }
  const changes = diff({ name: tier.name, percentBp: tier.percentBp }, next)
  if (Object.keys(changes).length) {
    await withWrite(async (t) => {
      if (changes.name && await DiscountTier.findOne({ where: { name: next.name, id: { [Op.ne]: id } }, transaction: t })) {
        throw invalidInput({ name: DUPLICATE_TIER })
      }
      await DiscountTier.update(next, { where: { id }, transaction: t })
      await audit(t, { actorUserId: user.id, action: 'tier.changed', entity: 'discount_tier', entityId: id, changes })
    }).catch((err) => {
      if (err instanceof UniqueConstraintError) throw invalidInput({ name: DUPLICATE_TIER })
      throw err
    })
  }
  return { id, ...next }
})
