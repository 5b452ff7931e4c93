/**
 * The counter's pages and the basket kept with the account, by role: each page answers its own people (rendered
 * on the server), sends a role without the ability home, a signed-out visitor to sign in; another garage's order
 * or line renders as not found without a word of its contents. The basket: one per garage (not per browser),
 * a bad quantity is a 422 beside `items.N.quantity` and the basket stays as it was. The counter's routes (picks,
 * goods in), the home branch, the branches and a return's photos, each by the roles that may and may not.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { Client, as, env, people } from '../support/api'
import { pngBytes } from '../support/accounts'
import { branchId, makeGarage, makePart, stockOf, type TestGarage, type TestPart } from '../support/orders'

await setup({ host: env().baseUrl })

let garage: TestGarage
let mine: Client
let theirs: Client
let counter: Client
let admin: Client
let tech: Client
let part: TestPart
let order: { id: number; reference: string; lines: { id: number; sku: string }[] }

beforeAll(async () => {
  garage = await makeGarage({ terms: 'account', creditLimitMinor: 1_000_000, label: 'Pages Garage' })
  const other = await makeGarage({ terms: 'card', label: 'Pages Nosy Garage' })
  ;[mine, theirs, counter, admin, tech] = await Promise.all([as(garage.email), as(other.email), as(people.counter), as(people.admin), as(people.technician)])
  part = await makePart({ listPriceMinor: 3_000, stock: { NGT: 10 } })
  order = (await mine.post('/api/orders', { lines: [{ sku: part.sku, quantity: 2 }], payment: 'account' })).body
  for (const status of ['picking', 'dispatched']) expect((await counter.patch(`/api/counter/orders/${order.id}`, { status })).status).toBe(200)
})

/** Where a page sends the caller: 200 (rendered) or the path it redirects to. */
async function landing(c: Client, path: string): Promise<{ status: number; to: string | null; html: string }> {
  const r = await c.request(path, { headers: { accept: 'text/html' } })
  const to = r.headers.get('location')
  return { status: r.status, to: to ? new URL(to, env().baseUrl).pathname : null, html: r.text }
}

describe('the pages of the counter\'s day, by role', () => {
  const garagePages = ['/returns', '/orders/new']
  const counterPages = ['/counter/returns', '/counter/goods-in']

  it('shows the garage its pages and keeps the counter\'s from it', async () => {
    for (const p of [...garagePages, '/documents', `/orders/${order.id}`, `/returns/new?line=${order.lines[0]!.id}`]) {
      expect((await landing(mine, p)).status, p).toBe(200)
    }
    for (const p of [...counterPages, `/counter/orders/${order.id}`]) expect(await landing(mine, p), p).toMatchObject({ to: '/' })
  })

  it('shows counter staff and the admin their pages and keeps the garage\'s from them', async () => {
    for (const c of [counter, admin]) {
      for (const p of [...counterPages, '/documents', `/counter/orders/${order.id}`]) expect((await landing(c, p)).status, p).toBe(200)
      for (const p of garagePages) expect(await landing(c, p), p).toMatchObject({ to: '/' })
    }
  })

  it('keeps every one of them from a technician and sends a signed-out visitor to sign in', async () => {
    for (const p of [...garagePages, ...counterPages, '/documents']) {
      expect(await landing(tech, p), p).toMatchObject({ to: '/' })
      expect(await landing(new Client(), p), p).toMatchObject({ to: '/sign-in' })
    }
  })

  it('renders another garage\'s order and line as not found, without their contents', async () => {
    const o = await landing(theirs, `/orders/${order.id}`)
    expect(o.html).toContain('Order not found.')
    expect(o.html).not.toContain(part.sku)
    const l = await landing(theirs, `/returns/new?line=${order.lines[0]!.id}`)
    expect(l.html).toMatch(/not found/i)
    expect(l.html).not.toContain(part.sku)
    // the owner sees the line it may send back
    expect((await landing(mine, `/returns/new?line=${order.lines[0]!.id}`)).html).toContain(part.sku)
  })
})

