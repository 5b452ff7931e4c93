/**
 * The stock an unpaid card order holds goes back to the shelf when its checkout expires (the signed
 * `checkout.session.expired` event, or the periodic sweep) or when the order is cancelled; paying again
 * takes it again while it lasts.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { as, env, people, waitForMail, type Client } from '../support/api'
import { backdateOrder, eventsFor, fake, makeGarage, makePart, orderRow, payOnFake, sessionIdOf, stockOf, type TestGarage } from '../support/orders'

await setup({ host: env().baseUrl })

let garage: TestGarage
let c: Client

beforeAll(async () => {
  garage = await makeGarage({ terms: 'card', label: 'Expiry Garage' })
  c = await as(garage.email)
})

const place = async (sku: string, quantity: number, client = c) => {
  const r = await client.post('/api/orders', { lines: [{ sku, quantity }], payment: 'card' })
  expect(r.status, r.text).toBe(201)
  return r.body
}

describe('held stock of unpaid card orders', () => {
  it('goes back when the checkout expires, and is taken again when the garage pays after all', async () => {
    const part = await makePart({ listPriceMinor: 3_000, stock: { NGT: 5 } })
    const order = await place(part.sku, 3)
    expect(await stockOf(part.id)).toBe(2)
    const first = sessionIdOf((await c.post(`/api/orders/${order.id}/checkout`)).body.url)
    const r = await fake('POST', `/_fake/sessions/${first}/expire`)
    expect(r.json.delivery.status).toBe(200)
    expect(await stockOf(part.id)).toBe(5)
    const lapsed = (await c.get(`/api/orders/${order.id}`)).body
    expect(lapsed).toMatchObject({ status: 'lapsed', paymentState: 'unpaid' })
    expect(lapsed.can.pay).toBe(true)
    await waitForMail(garage.email, new RegExp(`Checkout for order ${order.reference} lapsed`))

    // the same event again changes nothing
    const [evt] = await eventsFor(first, 'checkout.session.expired')
    await fake('POST', `/_fake/events/${evt!.event.id}/resend`)
    expect(await stockOf(part.id)).toBe(5)

    const again = (await c.post(`/api/orders/${order.id}/checkout`)).body
    const second = sessionIdOf(again.url)
    expect(second).not.toBe(first)
    expect(await stockOf(part.id)).toBe(2)
    expect((await orderRow(order.id))!.status).toBe('awaiting_payment')
    await payOnFake(second)
    expect((await c.get(`/api/orders/${order.id}`)).body).toMatchObject({ status: 'confirmed', paymentState: 'paid' })
    expect(await stockOf(part.id)).toBe(2)
  })

  it('cannot be taken again once someone else has bought it', async () => {
    const part = await makePart({ listPriceMinor: 3_000, stock: { NGT: 2 } })
    const order = await place(part.sku, 2)
    const s = sessionIdOf((await c.post(`/api/orders/${order.id}/checkout`)).body.url)
    await fake('POST', `/_fake/sessions/${s}/expire`)
    expect(await stockOf(part.id)).toBe(2)
    const rival = await as((await makeGarage({ terms: 'card', label: 'Rival Garage' })).email)
    await place(part.sku, 2, rival)
    const r = await c.post(`/api/orders/${order.id}/checkout`)
    expect(r.status).toBe(409)
    expect(r.body.message).toMatch(/Only 0 left/)
    expect((await orderRow(order.id))!.status).toBe('lapsed')
    expect((await c.post(`/api/orders/${order.id}/cancel`)).body.status).toBe('cancelled')
    expect(await stockOf(part.id)).toBe(0)
  })

  it('goes back when the garage cancels, and the open checkout is closed', async () => {
    const part = await makePart({ listPriceMinor: 3_000, stock: { NGT: 4 } })
    const order = await place(part.sku, 4)
    const s = sessionIdOf((await c.post(`/api/orders/${order.id}/checkout`)).body.url)
    const r = await c.post(`/api/orders/${order.id}/cancel`)
    expect(r.body).toMatchObject({ status: 'cancelled', paymentState: 'unpaid' })
    expect(await stockOf(part.id)).toBe(4)
    expect((await eventsFor(s, 'checkout.session.expired')).length).toBe(1)
    expect((await payOnFake(s)).status).toBe(409) // nobody can pay it any more
    expect((await c.post(`/api/orders/${order.id}/checkout`)).status).toBe(409)
  })

  it('goes back in the sweep when no checkout was opened within the hold time', async () => {
    const part = await makePart({ listPriceMinor: 3_000, stock: { NGT: 3 } })
    const order = await place(part.sku, 1)
    expect(await stockOf(part.id)).toBe(2)
    // pretend it was placed two hours ago
    await backdateOrder(order.id, 2 * 3600_000)
    expect((await c.post('/api/counter/orders/sweep')).status).toBe(403)
    const counter = await as(people.counter)
    const r = await counter.post('/api/counter/orders/sweep')
    expect(r.status).toBe(200)
    expect(r.body.lapsed).toBeGreaterThanOrEqual(1)
    expect((await orderRow(order.id))!.status).toBe('lapsed')
    expect(await stockOf(part.id)).toBe(3)
  })
})
