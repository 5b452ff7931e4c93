/**
 * The garage's current prices: list price from the active price version, less the garage's tier discount
 * (netPriceMinor, rounded once), plus the core deposit held against the old unit. Server-only, no HTTP.
 */
import { Op, type Transaction } from 'sequelize'
import { DiscountTier, type Organisation } from '../models/accounts'
import { PartPrice, Part } from '../models/catalogue'
import { netPriceMinor } from '../../shared/utils/money'
import { activePriceVersion } from './price-versions'

/** A part's price for one garage. */
export interface GaragePrice {
  part: Part
  listPriceMinor: number
  coreDepositMinor: number
  /** the garage's net unit price */
  unitNetMinor: number
}

/** The garage's discount in basis points (0 without a tier). */
export async function tierBpOf(org: Pick<Organisation, 'tierId'>, t?: Transaction): Promise<number> {
  if (!org.tierId) return 0
  const tier = await DiscountTier.findByPk(org.tierId, { transaction: t })
  return tier?.percentBp ?? 0
}

/**
 * Current prices of the given SKUs for a garage, keyed by SKU as stored. SKUs with no part, or no price on
 * the active price version, are simply absent from the map (the caller says why).
 */
export async function garagePrices(org: Pick<Organisation, 'tierId'>, skus: string[], t?: Transaction): Promise<Map<string, GaragePrice>> {
  const out = new Map<string, GaragePrice>()
  if (!skus.length) return out
  if (!(await activePriceVersion(t))) return out
  const bp = await tierBpOf(org, t)
  const parts = await Part.findAll({ where: { sku: { [Op.in]: [...new Set(skus)] } }, transaction: t })
  if (!parts.length) return out
  const prices = await PartPrice.findAll({ where: { partId: { [Op.in]: parts.map((p) => p.id) } }, transaction: t })
  const byPart = new Map(prices.map((p) => [p.partId, p]))
  for (const part of parts) {
    const price = byPart.get(part.id)
    if (!price) continue
    out.set(part.sku, {
      part,
      listPriceMinor: price.listPriceMinor,
      coreDepositMinor: price.coreDepositMinor ?? 0,
      unitNetMinor: netPriceMinor(price.listPriceMinor, bp),
    })
  }
  return out
}
