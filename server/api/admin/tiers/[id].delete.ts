/** DELETE /api/admin/tiers/:id -> { deleted: true }. Distributor admin; 404 unknown; 409 while any garage is on the tier. */
import { IdParamSchema } from '#shared/schemas/accounts'
import { DiscountTier, Organisation } from '../../../models/accounts'

export default defineEventHandler(async (event) => {
  const { user } = requireAbility(event, 'tiers.manage')
  const { id } = paramsWith(event, IdParamSchema)
  const tier = await DiscountTier.findByPk(id)
  if (!tier) throw notFound('Tier')
  await withWrite(async (t) => {
    const used = await Organisation.count({ where: { tierId: id }, transaction: t })
    if (used) throw conflict(`${used} garage${used === 1 ? ' is' : 's are'} on this tier. Move ${used === 1 ? 'it' : 'them'} to another tier first.`)
    await DiscountTier.destroy({ where: { id }, transaction: t })
    await audit(t, { actorUserId: user.id, action: 'tier.deleted', entity: 'discount_tier', entityId: id, changes: { name: { from: tier.name, to: null }, percentBp: { from: tier.percentBp, to: null } } })
  })
  return { deleted: true }
})
