/**
 * Invoices and credit notes as documents: each dispatch issues an invoice; each accepted old unit and accepted
 * return a credit note against it. Numbers run without gaps per series and stay unique under 20 concurrent
 * dispatches; a document cannot be changed once issued; a credit note never exceeds what its invoice charged;
 * a garage sees only its own (404 otherwise). Tax figures are worked by hand beside each check: UK standard rate
 * 20 % (gov.uk "VAT rates"), tax per line rounded half away from zero; a core deposit carries tax at the part's
 * rate (the rule in shared/utils/order-totals.ts).
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
// pdf-parse's index runs a self-test when imported directly; its library file is the parser itself
// @ts-expect-error no types for the inner path
import pdfParse from 'pdf-parse/lib/pdf-parse.js'
import { as, env, people, type Client } from '../support/api'
import { counterAndAccountGarage, makeGarage, makePart, pickAndDispatch, seriesNumbers, tamperWithDocument, type TestGarage } from '../support/orders'

await setup({ host: env().baseUrl })

let counter: Client
let garage: TestGarage
let c: Client

beforeAll(async () => {
  ;({ counter, garage, c } = await counterAndAccountGarage('Documents Garage'))
})

async function sent(client: Client, sku: string, quantity: number) {
  const order = (await client.post('/api/orders', { lines: [{ sku, quantity }], payment: 'account' })).body
  return pickAndDispatch(counter, order.id)
}

const documentOf = async (client: Client, id: number) => (await client.get(`/api/documents/${id}`)).body

describe('the invoice a dispatch issues', () => {
  it('charges the parts and their deposits with tax, analysed per rate, with the tax point and both tax numbers', async () => {
    const part = await makePart({ listPriceMinor: 10_000, coreDepositMinor: 2_500, stock: { NGT: 10 } })
    const order = await sent(c, part.sku, 2)
    const inv = await documentOf(c, order.dispatches[0].invoice.id)
    // parts 2 x £100.00 = £200.00, VAT 20 % = £40.00; deposits 2 x £25.00 = £50.00, VAT 20 % = £10.00
    // net £250.00 + VAT £50.00 = £300.00
    expect(inv).toMatchObject({ kind: 'invoice', reference: expect.stringMatching(/^INV-\d{6}$/), netMinor: 25_000, taxMinor: 5_000, totalMinor: 30_000, invoice: null })
    expect(inv.lines.map((l: { kind: string; quantity: number; netMinor: number; taxMinor: number }) => [l.kind, l.quantity, l.netMinor, l.taxMinor]))
      .toEqual([['part', 2, 20_000, 4_000], ['core_deposit', 2, 5_000, 1_000]])
    expect(inv.taxAnalysis).toEqual([{ taxBp: 2000, netMinor: 25_000, taxMinor: 5_000 }])
    expect(inv.buyer).toMatchObject({ name: garage.name, taxNumber: 'GB 000 0000 01' })
    expect(inv.seller.taxNumber).toBe('GB 900 1234 56')
    expect(inv.taxPoint).toBe(inv.issuedAt.slice(0, 10)) // the dispatch day (GMT in December)
    expect(order.totalMinor).toBe(30_000) // the order charged the same

    const pdf = await fetch(`${env().baseUrl}/api/documents/${inv.id}.pdf`, { headers: { cookie: c.cookieHeader() } })
    expect(pdf.status).toBe(200)
    expect(pdf.headers.get('content-type')).toBe('application/pdf')
    expect(pdf.headers.get('content-disposition')).toBe(`attachment; filename="invoice-${inv.reference}.pdf"`)
    const bytes = Buffer.from(await pdf.arrayBuffer())
    expect(bytes.toString('latin1')).toMatch(/\/BaseFont \/[A-Z]{6}\+Inter/)
    const text = (await pdfParse(bytes)).text as string
    for (const s of [inv.reference, 'Tax point', 'VAT analysis', 'GB 000 0000 01', 'GB 900 1234 56', '£300.00', '£50.00', order.reference]) expect(text).toContain(s)
  })

  it('lists the garage its own documents by kind, and the distributor every garage\'s', async () => {
    const list = await c.get('/api/documents?kind=invoice')
    expect(list.status).toBe(200)
    expect(list.body.meta).toMatchObject({ page: 1, pageSize: 20 })
    expect(list.body.data.length).toBeGreaterThan(0)
    expect(list.body.data.every((d: { kind: string; garage?: unknown }) => d.kind === 'invoice' && d.garage === undefined)).toBe(true)
    expect((await c.get('/api/documents?kind=credit_note')).body.data.every((d: { kind: string }) => d.kind === 'credit_note')).toBe(true)
    expect((await c.get('/api/documents?kind=receipt')).status).toBe(422)
    const all = await counter.get('/api/documents?kind=invoice')
    expect(all.body.data.some((d: { garage: { name: string } }) => d.garage.name === garage.name)).toBe(true)
  })
})

describe('document numbers', () => {
  it('run without gaps and stay unique under 20 concurrent dispatches', async () => {
    const part = await makePart({ listPriceMinor: 1_000, stock: { NGT: 40 } })
    const orders = await Promise.all(Array.from({ length: 20 }, () => c.post('/api/orders', { lines: [{ sku: part.sku, quantity: 1 }], payment: 'account' })))
    for (const o of orders) expect((await counter.patch(`/api/counter/orders/${o.body.id}`, { status: 'picking' })).status).toBe(200)
    const sentAll = await Promise.all(orders.map((o) => counter.patch(`/api/counter/orders/${o.body.id}`, { status: 'dispatched' })))
    expect(sentAll.map((r) => r.status)).toEqual(Array(20).fill(200))
    const refs = sentAll.map((r) => r.body.dispatches[0].invoice.reference as string)
    expect(new Set(refs).size).toBe(20)
    const mine = refs.map((r) => Number(r.slice(4))).sort((a, b) => a - b)
    expect(mine.at(-1)! - mine[0]! + 1).toBe(20) // twenty consecutive numbers
    // the whole series, every garage's: 1, 2, 3 … with nothing missing
    const all = await seriesNumbers('INV')
    expect(all).toEqual(all.map((_, i) => i + 1))
  })

  it('refuses any change to an issued document, in the database itself', async () => {
    const id = (await c.get('/api/documents?kind=invoice')).body.data[0].id
    expect(await tamperWithDocument(id)).toMatch(/cannot change: issue a credit note/)
    expect((await documentOf(c, id)).totalMinor).toBeGreaterThan(0)
  })
})

describe('credit notes', () => {
  it('credit an accepted old unit\'s deposit with its tax against the invoice that charged it', async () => {
    const part = await makePart({ listPriceMinor: 10_000, coreDepositMinor: 2_500, stock: { NGT: 10 } })
    const order = await sent(c, part.sku, 2)
    const cr = order.coreReturns[0]
    // the deposit to come back: 2 x £25.00 = £50.00 + VAT 20 % £10.00 = £60.00
    expect(cr).toMatchObject({ status: 'expected', quantityExpected: 2, depositMinor: 5_000, depositGrossMinor: 6_000 })
    expect((await c.post('/api/core-returns', { coreReturnId: cr.id, quantity: 1 })).status).toBe(200)
    const accepted = await counter.patch(`/api/counter/core-returns/${cr.id}`, { status: 'accepted' })
    // 1 of 2: £25.00 + its share of the £10.00 tax, £5.00 = £30.00
    expect(accepted.body).toMatchObject({ status: 'accepted', creditedMinor: 3_000, creditNote: { reference: expect.stringMatching(/^CRN-\d{6}$/) } })
    const note = await documentOf(c, accepted.body.creditNote.id)
    expect(note).toMatchObject({ kind: 'credit_note', reason: 'core', netMinor: 2_500, taxMinor: 500, totalMinor: 3_000, invoice: { id: order.dispatches[0].invoice.id } })
    const numbers = await seriesNumbers('CRN')
    expect(numbers).toEqual(numbers.map((_, i) => i + 1))
  })

  it('never exceed what the invoice charged, however the returns are split', async () => {
    // 3 x £10.01 = £30.03; VAT 20 % = £6.006, stated £6.01 (half up)
    const part = await makePart({ listPriceMinor: 1_001, stock: { NGT: 10 } })
    const order = await sent(c, part.sku, 3)
    const lineId = order.lines[0].id
    const inv = await documentOf(c, order.dispatches[0].invoice.id)
    expect(inv).toMatchObject({ netMinor: 3_003, taxMinor: 601, totalMinor: 3_604 })
    const notes: { netMinor: number; taxMinor: number; totalMinor: number }[] = []
    for (let i = 0; i < 3; i++) {
      const asked = await c.post('/api/returns', { orderLineId: lineId, quantity: 1, reason: 'wrong_part' })
      expect(asked.status, asked.text).toBe(201)
      const decided = await counter.patch(`/api/counter/returns/${asked.body.id}`, { status: 'accepted' })
      expect(decided.status, decided.text).toBe(200)
      notes.push(await documentOf(c, decided.body.creditNote.id))
    }
    // one unit each: £10.01 net; tax 601 x 1/3 = 200.33 -> £2.00, again £2.00, and the last takes what is left: £2.01
    expect(notes.map((n) => [n.netMinor, n.taxMinor])).toEqual([[1_001, 200], [1_001, 200], [1_001, 201]])
    expect(notes.reduce((s, n) => s + n.totalMinor, 0)).toBe(inv.totalMinor)
    // nothing is left to credit
    const more = await c.post('/api/returns', { orderLineId: lineId, quantity: 1, reason: 'wrong_part' })
    expect(more.status).toBe(422)
    expect(more.body.data.fields.quantity).toMatch(/already been asked back/)
  })
})

describe('who sees a document', () => {
  it('answers 404 for another garage\'s document, 403 without the ability, 401 signed out', async () => {
    const other = await as((await makeGarage({ terms: 'card', label: 'Other Documents Garage' })).email)
    const id = (await c.get('/api/documents')).body.data[0].id
    expect((await other.get(`/api/documents/${id}`)).status).toBe(404)
    expect((await other.get(`/api/documents/${id}.pdf`)).status).toBe(404)
    expect((await other.get('/api/documents')).body.data.some((d: { id: number }) => d.id === id)).toBe(false)
    expect((await c.get('/api/documents/99999999.pdf')).status).toBe(404)
    expect((await (await as(people.technician)).get('/api/documents')).status).toBe(403)
    expect((await counter.get(`/api/documents/${id}.pdf`)).status).toBe(200)
    expect((await new (await import('../support/api')).Client().get(`/api/documents/${id}`)).status).toBe(401)
  })
})
