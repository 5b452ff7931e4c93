/**
 * Declined cards leave the order unpaid with the bank's reason for the garage to read, and the garage can try
 * again on the same checkout. Test cards as the payment service documents them (../shared/payments-fake.md):
 * 4000 0000 0000 0002 generic decline, 4000 0000 0000 9995 insufficient funds, 4242 4242 4242 4242 succeeds.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { as, env, type Client } from '../support/api'
import { ledgerOf, makeGarage, makePart, sessionIdOf, stockOf, waitFor, type TestGarage, type TestPart } from '../support/orders'

await setup({ host: env().baseUrl })

let garage: TestGarage
let part: TestPart
let c: Client

beforeAll(async () => {
  garage = await makeGarage({ terms: 'card', label: 'Decline Garage' })
  part = await makePart({ listPriceMinor: 2500, stock: { NGT: 10 } })
  c = await as(garage.email)
})

async function payForm(url: string, card: string) {
  const res = await fetch(url, { method: 'POST', body: new URLSearchParams({ card }), redirect: 'manual' })
  return { status: res.status, html: await res.text(), location: res.headers.get('location') }
}

describe('declined cards', () => {
  it('keeps the order unpaid with the reason shown, and pays on retry', async () => {
    const order = (await c.post('/api/orders', { lines: [{ sku: part.sku, quantity: 2 }], payment: 'card' })).body
    const held = await stockOf(part.id)
    const { url } = (await c.post(`/api/orders/${order.id}/checkout`)).body

    const first = await payForm(url, '4000 0000 0000 0002')
    expect(first.status).toBe(402)
    expect(first.html).toContain('Your card was declined.')
    // the page answers at once; the decline reaches the app by its webhook event
    const declined = (code: string) => waitFor(async () => {
      const v = (await c.get(`/api/orders/${order.id}`)).body
      return v.decline?.code === code ? v : null
    }, `a ${code} decline`)
    let view = await declined('generic_decline')
    expect(view).toMatchObject({ status: 'awaiting_payment', paymentState: 'unpaid' })
    expect(view.decline).toMatchObject({ reason: 'Your card was declined.', code: 'generic_decline' })
    expect(view.can.pay).toBe(true)

    // retry: the same checkout is still open and comes back
    const retry = (await c.post(`/api/orders/${order.id}/checkout`)).body
    expect(sessionIdOf(retry.url)).toBe(sessionIdOf(url))
    const second = await payForm(retry.url, '4000 0000 0000 9995')
    expect(second.status).toBe(402)
    view = await declined('insufficient_funds')
    expect(view.decline).toMatchObject({ reason: 'Your card has insufficient funds.', code: 'insufficient_funds' })
    expect(view.paymentState).toBe('unpaid')
    expect(await ledgerOf(garage.id)).toEqual([]) // nothing charged
    expect(await stockOf(part.id)).toBe(held) // still held for the retry

    const third = await payForm(retry.url, '4242 4242 4242 4242')
    expect(third.status).toBe(303)
    view = (await c.get(`/api/orders/${order.id}`)).body
    expect(view).toMatchObject({ status: 'confirmed', paymentState: 'paid', decline: null })
    expect(view.timeline.map((t: { label: string }) => t.label)).toEqual(expect.arrayContaining(['Card declined', 'Paid by card']))
  })

  it('explains an invalid card number without trying a payment', async () => {
    const order = (await c.post('/api/orders', { lines: [{ sku: part.sku, quantity: 1 }], payment: 'card' })).body
    const { url } = (await c.post(`/api/orders/${order.id}/checkout`)).body
    const r = await payForm(url, '1234')
    expect(r.status).toBe(400)
    expect((await c.get(`/api/orders/${order.id}`)).body).toMatchObject({ paymentState: 'unpaid', decline: null })
  })
})