describe('the basket kept with the garage\'s account', () => {
  it('is the same for every manager of the garage and separate from another garage\'s', async () => {
    const saved = await mine.request('/api/basket', { method: 'PUT', json: { items: [{ sku: part.sku, description: 'Pads', quantity: 2 }, { sku: part.sku.toLowerCase(), quantity: 1 }] } })
    expect(saved.status, saved.text).toBe(200)
    // the same part twice is one line: 2 + 1
    expect(saved.body.items).toEqual([{ sku: part.sku, description: 'Pads', quantity: 3 }])
    // a second sign-in (another browser) sees it; another garage does not
    expect((await (await as(garage.email)).get('/api/basket')).body.items).toEqual(saved.body.items)
    expect((await theirs.get('/api/basket')).body.items).toEqual([])
  })

  it('refuses 0, negative, fractional and over 999 beside the field and keeps the basket', async () => {
    const before = (await mine.get('/api/basket')).body
    for (const [quantity, message] of [[0, /at least 1/], [-2, /at least 1/], [1.5, /whole number/], [1000, /At most 999/]] as const) {
      const r = await mine.request('/api/basket', { method: 'PUT', json: { items: [{ sku: part.sku, quantity }] } })
      expect(r.status, String(quantity)).toBe(422)
      expect(r.body.data.fields['items.0.quantity']).toMatch(message)
    }
    expect((await mine.get('/api/basket')).body).toEqual(before)
  })

  it('is the garage manager\'s alone', async () => {
    for (const c of [counter, admin, tech]) {
      expect((await c.get('/api/basket')).status).toBe(403)
      expect((await c.request('/api/basket', { method: 'PUT', json: { items: [] } })).status).toBe(403)
    }
    expect((await new Client().get('/api/basket')).status).toBe(401)
  })
})

describe('the counter\'s routes, the home branch and the photos, by role', () => {
  it('lets only counter staff and the admin record picks and book goods in', async () => {
    const ngt = await branchId('NGT')
    const pick = { lines: [{ lineId: order.lines[0]!.id, picked: 1 }] }
    const receipt = { sku: part.sku, branchId: ngt, quantity: 5 }
    const shelf = await stockOf(part.id)
    for (const c of [mine, tech]) {
      expect((await c.post(`/api/counter/orders/${order.id}/picks`, pick)).status).toBe(403)
      expect((await c.post('/api/counter/stock-receipts', receipt)).status).toBe(403)
    }
    expect((await new Client().post(`/api/counter/orders/${order.id}/picks`, pick)).status).toBe(401)
    expect((await new Client().post('/api/counter/stock-receipts', receipt)).status).toBe(401)
    expect(await stockOf(part.id)).toBe(shelf)
    expect((await counter.post('/api/counter/orders/99999999/picks', pick)).status).toBe(404)
    // everything on the order has left: nothing to pick
    expect((await counter.post(`/api/counter/orders/${order.id}/picks`, pick)).status).toBe(409)
    const booked = await admin.post('/api/counter/stock-receipts', { ...receipt, quantity: 1 })
    expect(booked.status, booked.text).toBe(200)
    expect(await stockOf(part.id)).toBe(shelf + 1)
  })

  it('keeps the home branch with the admin', async () => {
    const rvs = await branchId('RVS')
    for (const c of [mine, counter, tech]) expect((await c.patch(`/api/admin/trade-accounts/${garage.id}/home-branch`, { homeBranchId: rvs })).status).toBe(403)
    expect((await new Client().patch(`/api/admin/trade-accounts/${garage.id}/home-branch`, { homeBranchId: rvs })).status).toBe(401)
    expect((await admin.patch('/api/admin/trade-accounts/99999999/home-branch', { homeBranchId: rvs })).status).toBe(404)
    const moved = await admin.patch(`/api/admin/trade-accounts/${garage.id}/home-branch`, { homeBranchId: rvs })
    expect(moved.status, moved.text).toBe(200)
  })

  it('shows the branches and their runs to anyone signed in', async () => {
    for (const c of [mine, tech, counter]) expect((await c.get('/api/branches')).status).toBe(200)
    expect((await new Client().get('/api/branches')).status).toBe(401)
  })

  it('keeps a return\'s photos with its garage and the counter', async () => {
    const asked = await mine.post('/api/returns', { orderLineId: order.lines[0]!.id, quantity: 1, reason: 'wrong_part' })
    expect(asked.status, asked.text).toBe(201)
    const photo = () => {
      const form = new FormData()
      form.append('photo', new Blob([pngBytes()], { type: 'image/png' }), 'box.png')
      return form
    }
    const sent = await mine.request(`/api/returns/${asked.body.id}/photos`, { method: 'POST', body: photo() })
    expect(sent.status, sent.text).toBe(200)
    const url = `/api/returns/${asked.body.id}/photos/${sent.body.photos[0].id}`
    expect((await theirs.request(`/api/returns/${asked.body.id}/photos`, { method: 'POST', body: photo() })).status).toBe(404)
    expect((await counter.request(`/api/returns/${asked.body.id}/photos`, { method: 'POST', body: photo() })).status).toBe(403)
    expect((await theirs.get(url)).status).toBe(404)
    expect((await tech.get(url)).status).toBe(403)
    expect((await new Client().get(url)).status).toBe(401)
    expect((await mine.get(url)).status).toBe(200)
    expect((await counter.get(url)).status).toBe(200)
  })
})
