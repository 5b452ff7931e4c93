/**
 * The dashboards against a hand count over a small scenario built here. The distributor's orders are moved to
 * 1-2 March 2031, days no other test uses, so the range holds only them; what garages owe and back-orders are
 * "now" figures, checked by the change one known item makes (e2e files run one at a time). Money in pence; every
 * expected figure is worked by hand in the comment beside it (VAT 20 %: gov.uk "VAT rates").
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { Client, as, env, people } from '../support/api'
import { addLedgerEntry, makeGarage, makePart, makeQuote, type TestGarage, type TestPart } from '../support/orders'
import { exec } from '../support/money-owed'

await setup({ host: env().baseUrl })

let a: TestPart, b: TestPart, g1: TestGarage, g2: TestGarage, admin: Client, counter: Client, m1: Client, m2: Client
const RANGE = '?from=2031-03-01&to=2031-03-03'

beforeAll(async () => {
  a = await makePart({ listPriceMinor: 4_000, stock: { NGT: 100 } })
  b = await makePart({ listPriceMinor: 1_000, stock: { NGT: 100 } })
  await exec('UPDATE part_prices SET trade_cost_minor = 2500 WHERE part_id = :id', { id: a.id }) // B keeps no trade cost
  g1 = await makeGarage({ terms: 'account', creditLimitMinor: 1_000_000, label: 'Dash One' })
  g2 = await makeGarage({ terms: 'account', creditLimitMinor: 1_000_000, label: 'Dash Two' })
  ;[admin, counter, m1, m2] = await Promise.all([as(people.admin), as(people.counter), as(g1.email), as(g2.email)])
  const o1 = (await m1.post('/api/orders', { lines: [{ sku: a.sku, quantity: 2 }, { sku: b.sku, quantity: 1 }], payment: 'account' })).body
  const o2 = (await m2.post('/api/orders', { lines: [{ sku: a.sku, quantity: 1 }], payment: 'account' })).body
  expect([o1.subtotalMinor, o2.subtotalMinor]).toEqual([9_000, 4_000]) // 2 x 40.00 + 10.00; 40.00 (no tier discount)
  expect((await counter.patch(`/api/counter/orders/${o1.id}`, { status: 'picking' })).status).toBe(200)
  expect((await counter.patch(`/api/counter/orders/${o1.id}`, { status: 'dispatched' })).status).toBe(200)
  await exec("UPDATE orders SET created_at = :at WHERE id = :id", { at: '2031-03-01 12:00:00.000 +00:00', id: o1.id })
  await exec("UPDATE orders SET created_at = :at WHERE id = :id", { at: '2031-03-02 12:00:00.000 +00:00', id: o2.id })
})

describe('the distributor dashboard', () => {
  it('equals the hand count over 1-3 March 2031', async () => {
    const r = await admin.get(`/api/dashboard/distributor${RANGE}`)
    expect(r.status, r.text).toBe(200)
    const d = r.body
    expect(d.range).toMatchObject({ from: '2031-03-01', to: '2031-03-03', days: 3 })
    // 80.00 + 10.00 on the 1st (one order), 40.00 on the 2nd (one order), nothing on the 3rd
    expect(d.sales).toMatchObject({ netMinor: 13_000, orders: 2 })
    expect(d.sales.byDay).toEqual([
      { day: '2031-03-01', netMinor: 9_000, orders: 1 }, { day: '2031-03-02', netMinor: 4_000, orders: 1 }, { day: '2031-03-03', netMinor: 0, orders: 0 },
    ])
    expect(d.sales.byBranch).toHaveLength(1)
    expect(d.sales.byBranch[0]).toMatchObject({ netMinor: 13_000, orders: 2 })
    // costed lines: A x2 (80.00, cost 50.00) and A x1 (40.00, cost 25.00): 120.00 - 75.00 = 45.00 = 37.50 % of 120.00
    expect(d.margin).toEqual({ netMinor: 12_000, costMinor: 7_500, marginMinor: 4_500, marginBp: 3_750, linesWithoutCost: 1 })
    // the first order's two lines went complete from the home branch; the second is not sent yet, so not counted
    expect(d.fillRate).toEqual({ lines: 2, filled: 2, rateBp: 10_000 })
    expect(d.topParts.map((p: any) => [p.sku, p.units, p.netMinor])).toEqual([[a.sku, 3, 12_000], [b.sku, 1, 1_000]])
    expect(d.topGarages.map((g: any) => [g.id, g.orders, g.netMinor])).toEqual([[g1.id, 1, 9_000], [g2.id, 1, 4_000]])
    expect(d.returnsByReason).toEqual([])
  })

  it('narrows to one day', async () => {
    const d = (await counter.get('/api/dashboard/distributor?from=2031-03-02&to=2031-03-02')).body
    expect(d.sales).toMatchObject({ netMinor: 4_000, orders: 1 })
    expect(d.fillRate).toEqual({ lines: 0, filled: 0, rateBp: null })
  })

  it('counts what a garage owes by bucket: 50.00 booked 120 days ago moves "over 90 days" by 50.00', async () => {
    const before = (await admin.get('/api/dashboard/distributor')).body.overdue
    const g3 = await makeGarage({ terms: 'account', creditLimitMinor: 1_000_000, label: 'Dash Owes' })
    await addLedgerEntry(g3.id, { kind: 'order', amountMinor: 5_000, reference: 'DASH-OLD', at: new Date(Date.now() - 120 * 86_400_000).toISOString() })
    const after = (await admin.get('/api/dashboard/distributor')).body.overdue
    // 120 days after booking, 90 days after the due day (30 payment days): 90 is the top of 61-90
    expect(after.d61_90 - before.d61_90 + after.over90 - before.over90).toBe(5_000)
    expect(after.garages - before.garages).toBe(1)
  })

  it('exports the same figures as CSV', async () => {
    const csv = await admin.get(`/api/dashboard/distributor.csv${RANGE}`)
    expect(csv.headers.get('content-disposition')).toContain('distributor-dashboard-2031-03-01-2031-03-03.csv')
    expect(csv.text).toContain('Sales,Net sales,130.00,GBP')
    expect(csv.text).toContain('Gross margin,Margin rate,37.5,%')
  })

  it('follows a change to a day already summed: a line of 1 March cancelled afterwards', async () => {
    // the days of 1-3 March are summed and kept by the looks above; cancelling B's line (10.00, no trade cost) on
    // the 1st must show at the next look, whoever wrote it (here straight in the database, as a script would)
    await exec("UPDATE order_lines SET state = 'cancelled' WHERE part_id = :id AND order_id IN (SELECT id FROM orders WHERE organisation_id = :org)", { id: b.id, org: g1.id })
    const d = (await admin.get(`/api/dashboard/distributor${RANGE}`)).body
    // 1 March: 80.00 left of 90.00; 2 March unchanged: 40.00
    expect(d.sales.byDay.map((x: any) => x.netMinor)).toEqual([8_000, 4_000, 0])
    expect(d.sales).toMatchObject({ netMinor: 12_000, orders: 2 })
    // only the costed lines are left: 120.00 - 75.00 = 45.00, none without a cost
    expect(d.margin).toEqual({ netMinor: 12_000, costMinor: 7_500, marginMinor: 4_500, marginBp: 3_750, linesWithoutCost: 0 })
    // the cancelled requested line was never sent, so it is no longer counted: A's line, sent complete, is
    expect(d.fillRate).toEqual({ lines: 1, filled: 1, rateBp: 10_000 })
    expect(d.topParts.map((p: any) => [p.sku, p.units, p.netMinor])).toEqual([[a.sku, 3, 12_000]])
  })

  it('is for distributor staff only; bad ranges name the field', async () => {
    const tech = await as(people.technician)
    const [anon, m, t] = await Promise.all([new Client().get('/api/dashboard/distributor'), m1.get('/api/dashboard/distributor'), tech.get('/api/dashboard/distributor')])
    expect([anon.status, m.status, t.status]).toEqual([401, 403, 403])
    const [back, long, bad] = await Promise.all([
      admin.get('/api/dashboard/distributor?from=2031-03-03&to=2031-03-01'), admin.get('/api/dashboard/distributor?from=2030-01-01&to=2031-03-01'),
      admin.get('/api/dashboard/distributor?from=2031-02-30'),
    ])
    expect([back.status, long.status, bad.status]).toEqual([422, 422, 422])
    expect(Object.keys(back.body.data.fields)).toEqual(['to'])
    expect(Object.keys(long.body.data.fields)).toEqual(['from'])
  })
})

describe('the garage dashboard', () => {
  beforeAll(async () => {
    const line = (quoteId: number, position: number, recommendation: string, partType: string | null) =>
      exec('UPDATE quote_lines SET recommendation = :recommendation, part_type = :partType WHERE quote_id = :quoteId AND position = :position', { quoteId, position, recommendation, partType })
    const q1 = await makeQuote(g1, 'partly_approved', [{ sku: a.sku, partId: a.id, decision: 'approved' }, { sku: b.sku, partId: b.id, decision: 'declined' }, { kind: 'labour', decision: 'approved' }])
    await line(q1.id, 0, 'required', 'caliper')
    await line(q1.id, 1, 'advised', 'pad_set')
    await line(q1.id, 2, 'advised', null)
    await makeQuote(g1, 'sent', [{ sku: a.sku, partId: a.id, decision: null }])
    const q3 = await makeQuote(g1, 'approved', [{ sku: a.sku, partId: a.id, decision: 'approved' }])
    await line(q3.id, 0, 'required', 'caliper')
    expect((await m1.post('/api/orders', { lines: [{ sku: a.sku, quantity: 1 }], payment: 'account' })).status).toBe(201)
  })

  it('equals the hand count over the last 30 days', async () => {
    const r = await m1.get('/api/dashboard/garage')
    expect(r.status, r.text).toBe(200)
    const d = r.body
    // 3 quotes sent; 2 approved wholly or partly: 2/3 = 66.67 % -> 6667 bp
    expect(d.quotes).toEqual({ sent: 3, approved: 2, rateBp: 6_667 })
    // required: 2 decided, both approved; advised: the pad set declined, the labour approved
    expect(d.lines).toEqual({ required: { decided: 2, approved: 2, rateBp: 10_000 }, advised: { decided: 2, approved: 1, rateBp: 5_000 } })
    expect(d.declinedAdvised).toEqual([{ key: 'pad_set', label: 'Pad sets', count: 1 }])
    // the one order placed today: 40.00 + VAT 8.00 = 48.00 (the first order was moved to 2031)
    expect(d.spendByMonth).toEqual([{ month: d.range.to.slice(0, 7), totalMinor: 4_800, orders: 1 }])
    expect(d.jobs).toEqual({ invoices: 0, grossMinor: 0, averageMinor: null })
    expect(d.reminders).toEqual({ sent: 0, quotesApproved: 0, workMinor: 0 })
  })

  it('shows each garage only its own; other roles are refused', async () => {
    const other = (await m2.get('/api/dashboard/garage')).body
    expect(other.quotes).toEqual({ sent: 0, approved: 0, rateBp: null })
    const tech = await as(people.technician)
    const [anon, t, cs, ad] = await Promise.all([
      new Client().get('/api/dashboard/garage'), tech.get('/api/dashboard/garage'), counter.get('/api/dashboard/garage'), admin.get('/api/dashboard/garage'),
    ])
    expect([anon.status, t.status, cs.status, ad.status]).toEqual([401, 403, 403, 403])
    const csv = await m1.get('/api/dashboard/garage.csv')
    expect(csv.text).toContain('Quotes,Approval rate,66.7,%')
  })
})
