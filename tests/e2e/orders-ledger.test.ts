/**
 * After the order: counter moves, cancellations with refunds (card, through the SDK) or credits (account), core
 * returns accepted (deposit refunded or credited) or rejected, and the statement with its running balance,
 * CSV (formula-like cells neutralised, as csv-stringify's escape_formulas documents) and the PDFs.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
// pdf-parse's index runs a self-test when imported directly; its library file is the parser itself
// @ts-expect-error no types for the inner path
import pdfParse from 'pdf-parse/lib/pdf-parse.js'
import { as, env, mailFor, people, waitForMail, type Client } from '../support/api'
import { coreReturnsOf, fake, ledgerOf, makeGarage, makePart, payOnFake, sessionIdOf, stockOf, waitFor, type TestGarage, type TestPart } from '../support/orders'

await setup({ host: env().baseUrl })

let part: TestPart
let counter: Client
const sum = (rows: { amountMinor: number }[]) => rows.reduce((s, r) => s + r.amountMinor, 0)

// £100.00 net (no tier), VAT 20 % (gov.uk "VAT rates") = £20.00, deposit £25.00 with its VAT at the part's rate
// £5.00 (the core deposit rule, shared/utils/order-totals.ts): £150.00 a unit
const UNIT = { net: 10_000, tax: 2_000, deposit: 2_500, depositTax: 500, total: 15_000 }

beforeAll(async () => {
  part = await makePart({ listPriceMinor: UNIT.net, coreDepositMinor: UNIT.deposit, stock: { NGT: 100 } })
  counter = await as(people.counter)
})

async function move(id: number, ...statuses: string[]) {
  for (const status of statuses) {
    const r = await counter.patch(`/api/counter/orders/${id}`, { status })
    expect(r.status, r.text).toBe(200)
  }
}

describe('trade account: credits', () => {
  let garage: TestGarage
  let c: Client
  beforeAll(async () => {
    garage = await makeGarage({ terms: 'account', creditLimitMinor: 1_000_000, label: 'Ledger Account Garage' })
    c = await as(garage.email)
  })

  it('credits a cancelled account order in full and puts the stock back', async () => {
    const before = await stockOf(part.id)
    const order = (await c.post('/api/orders', { lines: [{ sku: part.sku, quantity: 2 }], payment: 'account' })).body
    expect(order.totalMinor).toBe(2 * UNIT.total)
    expect(sum(await ledgerOf(garage.id))).toBe(30_000)
    const r = await counter.patch(`/api/counter/orders/${order.id}`, { status: 'cancelled', reason: 'Garage phoned: wrong axle' })
    expect(r.body).toMatchObject({ status: 'cancelled', paymentState: 'credited' })
    const ledger = await ledgerOf(garage.id)
    expect(ledger.at(-1)).toEqual({ kind: 'credit', amountMinor: -30_000, externalId: null })
    expect(sum(ledger)).toBe(0)
    expect(await stockOf(part.id)).toBe(before)
    // old units are expected once their parts leave: nothing was sent, so none are
    expect(await coreReturnsOf(order.id)).toEqual([])
    const mail = await waitForMail(garage.email, new RegExp(`${order.reference} cancelled`))
    expect(mail.text).toContain('wrong axle')
    // a cancelled order stays cancelled
    expect((await counter.patch(`/api/counter/orders/${order.id}`, { status: 'picking' })).status).toBe(409)
  })

  it('credits an accepted core return by its deposit, and a rejected one not at all', async () => {
    const order = (await c.post('/api/orders', { lines: [{ sku: part.sku, quantity: 2 }], payment: 'account' })).body
    // no old unit is due before its part has left
    expect(order.coreReturns).toEqual([])
    expect((await c.post('/api/core-returns', { orderLineId: order.lines[0].id })).status).toBe(404)
    await move(order.id, 'picking', 'dispatched')
    await waitForMail(garage.email, new RegExp(`${order.reference} is on its way`))
    const [cr] = (await c.get(`/api/orders/${order.id}`)).body.coreReturns
    const start = sum(await ledgerOf(garage.id))

    expect((await c.post('/api/core-returns', { coreReturnId: cr.id, quantity: 3 })).status).toBe(422)
    const booked = await c.post('/api/core-returns', { coreReturnId: cr.id, quantity: 1, note: 'one came back seized' })
    expect(booked.status, booked.text).toBe(200)
    expect(booked.body).toMatchObject({ status: 'booked', quantityBooked: 1, depositMinor: UNIT.deposit, depositGrossMinor: UNIT.deposit + UNIT.depositTax })
    expect((await c.post('/api/core-returns', { coreReturnId: cr.id })).status).toBe(409)
    expect((await counter.get('/api/counter/core-returns')).body.data.some((x: { id: number }) => x.id === cr.id)).toBe(true)

    const accepted = await counter.patch(`/api/counter/core-returns/${cr.id}`, { status: 'accepted' })
    // one old unit of two: the deposit £25.00 and half the deposits' £10.00 VAT, £5.00
    expect(accepted.body).toMatchObject({ status: 'accepted', creditedMinor: 3_000 })
    const ledger = await ledgerOf(garage.id)
    expect(ledger.at(-1)).toMatchObject({ kind: 'core_credit', amountMinor: -3_000 })
    expect(sum(ledger)).toBe(start - 3_000)
    expect((await counter.patch(`/api/counter/core-returns/${cr.id}`, { status: 'rejected', reason: 'late' })).status).toBe(409)
    await waitForMail(garage.email, /Old unit accepted: £30\.00 deposit returned/)

    const other = (await c.post('/api/orders', { lines: [{ sku: part.sku, quantity: 1 }], payment: 'account' })).body
    await move(other.id, 'picking', 'dispatched', 'delivered')
    const cr2 = (await c.get(`/api/orders/${other.id}`)).body.coreReturns[0]
    expect((await c.post('/api/core-returns', { orderLineId: cr2.orderLineId })).body.status).toBe('booked')
    const noReason = await counter.patch(`/api/counter/core-returns/${cr2.id}`, { status: 'rejected' })
    expect(noReason.status).toBe(422)
    expect(noReason.body.data.fields.reason).toBeTruthy()
    const before = sum(await ledgerOf(garage.id))
    const rejected = await counter.patch(`/api/counter/core-returns/${cr2.id}`, { status: 'rejected', reason: 'Cracked casting: not rebuildable' })
    expect(rejected.body).toMatchObject({ status: 'rejected', reason: 'Cracked casting: not rebuildable', creditedMinor: null })
    expect(sum(await ledgerOf(garage.id))).toBe(before)
    const mail = await waitForMail(garage.email, /Old unit not accepted/)
    expect(mail.text).toContain('Cracked casting')
  })

  it('shows the statement with a running balance and exports CSV safely', async () => {
    const order = (await c.post('/api/orders', { lines: [{ sku: part.sku, quantity: 1 }], payment: 'account', garageReference: '=HYPERLINK("http://x.test","go")' })).body
    const s = (await c.get('/api/statement')).body
    let running = 0
    for (const e of s.entries) {
      running += e.amountMinor
      expect(e.balanceMinor).toBe(running)
    }
    expect(s.balanceMinor).toBe(sum(await ledgerOf(garage.id)))
    expect(s.availableMinor).toBe(1_000_000 - s.balanceMinor)
    expect(s.entries.map((e: { kind: string }) => e.kind)).toEqual(expect.arrayContaining(['order', 'core_deposit', 'credit', 'core_credit']))

    const csv = await c.get('/api/statement.csv')
    expect(csv.headers.get('content-type')).toMatch(/text\/csv/)
    expect(csv.headers.get('content-disposition')).toMatch(/attachment; filename="statement-/)
    const lines = csv.text.trim().split('\n')
    expect(lines[0]).toBe('Date,Entry,Reference,Your reference,Details,Amount (GBP),Balance (GBP)')
    const mine = lines.filter((l) => l.includes(order.reference))
    // the formula is neutralised with a leading apostrophe (csv-stringify escape_formulas)
    expect(mine.every((l) => l.includes(`"'=HYPERLINK(""http://x.test"",""go"")"`))).toBe(true)
    // amounts stay numbers, negative ones too
    expect(lines.some((l) => /,-300\.00,/.test(l))).toBe(true)
    expect(lines.some((l) => l.includes("'-"))).toBe(false)
  })
})

describe('card: refunds through the payment service', () => {
  let garage: TestGarage
  let c: Client
  beforeAll(async () => {
    garage = await makeGarage({ terms: 'card', label: 'Ledger Card Garage' })
    c = await as(garage.email)
  })

  async function paidOrder(quantity: number) {
    const order = (await c.post('/api/orders', { lines: [{ sku: part.sku, quantity }], payment: 'card' })).body
    const { url } = (await c.post(`/api/orders/${order.id}/checkout`)).body
    await payOnFake(sessionIdOf(url))
    expect((await c.get(`/api/orders/${order.id}`)).body.paymentState).toBe('paid')
    return order
  }

  it('refunds a cancelled paid order in full, once', async () => {
    const order = await paidOrder(1)
    const r = await c.post(`/api/orders/${order.id}/cancel`, { reason: 'ordered twice' })
    expect(r.status, r.text).toBe(200)
    expect(r.body.status).toBe('cancelled')
    await waitFor(async () => (await c.get(`/api/orders/${order.id}`)).body.paymentState === 'refunded', 'the refund')
    const refunds = (await fake('GET', '/_fake/requests?path=/v1/refunds&method=POST')).json.data
      .filter((x: { idempotencyKey: string }) => x.idempotencyKey?.startsWith(`boreline-order-${order.id}-`))
    expect(refunds).toHaveLength(1)
    expect(Number(refunds[0].body.amount)).toBe(UNIT.total)
    const ledger = (await ledgerOf(garage.id)).slice(-5)
    expect(ledger.map((e) => [e.kind, e.amountMinor])).toEqual([
      ['order', 12_000], ['core_deposit', 3_000], ['payment', -15_000], ['credit', -15_000], ['refund', 15_000],
    ])
    expect(sum(await ledgerOf(garage.id))).toBe(0)
    await waitForMail(garage.email, new RegExp(`Refund sent for order ${order.reference}`))
    // the refund's own webhook (refund.created) did not book it a second time
    await new Promise((res) => setTimeout(res, 300))
    expect((await ledgerOf(garage.id)).filter((e) => e.kind === 'refund')).toHaveLength(1)
    // picking orders can only be cancelled by the counter
    const busy = await paidOrder(1)
    await move(busy.id, 'picking')
    expect((await c.post(`/api/orders/${busy.id}/cancel`)).status).toBe(409)
  })

  it('refunds an accepted core return by its deposit to the card', async () => {
    const order = await paidOrder(2)
    await move(order.id, 'picking', 'dispatched')
    const [cr] = order.coreReturns.length ? order.coreReturns : (await c.get(`/api/orders/${order.id}`)).body.coreReturns
    expect((await c.post('/api/core-returns', { coreReturnId: cr.id })).status).toBe(200)
    const start = await ledgerOf(garage.id)
    const accepted = await counter.patch(`/api/counter/core-returns/${cr.id}`, { status: 'accepted' })
    expect(accepted.body).toMatchObject({ status: 'accepted', creditedMinor: 2 * (UNIT.deposit + UNIT.depositTax) })
    await waitFor(async () => !(await coreReturnsOf(order.id))[0]!.refundPending, 'the core refund')
    const added = (await ledgerOf(garage.id)).slice(start.length)
    expect(added.map((e) => [e.kind, e.amountMinor])).toEqual([['core_credit', -6_000], ['refund', 6_000]])
    const refunds = (await fake('GET', '/_fake/requests?path=/v1/refunds&method=POST')).json.data
      .filter((x: { idempotencyKey: string }) => x.idempotencyKey?.startsWith(`boreline-core-return-${cr.id}-`))
    expect(refunds.map((x: { body: { amount: string } }) => Number(x.body.amount))).toEqual([6_000])
    const view = (await c.get(`/api/orders/${order.id}`)).body
    expect(view.coreReturns[0]).toMatchObject({ status: 'accepted', creditedMinor: 6_000, refundPending: false })
  })

  it('issues an order confirmation and a delivery note as PDFs set in Inter', async () => {
    const order = await paidOrder(1)
    const inv = await fetch(`${env().baseUrl}/api/orders/${order.id}/invoice.pdf`, { headers: { cookie: c.cookieHeader() } })
    expect(inv.status).toBe(200)
    expect(inv.headers.get('content-type')).toBe('application/pdf')
    const bytes = Buffer.from(await inv.arrayBuffer())
    expect(bytes.subarray(0, 5).toString()).toBe('%PDF-')
    expect(bytes.toString('latin1')).toMatch(/\/BaseFont \/[A-Z]{6}\+Inter/)
    const text = (await pdfParse(bytes)).text as string
    expect(text).toContain(order.reference)
    expect(text).toContain('Order confirmation')
    expect(text).toContain('£150.00')
    expect(text).toContain(garage.name)

    expect((await c.get(`/api/counter/orders/${order.id}/delivery-note.pdf`)).status).toBe(403)
    await move(order.id, 'picking', 'dispatched')
    const mail = await waitForMail(garage.email, new RegExp(`${order.reference} is on its way`))
    expect(mail.attachments.map((a) => a.filename)).toEqual([`delivery-note-${order.reference}.pdf`])
    const note = (await pdfParse(Buffer.from(mail.attachments[0]!.contentBase64, 'base64'))).text as string
    expect(note).toContain('Delivery note')
    expect(note).toContain(part.sku)
    expect(note).not.toContain('£') // no prices on the delivery note
    expect((await mailFor(garage.email)).some((m) => m.subject.includes('is being picked'))).toBe(true)
  })
})
