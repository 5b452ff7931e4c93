/**
 * From a quote the owner approved (in full or in part) to a distributor order: only the approved part lines,
 * re-priced at the garage's current net price, with what changed against the quote shown before confirming.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { as, env, type Client } from '../support/api'
import { makeGarage, makePart, makeQuote, type TestGarage, type TestPart } from '../support/orders'
import { Part } from '../../server/models/catalogue'

await setup({ host: env().baseUrl })

let garage: TestGarage
let c: Client
let pads: TestPart
let disc: TestPart
let gone: TestPart

beforeAll(async () => {
  // Silver tier: 12.5 % off list (the demo tiers)
  garage = await makeGarage({ terms: 'account', creditLimitMinor: 500_000, tier: 'Silver', label: 'Quote Garage' })
  c = await as(garage.email)
  pads = await makePart({ listPriceMinor: 4_000, stock: { NGT: 10 } }) // net now 3500
  disc = await makePart({ listPriceMinor: 6_000, coreDepositMinor: 0, stock: { NGT: 10 } }) // net now 5250
  gone = await makePart({ listPriceMinor: 2_000, stock: { NGT: 10 } })
  await Part.update({ status: 'discontinued' }, { where: { id: gone.id } })
})

describe('ordering a quote\'s approved lines', () => {
  it('re-prices the approved part lines and shows what moved before confirming', async () => {
    const quote = await makeQuote(garage, 'partly_approved', [
      { sku: pads.sku, partId: pads.id, quantity: 2, unitNetMinor: 3_300, decision: 'approved' }, // was 33.00, now 35.00
      { sku: disc.sku, partId: disc.id, quantity: 2, unitNetMinor: 5_250, decision: 'approved' }, // unchanged
      { sku: disc.sku, partId: disc.id, quantity: 1, unitNetMinor: 5_250, decision: 'declined' },
      { kind: 'labour', decision: 'approved' },
      { sku: gone.sku, partId: gone.id, quantity: 1, unitNetMinor: 1_750, decision: 'approved' },
    ])
    const preview = await c.post('/api/orders/preview', { quoteId: quote.id })
    expect(preview.status, preview.text).toBe(200)
    expect(preview.body.lines.map((l: { sku: string; quantity: number }) => [l.sku, l.quantity])).toEqual([[pads.sku, 2], [disc.sku, 2]])
    // 4000 x (1 - 0.125) = 3500; 6000 x 0.875 = 5250 (netPriceMinor, half up)
    expect(preview.body.changes).toEqual([{ sku: pads.sku, quotedUnitNetMinor: 3_300, unitNetMinor: 3_500 }])
    expect(preview.body.lines[0]).toMatchObject({ quotedUnitNetMinor: 3_300, unitNetMinor: 3_500, priceChangeMinor: 200 })
    expect(preview.body.skipped).toEqual([{ sku: gone.sku, reason: 'discontinued' }])
    // 2 x 35.00 + 2 x 52.50 = 175.00; VAT 20 % (gov.uk "VAT rates") = 35.00
    expect(preview.body).toMatchObject({ subtotalMinor: 17_500, taxMinor: 3_500, totalMinor: 21_000 })

    const order = await c.post('/api/orders', { quoteId: quote.id, payment: 'account' })
    expect(order.status, order.text).toBe(201)
    expect(order.body).toMatchObject({ quoteId: quote.id, totalMinor: 21_000 })
    expect(order.body.lines.map((l: { quotedUnitNetMinor: number | null }) => l.quotedUnitNetMinor)).toEqual([3_300, 5_250])

    const twice = await c.post('/api/orders', { quoteId: quote.id, payment: 'account' })
    expect(twice.status).toBe(409)
    expect(twice.body.message).toContain(order.body.reference)
  })

  it('orders only quotes the owner has approved, of the caller\'s own garage', async () => {
    const sent = await makeQuote(garage, 'sent', [{ sku: pads.sku, partId: pads.id, unitNetMinor: 3_500, decision: null }])
    expect((await c.post('/api/orders', { quoteId: sent.id, payment: 'account' })).status).toBe(409)
    const all = await makeQuote(garage, 'approved', [{ sku: pads.sku, partId: pads.id, unitNetMinor: 3_500, decision: null }])
    expect((await c.post('/api/orders/preview', { quoteId: all.id })).body.lines).toHaveLength(1)
    const other = await as((await makeGarage({ terms: 'account', creditLimitMinor: 100_000, label: 'Other Quote Garage' })).email)
    expect((await other.post('/api/orders', { quoteId: all.id, payment: 'account' })).status).toBe(404)
    expect((await other.post('/api/orders/preview', { quoteId: all.id })).status).toBe(404)
    const both = await c.post('/api/orders', { quoteId: all.id, lines: [{ sku: pads.sku, quantity: 1 }], payment: 'account' })
    expect(both.status).toBe(422)
    expect(both.body.data.fields.lines).toMatch(/not both/)
  })
})
