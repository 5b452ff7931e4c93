/**
 * Split supply instead of refusal: a line short at the home branch is filled by a transfer from another branch
 * and back-ordered for the rest; back-orders take arriving stock in order of ordering (whole lines, the oldest
 * first: a later, smaller line never jumps the queue); concurrent orders never oversell, back-orders included.
 * The garage chooses per line to send what is here or wait for all; the counter picks, and a short pick becomes
 * a back-order or a transfer, never a silent change.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { as, env, people, waitForMail, type Client } from '../support/api'
import { branchId, linesOf, makeGarage, makePart, stockOf, type TestGarage } from '../support/orders'

await setup({ host: env().baseUrl })

let counter: Client
let garages: TestGarage[]
let clients: Client[]
let ngt: number

beforeAll(async () => {
  garages = await Promise.all([
    makeGarage({ terms: 'account', creditLimitMinor: 10_000_000, label: 'Queue Garage A' }),
    makeGarage({ terms: 'card', label: 'Queue Garage B' }),
    makeGarage({ terms: 'account', creditLimitMinor: 10_000_000, label: 'Queue Garage C' }),
  ])
  clients = await Promise.all(garages.map((g) => as(g.email)))
  counter = await as(people.counter)
  ngt = await branchId('NGT')
})

const order = async (c: Client, sku: string, quantity: number, extra: Record<string, unknown> = {}) => {
  const r = await c.post('/api/orders', { lines: [{ sku, quantity }], payment: 'account', ...extra })
  expect(r.status, r.text).toBe(201)
  return r.body
}
const receive = async (sku: string, quantity: number) => {
  const r = await counter.post('/api/counter/stock-receipts', { sku, branchId: ngt, quantity })
  expect(r.status, r.text).toBe(200)
  return r.body
}
const states = async (orderId: number) => (await linesOf(orderId)).map((l) => [l.source, l.state, l.quantity])

describe('a line short at the home branch', () => {
  it('is previewed as the shelf, a transfer and a back-order, each with its promise, and placed so', async () => {
    const part = await makePart({ listPriceMinor: 2_000, stock: { NGT: 2, RVS: 3 } })
    const preview = await clients[0]!.post('/api/orders/preview', { lines: [{ sku: part.sku, quantity: 7 }] })
    expect(preview.status, preview.text).toBe(200)
    expect(preview.body.lines.map((l: { source: string; quantity: number; branch: { code: string } | null }) => [l.source, l.quantity, l.branch?.code ?? null]))
      .toEqual([['home', 2, 'NGT'], ['transfer', 3, 'RVS'], ['back_order', 2, null]])
    expect(preview.body.lines[1].promise).toMatch(/^by transfer from Riverside: /)
    expect(preview.body.lines[2].promise).toMatch(/^back-ordered from the supplier: /)
    expect(preview.body.lines.every((l: { arrivesAt: string | null }) => typeof l.arrivesAt === 'string')).toBe(true)
    expect(preview.body.shortages).toEqual([{ sku: part.sku, available: 2, wanted: 7 }])
    // 7 x £20.00 = £140.00 + VAT 20 % (gov.uk "VAT rates") £28.00 = £168.00, split or not
    expect(preview.body).toMatchObject({ subtotalMinor: 14_000, taxMinor: 2_800, totalMinor: 16_800 })

    const placed = await order(clients[0]!, part.sku, 7)
    expect(placed.totalMinor).toBe(16_800)
    expect(await states(placed.id)).toEqual([['home', 'reserved', 2], ['transfer', 'reserved', 3], ['back_order', 'waiting', 2]])
    expect(await stockOf(part.id, 'NGT')).toBe(0)
    expect(await stockOf(part.id, 'RVS')).toBe(0)
  })

  it('can wait for all: the part on the shelf is promised with the rest', async () => {
    const part = await makePart({ listPriceMinor: 2_000, stock: { NGT: 1 } })
    const r = await clients[0]!.post('/api/orders/preview', { lines: [{ sku: part.sku, quantity: 3, fulfilment: 'wait_for_all' }] })
    const [here, later] = r.body.lines
    expect([here.source, later.source]).toEqual(['home', 'back_order'])
    expect(here.arrivesAt).toBe(later.arrivesAt)
    expect(here.promise).toMatch(/^sent with the rest: /)
    const sendNow = (await clients[0]!.post('/api/orders/preview', { lines: [{ sku: part.sku, quantity: 3, fulfilment: 'ship_available' }] })).body.lines
    expect(new Date(sendNow[0].arrivesAt).getTime()).toBeLessThan(new Date(sendNow[1].arrivesAt).getTime())
  })
})

describe('back-orders when stock arrives', () => {
  it('are filled oldest order first, whole lines, and the garage is told', async () => {
    const part = await makePart({ listPriceMinor: 1_500, stock: { NGT: 0 } })
    const a = await order(clients[0]!, part.sku, 3) // waits for 3
    const b = await order(clients[2]!, part.sku, 1) // waits for 1, ordered later
    expect(await states(a.id)).toEqual([['back_order', 'waiting', 3]])

    // 2 arrive: not enough for the oldest line, and the later, smaller one does not jump the queue
    expect((await receive(part.sku, 2)).filled).toEqual([])
    expect(await states(b.id)).toEqual([['back_order', 'waiting', 1]])
    // 1 more: the oldest line is whole now
    const third = await receive(part.sku, 1)
    expect(third.filled).toEqual([{ orderReference: a.reference, quantity: 3 }])
    expect(third.onShelf).toBe(0)
    expect(await states(a.id)).toEqual([['back_order', 'reserved', 3]])
    expect((await linesOf(a.id))[0]!.sourceBranchId).toBe(ngt)
    // and the next one
    expect((await receive(part.sku, 1)).filled).toEqual([{ orderReference: b.reference, quantity: 1 }])
    await waitForMail(garages[0]!.email, new RegExp(`Back-ordered parts are in for order ${a.reference}`))

    // a new order now has to wait behind nobody: it takes what is on the shelf
    await receive(part.sku, 2)
    const c = await order(clients[2]!, part.sku, 2)
    expect(await states(c.id)).toEqual([['home', 'reserved', 2]])
  })

  it('come before a new order for the stock that has just arrived', async () => {
    const part = await makePart({ listPriceMinor: 1_500, stock: { NGT: 0 } })
    const older = await order(clients[0]!, part.sku, 2)
    // stock counted in by another way (as a price file would): straight into the table
    const { getDb, withWrite } = await import('../../server/utils/db')
    await withWrite((t) => getDb().query('UPDATE stock_levels SET quantity = 2 WHERE part_id = :p AND branch_id = :b', { replacements: { p: part.id, b: ngt }, transaction: t }))
    // the new order is placed before the older line was filled by anyone: it must still wait its turn
    const newer = await order(clients[2]!, part.sku, 2)
    expect(await states(older.id)).toEqual([['back_order', 'reserved', 2]])
    expect(await states(newer.id)).toEqual([['back_order', 'waiting', 2]])
  })
})

describe('concurrent orders against limited stock', () => {
  it('never oversell, back-orders included, and fill the queue in order of ordering', async () => {
    const part = await makePart({ listPriceMinor: 1_000, stock: { NGT: 5, RVS: 3 } })
    const first = await Promise.all(Array.from({ length: 20 }, (_, i) =>
      clients[i % 2]!.post('/api/orders', { lines: [{ sku: part.sku, quantity: 1 }], payment: i % 2 ? 'card' : 'account' })))
    expect(first.map((r) => r.status)).toEqual(Array(20).fill(201))
    const lines = (await Promise.all(first.map((r) => linesOf(r.body.id)))).flat()
    const count = (source: string) => lines.filter((l) => l.source === source).reduce((s, l) => s + l.quantity, 0)
    expect([count('home'), count('transfer'), count('back_order')]).toEqual([5, 3, 12])
    expect(await stockOf(part.id, 'NGT')).toBe(0)
    expect(await stockOf(part.id, 'RVS')).toBe(0)

    // 10 more orders race two deliveries of 5: the 12 older back-orders come first, so the new ones all wait
    const second = await Promise.all([
      ...Array.from({ length: 10 }, () => clients[2]!.post('/api/orders', { lines: [{ sku: part.sku, quantity: 1 }], payment: 'account' })),
      counter.post('/api/counter/stock-receipts', { sku: part.sku, branchId: ngt, quantity: 5 }),
      counter.post('/api/counter/stock-receipts', { sku: part.sku, branchId: ngt, quantity: 5 }),
    ])
    expect(second.map((r) => r.status)).toEqual([...Array(10).fill(201), 200, 200])
    expect(await stockOf(part.id, 'NGT')).toBe(0)
    const waitingQueue = (await Promise.all(first.map((r) => linesOf(r.body.id)))).flat()
      .filter((l) => l.source === 'back_order').sort((x, y) => x.orderId - y.orderId)
    // the 10 oldest are held, the last 2 still wait: a prefix of the queue, nothing skipped
    expect(waitingQueue.map((l) => l.state)).toEqual([...Array(10).fill('reserved'), 'waiting', 'waiting'])
    const newer = (await Promise.all(second.slice(0, 10).map((r) => linesOf(r.body.id)))).flat()
    expect(newer.map((l) => `${l.source}:${l.state}`)).toEqual(Array(10).fill('back_order:waiting'))
  })
})

describe('picking', () => {
  it('turns a short pick into a back-order or a transfer, tells the garage, and sends what was picked', async () => {
    const part = await makePart({ listPriceMinor: 3_000, stock: { NGT: 4, RVS: 5 } })
    const placed = await order(clients[0]!, part.sku, 4)
    const lineId = (await linesOf(placed.id))[0]!.id
    const notPicking = await counter.post(`/api/counter/orders/${placed.id}/picks`, { lines: [{ lineId, picked: 4 }] })
    expect(notPicking.status).toBe(409)
    expect((await counter.patch(`/api/counter/orders/${placed.id}`, { status: 'picking' })).status).toBe(200)
    const list = (await counter.get(`/api/counter/orders/${placed.id}`)).body.pickList
    expect(list).toEqual([expect.objectContaining({ lineId, quantity: 4, ready: true, waitingFor: null })])

    const noShortfall = await counter.post(`/api/counter/orders/${placed.id}/picks`, { lines: [{ lineId, picked: 1 }] })
    expect(noShortfall.status).toBe(422)
    expect(noShortfall.body.data.fields['lines.0.shortfall']).toMatch(/back-order or transfer/)
    const tooMany = await counter.post(`/api/counter/orders/${placed.id}/picks`, { lines: [{ lineId, picked: 5 }] })
    expect(tooMany.body.data.fields['lines.0.picked']).toMatch(/At most 4/)

    // the shelf held 1, not 4: 3 come by transfer from Riverside
    const picked = await counter.post(`/api/counter/orders/${placed.id}/picks`, { lines: [{ lineId, picked: 1, shortfall: 'transfer' }] })
    expect(picked.status, picked.text).toBe(200)
    expect(await states(placed.id)).toEqual([['home', 'picked', 1], ['transfer', 'reserved', 3]])
    expect(await stockOf(part.id, 'RVS')).toBe(2)
    // the order's figures do not move: 4 x £30.00 = £120.00, VAT £24.00, in both lines' stated tax
    const rows = await linesOf(placed.id)
    expect(rows.reduce((s, l) => s + (l.taxMinor ?? 0), 0)).toBe(2_400)
    await waitForMail(garages[0]!.email, new RegExp(`Order ${placed.reference}: some parts follow later`))

    const sent = await counter.patch(`/api/counter/orders/${placed.id}`, { status: 'dispatched' })
    expect(sent.status, sent.text).toBe(200)
    expect(sent.body.status).toBe('part_dispatched')
    expect(sent.body.dispatches).toHaveLength(1)
    expect(sent.body.dispatches[0].invoice.reference).toMatch(/^INV-\d{6}$/)
    expect(sent.body.lines.map((l: { state: string }) => l.state)).toEqual(['dispatched', 'reserved'])
    // the transfer is on its way: nothing to pick until it arrives
    expect((await counter.patch(`/api/counter/orders/${placed.id}`, { status: 'picking' })).status).toBe(200)
    const waiting = (await counter.get(`/api/counter/orders/${placed.id}`)).body.pickList
    expect(waiting[0]).toMatchObject({ ready: false, waitingFor: expect.stringMatching(/^on transfer from Riverside, due/) })
    expect((await counter.patch(`/api/counter/orders/${placed.id}`, { status: 'dispatched' })).status).toBe(409)
    const garageView = (await clients[0]!.get(`/api/orders/${placed.id}`)).body
    expect(garageView.lines[1]).toMatchObject({ source: 'transfer', state: 'reserved', branch: { code: 'RVS' } })
    expect(garageView.lines[0].promise).toBe('sent today')
  })

  it('back-orders the rest when the shelf is empty, and a cancellation frees held units for the queue', async () => {
    const part = await makePart({ listPriceMinor: 3_000, stock: { NGT: 2 } })
    const placed = await order(clients[0]!, part.sku, 2)
    const waiter = await order(clients[2]!, part.sku, 2)
    expect(await states(waiter.id)).toEqual([['back_order', 'waiting', 2]])
    await counter.patch(`/api/counter/orders/${placed.id}`, { status: 'picking' })
    const lineId = (await linesOf(placed.id))[0]!.id
    const r = await counter.post(`/api/counter/orders/${placed.id}/picks`, { lines: [{ lineId, picked: 0, shortfall: 'back_order' }] })
    expect(r.status, r.text).toBe(200)
    expect(await states(placed.id)).toEqual([['back_order', 'waiting', 2]])
    // it keeps its place in the queue (ordered first), ahead of the other garage
    await receive(part.sku, 2)
    expect(await states(placed.id)).toEqual([['back_order', 'reserved', 2]])
    expect(await states(waiter.id)).toEqual([['back_order', 'waiting', 2]])
    // cancelling it puts the 2 back, and the waiting order takes them at once
    expect((await counter.patch(`/api/counter/orders/${placed.id}`, { status: 'cancelled', reason: 'garage changed the job' })).status).toBe(200)
    expect(await states(waiter.id)).toEqual([['back_order', 'reserved', 2]])
    expect(await stockOf(part.id)).toBe(0)
  })
})
