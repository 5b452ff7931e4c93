/**
 * Order lines that come from an approved quote pass the fitment guard again: a line whose part does not fit the
 * quote's vehicle by the catalogue now is refused with 422 on `sku` (nothing ordered, the quote still orderable),
 * unless the manager added it with an override and its reason, which stands on the order.
 * Test parts (tests/support/orders.ts makePart) are listed for vehicle 1 only, so on a quote for vehicle 2 they
 * do not fit.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { as, env, type Client } from '../support/api'
import { makeGarage, makePart, makeQuote, type TestGarage, type TestPart } from '../support/orders'
import { withWrite } from '../../server/utils/db'
import { Quote, QuoteLine } from '../../server/models/quotes'
import { Order } from '../../server/models/orders'

await setup({ host: env().baseUrl })

let garage: TestGarage
let c: Client
let part: TestPart

/** An approved quote for `vehicleId` with one line of the test part, with a fit override's reason or none. */
async function quoteFor(vehicleId: number, overrideReason: string | null): Promise<number> {
  const { id } = await makeQuote(garage, 'approved', [{ sku: part.sku, partId: part.id, unitNetMinor: 3_000, decision: 'approved' }])
  await withWrite(async (t) => {
    await Quote.update({ vehicleId, vehicleLabel: `Catalogue vehicle ${vehicleId}` }, { where: { id }, transaction: t })
    await QuoteLine.update({ fitOverrideReason: overrideReason }, { where: { quoteId: id }, transaction: t })
  })
  return id
}

beforeAll(async () => {
  garage = await makeGarage({ terms: 'account', creditLimitMinor: 500_000, tier: 'Silver', label: 'Fit Guard Garage' })
  c = await as(garage.email)
  part = await makePart({ listPriceMinor: 4_000, stock: { NGT: 10 } })
})

describe('ordering a quote re-checks the fitment', () => {
  it('a line that fits the quote\'s vehicle is ordered', async () => {
    const id = await quoteFor(1, null)
    const r = await c.post('/api/orders/preview', { quoteId: id })
    expect(r.status, r.text).toBe(200)
    expect(r.body.lines.map((l: { sku: string }) => l.sku)).toEqual([part.sku])
  })

  it('a line that does not fit is refused with 422 on sku, for the preview and the order, and nothing is ordered', async () => {
    const id = await quoteFor(2, null)
    const preview = await c.post('/api/orders/preview', { quoteId: id })
    expect(preview.status, preview.text).toBe(422)
    expect(preview.body.data.fields.sku).toMatch(new RegExp(`^${part.sku} does not fit Catalogue vehicle 2`))
    const order = await c.post('/api/orders', { quoteId: id, payment: 'account' })
    expect(order.status, order.text).toBe(422)
    expect(order.body.data.fields.sku).toMatch(/does not fit/)
    expect(await Order.count({ where: { quoteId: id } })).toBe(0)
  })

  it('the manager\'s override with a reason stands: the line is ordered', async () => {
    const id = await quoteFor(2, 'Owner fitted the larger brake kit; measured on the car')
    const order = await c.post('/api/orders', { quoteId: id, payment: 'account' })
    expect(order.status, order.text).toBe(201)
    expect(order.body.quoteId).toBe(id)
  })
})
