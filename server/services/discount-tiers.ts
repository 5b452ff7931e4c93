/**
 * Discount tiers: each approved garage is on one, and its percentage (basis points) comes off list prices from
 * the garage's next price lookup. Names are unique; a tier in use cannot be deleted. Every change is audited.
 * Plain Node.
 */
import { Op, UniqueConstraintError, col, fn } from 'sequelize'
import { DiscountTier, Organisation } from '../models/accounts'
import { withWrite } from '../utils/db'
import { audit } from '../utils/audit'
import { pageOf } from '../utils/page'
import { percentToBp } from '../../shared/schemas/accounts'
import type { PageQuery } from '../../shared/schemas/page'
import type { Page } from '../../shared/types/page'
import type { TierView } from '../../shared/types/trade-accounts'
import { changedFields } from './audit-changes'
import { conflict, invalidInput, notFound } from './errors'

const DUPLICATE_TIER = 'A tier with this name already exists.'

/** One page of tiers, by percentage, with how many garages are on each. */
export async function listTiers(query: PageQuery): Promise<Page<TierView>> {
  return pageOf(
    query,
    (window) => DiscountTier.findAndCountAll({ order: [['percentBp', 'ASC'], ['name', 'ASC'], ['id', 'ASC']], ...window }),
    async (tiers) => {
      const usage = await Organisation.findAll({
        attributes: ['tierId', [fn('COUNT', col('id')), 'n']],
        where: { kind: 'garage', tierId: { [Op.in]: tiers.map((t) => t.id) } },
        group: ['tierId'],
        raw: true,
      }) as unknown as { tierId: number | null; n: number }[]
      const counts = new Map(usage.map((u) => [u.tierId, Number(u.n)]))
      return tiers.map((t) => ({ id: t.id, name: t.name, percentBp: t.percentBp, garages: counts.get(t.id) ?? 0 }))
    },
  )
}

export async function tierOr404(id: number): Promise<DiscountTier> {
  const tier = await DiscountTier.findByPk(id)
  if (!tier) throw notFound('Tier')
  return tier
}

/** The tier a decision or a terms change names; 422 on `tierId` when it has gone meanwhile. */
export async function chosenTier(id: number): Promise<DiscountTier> {
  const tier = await DiscountTier.findByPk(id)
  if (!tier) throw invalidInput({ tierId: 'That discount tier does not exist any more.' })
  return tier
}

/** The same 422 whether our own check or the unique index finds the clash first. */
function nameClash(err: unknown): never {
  if (err instanceof UniqueConstraintError) throw invalidInput({ name: DUPLICATE_TIER })
  throw err
}

export async function createTier(input: { name: string; percent: number }, actorId: number): Promise<TierView> {
  const tier = await withWrite(async (t) => {
    if (await DiscountTier.findOne({ where: { name: input.name }, transaction: t })) throw invalidInput({ name: DUPLICATE_TIER })
    const row = await DiscountTier.create({ name: input.name, percentBp: percentToBp(input.percent) }, { transaction: t })
    await audit(t, { actorUserId: actorId, action: 'tier.created', entity: 'discount_tier', entityId: row.id, changes: changedFields({}, { name: row.name, percentBp: row.percentBp }) })
    return row
  }).catch(nameClash)
  return { id: tier.id, name: tier.name, percentBp: tier.percentBp, garages: 0 }
}

/** Renames and/or re-prices a tier; the new percentage applies to every garage on it. */
export async function changeTier(tier: DiscountTier, input: { name?: string; percent?: number }, actorId: number): Promise<TierView> {
  const next = { name: input.name ?? tier.name, percentBp: input.percent === undefined ? tier.percentBp : percentToBp(input.percent) }
  const changes = changedFields({ name: tier.name, percentBp: tier.percentBp }, next)
  if (Object.keys(changes).length) {
    await withWrite(async (t) => {
      if (changes.name && await DiscountTier.findOne({ where: { name: next.name, id: { [Op.ne]: tier.id } }, transaction: t })) {
        throw invalidInput({ name: DUPLICATE_TIER })
      }
      await DiscountTier.update(next, { where: { id: tier.id }, transaction: t })
      await audit(t, { actorUserId: actorId, action: 'tier.changed', entity: 'discount_tier', entityId: tier.id, changes })
    }).catch(nameClash)
  }
  return { id: tier.id, ...next }
}

/** Deletes a tier no garage is on (409 otherwise, saying how many are). */
export async function deleteTier(tier: DiscountTier, actorId: number): Promise<void> {
  await withWrite(async (t) => {
    const used = await Organisation.count({ where: { tierId: tier.id }, transaction: t })
    if (used) throw conflict(`${used} garage${used === 1 ? ' is' : 's are'} on this tier. Move ${used === 1 ? 'it' : 'them'} to another tier first.`)
    await DiscountTier.destroy({ where: { id: tier.id }, transaction: t })
    await audit(t, { actorUserId: actorId, action: 'tier.deleted', entity: 'discount_tier', entityId: tier.id, changes: { name: { from: tier.name, to: null }, percentBp: { from: tier.percentBp, to: null } } })
  })
}
