/**
 * Ordering on trade account: only on account terms, and only while the outstanding balance plus this order
 * stays within the credit limit; the refusal names the limit and the balance, and leaves everything as it was.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { as, env, people, waitForMail } from '../support/api'
import { ledgerOf, makeGarage, makePart, stockOf, type TestPart } from '../support/orders'

await setup({ host: env().baseUrl })

let part: TestPart
// £40.00 net (no tier) + VAT at 20 % (gov.uk "VAT rates") = £48.00 a unit
const UNIT_TOTAL = 4_800

beforeAll(async () => {
  part = await makePart({ listPriceMinor: 4_000, stock: { NGT: 50, RVS: 50 } })
})

const order = (payment: 'card' | 'account', quantity = 1) => ({ lines: [{ sku: part.sku, quantity }], payment })

describe('trade-account credit limit', () => {
  it('accepts an order that takes the balance exactly to the limit, and refuses the next', async () => {
    const garage = await makeGarage({ terms: 'account', creditLimitMinor: 2 * UNIT_TOTAL, label: 'Credit Garage' })
    const c = await as(garage.email)
    const first = await c.post('/api/orders', order('account'))
    expect(first.status, first.text).toBe(201)
    expect(first.body).toMatchObject({ status: 'confirmed', paymentState: 'on_account', totalMinor: UNIT_TOTAL })
    await waitForMail(garage.email, /confirmed on your trade account/)

    const preview = await c.post('/api/orders/preview', order('account'))
    expect(preview.body.account).toEqual({ creditLimitMinor: 9_600, balanceMinor: 4_800, availableMinor: 4_800, fits: true })

    // balance £48.00 + this £48.00 = £96.00 = the limit: allowed (within the limit, not over it)
    const atLimit = await c.post('/api/orders', order('account'))
    expect(atLimit.status, atLimit.text).toBe(201)

    const stock = await stockOf(part.id)
    const ledger = await ledgerOf(garage.id)
    const over = await c.post('/api/orders', order('account'))
    expect(over.status).toBe(402)
    expect(over.body.message).toContain('£96.00') // names the limit and the balance
    expect(over.body.message).toMatch(/balance is £96\.00 and the credit limit is £96\.00/)
    expect(over.body.data).toMatchObject({ creditLimitMinor: 9_600, balanceMinor: 9_600, orderTotalMinor: 4_800 })
    expect(await stockOf(part.id)).toBe(stock)
    expect(await ledgerOf(garage.id)).toEqual(ledger)
    // the same order by card is fine
    expect((await c.post('/api/orders', order('card'))).status).toBe(201)
  })

  it('refuses an order one penny over the limit', async () => {
    const garage = await makeGarage({ terms: 'account', creditLimitMinor: 2 * UNIT_TOTAL - 1, label: 'Penny Garage' })
    const c = await as(garage.email)
    expect((await c.post('/api/orders', order('account'))).status).toBe(201)
    const r = await c.post('/api/orders', order('account'))
    expect(r.status).toBe(402)
    expect(r.body.message).toMatch(/balance is £48\.00 and the credit limit is £95\.99 \(£47\.99 available\)/)
    expect((await c.post('/api/orders/preview', order('account'))).body.account.fits).toBe(false)
  })

  it('counts a bigger order against the headroom as a whole', async () => {
    const garage = await makeGarage({ terms: 'account', creditLimitMinor: 3 * UNIT_TOTAL, label: 'Whole Garage' })
    const c = await as(garage.email)
    expect((await c.post('/api/orders', order('account', 4))).status).toBe(402)
    expect((await c.post('/api/orders', order('account', 3))).status).toBe(201)
  })

  it('refuses the trade account to a garage on card terms, naming the field', async () => {
    const c = await as(people.otherManager) // Tannery Yard: card only
    const before = await stockOf(part.id)
    const r = await c.post('/api/orders', order('account'))
    expect(r.status).toBe(422)
    expect(r.body.data.fields.payment).toMatch(/card/)
    expect(await stockOf(part.id)).toBe(before)
  })

  it('validates the order body with field messages', async () => {
    const c = await as(people.otherManager)
    const r = await c.post('/api/orders', { lines: [{ sku: '', quantity: 0 }], payment: 'cash', total: 1 })
    expect(r.status).toBe(422)
    expect(Object.keys(r.body.data.fields)).toEqual(expect.arrayContaining(['lines.0.sku', 'lines.0.quantity', 'payment', 'total']))
    const unknown = await c.post('/api/orders', { lines: [{ sku: 'NO-SUCH-PART', quantity: 1 }], payment: 'card' })
    expect(unknown.status).toBe(422)
    expect(unknown.body.data.fields['lines.0.sku']).toMatch(/no such part/i)
    expect((await c.post('/api/orders', { payment: 'card' })).status).toBe(422)
  })

  it('makes one order for one idempotency key', async () => {
    const garage = await makeGarage({ terms: 'account', creditLimitMinor: 100_000, label: 'Key Garage' })
    const c = await as(garage.email)
    const send = () => c.request('/api/orders', { method: 'POST', json: order('account'), headers: { 'idempotency-key': 'basket-visit-0001' } })
    const [a, b] = await Promise.all([send(), send()])
    expect([a.status, b.status].sort()).toEqual([200, 201])
    expect(a.body.id).toBe(b.body.id)
    expect((await c.get('/api/orders')).body.meta.total).toBe(1)
  })
})
