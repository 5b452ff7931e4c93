/**
 * Stock is held in the order's own write transaction with a guarded UPDATE (and CHECK (quantity >= 0)): concurrent
 * orders for the last units never oversell. What the shelf cannot give is supplied otherwise (here, with no other
 * branch stocking the part, back-ordered from the supplier) instead of refusing the order.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { as, env, type Client } from '../support/api'
import { linesOf, makeGarage, makePart, stockOf } from '../support/orders'

await setup({ host: env().baseUrl })

let clients: Client[]

beforeAll(async () => {
  const garages = await Promise.all([
    makeGarage({ terms: 'card', label: 'Rush Garage A' }),
    makeGarage({ terms: 'account', creditLimitMinor: 1_000_000, label: 'Rush Garage B' }),
  ])
  clients = await Promise.all(garages.map((g) => as(g.email)))
})

async function supplied(orderIds: number[]) {
  const lines = (await Promise.all(orderIds.map((id) => linesOf(id)))).flat()
  const sum = (source: string) => lines.filter((l) => l.source === source).reduce((s, l) => s + l.quantity, 0)
  return { home: sum('home'), backOrder: sum('back_order'), transfer: sum('transfer') }
}

describe('concurrent orders for the last units', () => {
  it('20 orders for the last 5 units: exactly 5 come off the shelf, the other 15 are back-ordered', async () => {
    const part = await makePart({ listPriceMinor: 1_000, stock: { NGT: 5 } })
    const results = await Promise.all(Array.from({ length: 20 }, (_, i) =>
      clients[i % 2]!.post('/api/orders', { lines: [{ sku: part.sku, quantity: 1 }], payment: i % 2 ? 'account' : 'card' })))
    expect(results.map((r) => r.status)).toEqual(Array(20).fill(201))
    expect(new Set(results.map((r) => r.body.id)).size).toBe(20)
    expect(await supplied(results.map((r) => r.body.id))).toEqual({ home: 5, backOrder: 15, transfer: 0 })
    expect(await stockOf(part.id)).toBe(0)
  })

  it('splits the one order that asks for more than is left', async () => {
    const part = await makePart({ listPriceMinor: 1_000, stock: { NGT: 5 } })
    const results = await Promise.all(Array.from({ length: 20 }, () =>
      clients[0]!.post('/api/orders', { lines: [{ sku: part.sku, quantity: 2 }], payment: 'card' })))
    expect(results.every((r) => r.status === 201)).toBe(true)
    const split = results.filter((r) => r.body.lines.length === 2)
    expect(split).toHaveLength(1)
    expect(split[0]!.body.lines.map((l: { source: string; quantity: number }) => [l.source, l.quantity])).toEqual([['home', 1], ['back_order', 1]])
    expect(await supplied(results.map((r) => r.body.id))).toEqual({ home: 5, backOrder: 35, transfer: 0 })
    expect(await stockOf(part.id)).toBe(0)
  })

  it('supplies each line of an order on its own, and refuses a branch that does not exist', async () => {
    const plenty = await makePart({ listPriceMinor: 1_000, stock: { NGT: 9 } })
    const scarce = await makePart({ listPriceMinor: 1_000, stock: { NGT: 1 } })
    const r = await clients[0]!.post('/api/orders', { lines: [{ sku: plenty.sku, quantity: 3 }, { sku: scarce.sku, quantity: 2 }], payment: 'card' })
    expect(r.status, r.text).toBe(201)
    expect(r.body.lines.map((l: { sku: string; source: string; quantity: number }) => [l.sku, l.source, l.quantity]))
      .toEqual([[plenty.sku, 'home', 3], [scarce.sku, 'home', 1], [scarce.sku, 'back_order', 1]])
    expect(await stockOf(plenty.id)).toBe(6)
    expect(await stockOf(scarce.id)).toBe(0)
    const nowhere = await clients[0]!.post('/api/orders', { lines: [{ sku: plenty.sku, quantity: 1 }], payment: 'card', branchId: 999 })
    expect(nowhere.status).toBe(422)
    expect(nowhere.body.data.fields.branchId).toBe('There is no such branch.')
  })
})
