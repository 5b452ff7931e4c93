/**
 * The garage's basket, kept with its account (not only in one browser): what the managers picked from the
 * catalogue before it becomes an order. Prices are never kept here; the order prices the lines when previewed
 * and placed. Saving replaces the whole basket in one write. Plain Node.
 */
import { BasketLine } from '../../models/counter'
import { withWrite } from '../../utils/db'
import type { BasketInput } from '../../../shared/schemas/orders'
import type { BasketItem } from '../../../shared/types/orders'

export async function basketOf(organisationId: number): Promise<{ items: BasketItem[] }> {
  const rows = await BasketLine.findAll({ where: { organisationId }, order: [['position', 'ASC'], ['sku', 'ASC']] })
  return { items: rows.map((r) => ({ sku: r.sku, description: r.description, quantity: r.quantity })) }
}

export async function saveBasket(organisationId: number, input: BasketInput): Promise<{ items: BasketItem[] }> {
  // the same part twice is one line (as the order would make it)
  const merged = new Map<string, BasketItem>()
  for (const i of input.items) {
    const key = i.sku.toUpperCase()
    const prev = merged.get(key)
    if (prev) prev.quantity = Math.min(999, prev.quantity + i.quantity)
    else merged.set(key, { sku: i.sku, description: i.description, quantity: i.quantity })
  }
  await withWrite(async (t) => {
    await BasketLine.destroy({ where: { organisationId }, transaction: t })
    await BasketLine.bulkCreate([...merged.values()].map((i, position) => ({ organisationId, ...i, position, updatedAt: new Date() })), { transaction: t })
  })
  return basketOf(organisationId)
}
