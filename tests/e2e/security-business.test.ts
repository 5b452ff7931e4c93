/**
 * Business rules an attacker (or a slow garage) could lean on (WSTG-BUSL: integrity checks, timing of the process,
 * circumvention of work flows): a lapsed card order cannot be paid days later at its old prices; an unpaid card order
 * holds stock for the configured time only and its checkout closes with it; a suspended garage's owner links take no
 * decisions; and exported CSV cells cannot start a formula or a new cell (OWASP "CSV Injection").
 */
import { describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { as, Client, env, people } from '../support/api'
import { dbValue, newApprovedGarage } from '../support/accounts'
import { backdateOrder, fake, makeGarage, makePart, models, orderRow, sessionIdOf, stockOf } from '../support/orders'
import { sendAndReadLink, startQuote } from '../support/quotes'
import { withWrite } from '../../server/utils/db'
import { Part, PartPrice } from '../../server/models/catalogue'

await setup({ host: env().baseUrl })

async function setListPrice(partId: number, listPriceMinor: number) {
  models()
  await withWrite((t) => PartPrice.update({ listPriceMinor }, { where: { partId }, transaction: t }))
}

describe('card orders that wait', () => {
  it('opens a checkout that closes when the 30-minute hold ends', async () => {
    const garage = await makeGarage({ terms: 'card', label: 'Hold Garage' })
    const c = await as(garage.email)
    const part = await makePart({ listPriceMinor: 2_000, stock: { NGT: 3 } })
    const order = (await c.post('/api/orders', { lines: [{ sku: part.sku, quantity: 1 }], payment: 'card' })).body
    const before = Math.floor(Date.now() / 1000)
    expect((await c.post(`/api/orders/${order.id}/checkout`)).status).toBe(200)
    const sent = (await fake('GET', '/_fake/requests?path=/v1/checkout/sessions&method=POST')).json.data
      .filter((r: { idempotencyKey: string }) => r.idempotencyKey?.startsWith(`boreline-order-${order.id}-`))
    // 30 minutes and the minute's margin over the payment service's minimum: 30 x 60 + 60 = 1,860 s
    const expiresIn = Number(sent[0].body.expires_at) - before
    expect(expiresIn).toBeGreaterThanOrEqual(1860)
    expect(expiresIn).toBeLessThan(1860 + 30)
  })

  it('lets an order that never reached checkout go back on the shelf after the hold (30 minutes)', async () => {
    const garage = await makeGarage({ terms: 'card', label: 'Hold Garage' })
    const c = await as(garage.email)
    const part = await makePart({ listPriceMinor: 2_000, stock: { NGT: 3 } })
    const order = (await c.post('/api/orders', { lines: [{ sku: part.sku, quantity: 2 }], payment: 'card' })).body
    await backdateOrder(order.id, 31 * 60_000)
    expect((await (await as(people.counter)).post('/api/counter/orders/sweep')).status).toBe(200)
    expect((await orderRow(order.id))!.status).toBe('lapsed')
    expect(await stockOf(part.id)).toBe(3)
  })

  it('prices a lapsed order again before it is paid: the garage sees the new total, then pays that', async () => {
    const garage = await makeGarage({ terms: 'card', label: 'Reprice Garage' })
    const c = await as(garage.email)
    const part = await makePart({ listPriceMinor: 3_000, stock: { NGT: 5 } })
    const order = (await c.post('/api/orders', { lines: [{ sku: part.sku, quantity: 2 }], payment: 'card' })).body
    // 2 x £30.00 = £60.00, VAT 20 % (gov.uk "VAT rates") £12.00: £72.00
    expect(order.totalMinor).toBe(7_200)
    const first = sessionIdOf((await c.post(`/api/orders/${order.id}/checkout`)).body.url)
    await fake('POST', `/_fake/sessions/${first}/expire`)
    expect((await orderRow(order.id))!.status).toBe('lapsed')

    await setListPrice(part.id, 3_600)
    const refused = await c.post(`/api/orders/${order.id}/checkout`)
    expect(refused.status).toBe(409)
    // 2 x £36.00 = £72.00, VAT £14.40: £86.40 (no tier discount for this garage)
    expect(refused.body.data.repriced).toEqual({ previousTotalMinor: 7_200, totalMinor: 8_640 })
    expect(refused.body.message).toMatch(/£86\.40.*£72\.00/)
    expect(await stockOf(part.id)).toBe(5) // nothing held while the garage looks
    const shown = (await c.get(`/api/orders/${order.id}`)).body
    expect(shown).toMatchObject({ status: 'lapsed', totalMinor: 8_640, subtotalMinor: 7_200, taxMinor: 1_440 })
    expect(dbValue(`SELECT COUNT(*) FROM audit_log WHERE action = 'order.repriced' AND entity_id = '${order.id}'`)).toBe(1)

    const paid = await c.post(`/api/orders/${order.id}/checkout`)
    expect(paid.status).toBe(200)
    expect(await stockOf(part.id)).toBe(3)
    const sent = (await fake('GET', '/_fake/requests?path=/v1/checkout/sessions&method=POST')).json.data
      .filter((r: { idempotencyKey: string }) => r.idempotencyKey?.startsWith(`boreline-order-${order.id}-`)).at(-1)
    const items = sent.body.line_items as { quantity: string; price_data: { unit_amount: string } }[]
    expect(items.reduce((s, i) => s + Number(i.price_data.unit_amount) * Number(i.quantity), 0)).toBe(8_640)
  })

  it('refuses payment of a lapsed order whose part has gone', async () => {
    const garage = await makeGarage({ terms: 'card', label: 'Gone Garage' })
    const c = await as(garage.email)
    const part = await makePart({ listPriceMinor: 1_000, stock: { NGT: 2 } })
    const order = (await c.post('/api/orders', { lines: [{ sku: part.sku, quantity: 1 }], payment: 'card' })).body
    await fake('POST', `/_fake/sessions/${sessionIdOf((await c.post(`/api/orders/${order.id}/checkout`)).body.url)}/expire`)
    models()
    await withWrite((t) => Part.update({ status: 'discontinued' }, { where: { id: part.id }, transaction: t }))
    const r = await c.post(`/api/orders/${order.id}/checkout`)
    expect(r.status).toBe(409)
    expect(r.body.message).toMatch(/can no longer be ordered/)
  })
})

describe('a suspended garage\'s owner links', () => {
  it('stop taking decisions (the owner is told to contact the garage) but still show the quote', async () => {
    const admin = await as(people.admin)
    const { id, manager } = await newApprovedGarage(admin)
    const s = await startQuote(manager)
    await manager.post(`/api/quotes/${s.quote.id}/lines`, { kind: 'labour', description: 'Brake check', hours: 0.5 })
    const { token } = await sendAndReadLink(manager, s.quote.id, s.ownerEmail)
    expect((await admin.post(`/api/admin/trade-accounts/${id}/suspend`, { reason: 'Paused while we check the account.' })).status).toBe(200)
    const owner = new Client()
    const view = await owner.get(`/api/quote-links/${token}`)
    expect(view.status).toBe(200)
    const r = await owner.post(`/api/quote-links/${token}/decision`, { lines: view.body.lines.filter((l: { decidable: boolean }) => l.decidable).map((l: { id: number }) => ({ id: l.id, approved: true })), signedName: 'Robin Tester' })
    expect(r.status).toBe(409)
    expect(r.body.message).toMatch(/contact them/)
    expect((await owner.get(`/api/quote-links/${token}`)).body.state).toBe('open')
  })
})

describe('CSV exports', () => {
  it('neutralise a cell that starts with ; as well as = + - @', async () => {
    const garage = await makeGarage({ terms: 'account', creditLimitMinor: 1_000_000, label: 'Csv Garage' })
    const c = await as(garage.email)
    const part = await makePart({ listPriceMinor: 1_000, stock: { NGT: 5 } })
    for (const garageReference of [';=1+1;x', '=HYPERLINK("http://x")', '@SUM(1)']) {
      expect((await c.post('/api/orders', { lines: [{ sku: part.sku, quantity: 1 }], payment: 'account', garageReference })).status).toBe(201)
    }
    const csv = (await c.get('/api/statement.csv')).text
    expect(csv).toContain(`';=1+1;x`)
    expect(csv).toContain(`'=HYPERLINK(""http://x"")`)
    expect(csv).toContain(`'@SUM(1)`)
    for (const line of csv.trim().split('\n').slice(1)) expect(line.split(',')[3]).not.toMatch(/^"?[;=+@]/)
  })
})
