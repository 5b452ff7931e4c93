/**
 * Stock is reserved in the order's own write transaction with a guarded UPDATE (and CHECK (quantity >= 0)):
 * concurrent orders for the last units never oversell, and the ones that miss out are told how many are left.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { as, env, type Client } from '../support/api'
import { makeGarage, makePart, stockOf } from '../support/orders'

await setup({ host: env().baseUrl })

let clients: Client[]

beforeAll(async () => {
  const garages = await Promise.all([
    makeGarage({ terms: 'card', label: 'Rush Garage A' }),
    makeGarage({ terms: 'account', creditLimitMinor: 1_000_000, label: 'Rush Garage B' }),
  ])
  clients = await Promise.all(garages.map((g) => as(g.email)))
})

describe('concurrent orders for the last units', () => {
  it('20 orders for the last 5 units: exactly 5 succeed, the rest hear "only N left"', async () => {
    const part = await makePart({ listPriceMinor: 1_000, stock: { NGT: 5 } })
    const results = await Promise.all(Array.from({ length: 20 }, (_, i) =>
      clients[i % 2]!.post('/api/orders', { lines: [{ sku: part.sku, quantity: 1 }], payment: i % 2 ? 'account' : 'card' })))
    const ok = results.filter((r) => r.status === 201)
    const refused = results.filter((r) => r.status !== 201)
    expect(ok).toHaveLength(5)
    expect(refused).toHaveLength(15)
    for (const r of refused) {
      expect(r.status).toBe(409)
      expect(r.body.message).toMatch(/^Only 0 left of .+ at Northgate/)
    }
    expect(new Set(ok.map((r) => r.body.id)).size).toBe(5)
    expect(await stockOf(part.id)).toBe(0)
  })

  it('tells the exact number left when an order asks for more than there is', async () => {
    const part = await makePart({ listPriceMinor: 1_000, stock: { NGT: 5 } })
    const results = await Promise.all(Array.from({ length: 20 }, () =>
      clients[0]!.post('/api/orders', { lines: [{ sku: part.sku, quantity: 2 }], payment: 'card' })))
    expect(results.filter((r) => r.status === 201)).toHaveLength(2)
    const refused = results.filter((r) => r.status === 409)
    expect(refused).toHaveLength(18)
    expect(refused.every((r) => /Only 1 left of .+ \(you asked for 2\)/.test(r.body.message))).toBe(true)
    expect(refused[0]!.body.data.shortages).toEqual([{ sku: part.sku, available: 1, wanted: 2 }])
    expect(await stockOf(part.id)).toBe(1)
  })

  it('takes nothing when one line of several is short', async () => {
    const plenty = await makePart({ listPriceMinor: 1_000, stock: { NGT: 9 } })
    const scarce = await makePart({ listPriceMinor: 1_000, stock: { NGT: 1 } })
    const r = await clients[0]!.post('/api/orders', { lines: [{ sku: plenty.sku, quantity: 3 }, { sku: scarce.sku, quantity: 2 }], payment: 'card' })
    expect(r.status).toBe(409)
    expect(await stockOf(plenty.id)).toBe(9)
    expect(await stockOf(scarce.id)).toBe(1)
    // the other branch has none of it
    expect((await clients[0]!.post('/api/orders', { lines: [{ sku: plenty.sku, quantity: 1 }], payment: 'card', branchId: 999 })).status).toBe(422)
  })
})
