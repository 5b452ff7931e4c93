/**
 * Every order route checks the role and the owner: a garage cannot see or act on another garage's order
 * (404, never revealing it exists), garage and distributor routes are each other's 403, signed-out is 401.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { Client, as, env, people } from '../support/api'
import { makeGarage, makePart, orderRow, payOnFake, sessionIdOf } from '../support/orders'

await setup({ host: env().baseUrl })

let mine: Client
let theirs: Client
let order: { id: number; coreReturns: { id: number; orderLineId: number }[] }
let unpaid: { id: number }

beforeAll(async () => {
  const [a, b] = await Promise.all([
    makeGarage({ terms: 'account', creditLimitMinor: 100_000, label: 'Owner Garage' }),
    makeGarage({ terms: 'card', label: 'Nosy Garage' }),
  ])
  mine = await as(a.email)
  theirs = await as(b.email)
  const part = await makePart({ listPriceMinor: 2_000, coreDepositMinor: 500, stock: { NGT: 20 } })
  order = (await mine.post('/api/orders', { lines: [{ sku: part.sku, quantity: 1 }], payment: 'account' })).body
  unpaid = (await mine.post('/api/orders', { lines: [{ sku: part.sku, quantity: 1 }], payment: 'card' })).body
  const counter = await as(people.counter)
  for (const status of ['picking', 'dispatched']) await counter.patch(`/api/counter/orders/${order.id}`, { status })
  // its old unit is expected once the part has left
  order = (await mine.get(`/api/orders/${order.id}`)).body
})

describe('owner and role checks on orders', () => {
  it('answers 404 to another garage for every route on the order', async () => {
    const answers = await Promise.all([
      theirs.get(`/api/orders/${order.id}`),
      theirs.post(`/api/orders/${unpaid.id}/checkout`),
      theirs.post(`/api/orders/${order.id}/cancel`),
      theirs.post(`/api/orders/${unpaid.id}/cancel`),
      theirs.get(`/api/orders/${order.id}/invoice.pdf`),
      theirs.post('/api/core-returns', { coreReturnId: order.coreReturns[0]!.id }),
      theirs.post('/api/core-returns', { orderLineId: order.coreReturns[0]!.orderLineId }),
    ])
    expect(answers.map((r) => r.status)).toEqual([404, 404, 404, 404, 404, 404, 404])
    expect(answers[0]!.body.message).toBe('Order not found.')
    // the same as a order that does not exist at all
    expect((await theirs.get('/api/orders/99999999')).body.message).toBe('Order not found.')
    expect((await theirs.get('/api/orders')).body.data.some((o: { id: number }) => o.id === order.id)).toBe(false)
    expect((await orderRow(unpaid.id))!.status).toBe('awaiting_payment')
    // the owner can
    expect((await mine.get(`/api/orders/${order.id}`)).status).toBe(200)
    expect((await mine.post('/api/core-returns', { coreReturnId: order.coreReturns[0]!.id })).status).toBe(200)
  })

  it('does not let another garage pay for the order or read its statement lines', async () => {
    const url = (await mine.post(`/api/orders/${unpaid.id}/checkout`)).body.url
    await payOnFake(sessionIdOf(url))
    const s = (await theirs.get('/api/statement')).body
    expect(s.entries.some((e: { orderId: number }) => e.orderId === unpaid.id || e.orderId === order.id)).toBe(false)
  })

  it('keeps garage routes from distributor staff and technicians, and counter routes from garages', async () => {
    const counter = await as(people.counter)
    const tech = await as(people.technician)
    expect((await counter.get('/api/orders')).status).toBe(403)
    expect((await counter.post('/api/orders', { lines: [{ sku: 'X', quantity: 1 }], payment: 'card' })).status).toBe(403)
    expect((await counter.get('/api/statement')).status).toBe(403)
    expect((await tech.get('/api/orders')).status).toBe(403)
    expect((await tech.post(`/api/orders/${order.id}/checkout`)).status).toBe(403)
    expect((await tech.get('/api/statement.csv')).status).toBe(403)
    for (const r of await Promise.all([
      mine.get('/api/counter/orders'),
      mine.get(`/api/counter/orders/${order.id}`),
      mine.patch(`/api/counter/orders/${order.id}`, { status: 'delivered' }),
      mine.get('/api/counter/core-returns'),
      mine.patch(`/api/counter/core-returns/${order.coreReturns[0]!.id}`, { status: 'accepted' }),
      mine.post('/api/counter/orders/sweep'),
    ])) expect(r.status).toBe(403)
    expect((await orderRow(order.id))!.status).toBe('dispatched')
    // distributor staff read any order's invoice
    expect((await counter.get(`/api/orders/${order.id}/invoice.pdf`)).status).toBe(200)
    expect((await counter.get(`/api/counter/orders/${order.id}`)).body.garage.name).toMatch(/^Owner Garage/)
  })

  it('answers 401 when signed out and 403 to a garage that is not approved', async () => {
    const anon = new Client()
    for (const r of await Promise.all([
      anon.get('/api/orders'), anon.post('/api/orders', {}), anon.get(`/api/orders/${order.id}`), anon.get('/api/statement'),
      anon.post('/api/core-returns', {}), anon.get('/api/counter/orders'),
    ])) expect(r.status).toBe(401)
    const pending = await as(people.pendingManager)
    expect((await pending.post('/api/orders', { lines: [{ sku: 'X', quantity: 1 }], payment: 'card' })).status).toBe(403)
  })

  it('refuses an order sent from another site', async () => {
    const r = await mine.request('/api/orders', { method: 'POST', json: { lines: [{ sku: 'X', quantity: 1 }], payment: 'card' }, headers: { origin: 'http://elsewhere.test' } })
    expect(r.status).toBe(403)
  })
})
