/**
 * What a garage owes: open items and ageing on the statement (payments settle the oldest first), the account stop
 * (orders on account refused with the reasons and the amount to clear; card orders still go through; the admin's
 * lift, audited and ending by itself; the stop ending by itself when the garage pays) and a suspended garage that
 * can still read its statement and documents. Days are worked by hand below and checked with GNU
 * `date -u -d '2026-01-01 +30 days'` (an outside calendar); the garages have 30 payment days (common practice for
 * "net 30" trade terms). Times are 12:00 UTC so the local (Europe/London) day is the same day, summer or winter.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { Client, as, env, people } from '../support/api'
import { addLedgerEntry, makeGarage, makePart, sendAt, type TestGarage, type TestPart } from '../support/orders'

await setup({ host: env().baseUrl })

const ASOF = '2026-07-01T12:00:00Z'
let part: TestPart, garage: TestGarage, manager: Client, admin: Client, counter: Client
const order = (payment: 'card' | 'account') => ({ lines: [{ sku: part.sku, quantity: 1 }], payment })
const today = () => new Date().toISOString().slice(0, 10)

beforeAll(async () => {
  part = await makePart({ listPriceMinor: 4_000, stock: { NGT: 40 } })
  garage = await makeGarage({ terms: 'account', creditLimitMinor: 1_000_000, label: 'Owing Garage' })
  ;[manager, admin, counter] = await Promise.all([as(garage.email), as(people.admin), as(people.counter)])
  // booked day -> due day (+30): 01-01 -> 01-31, 03-16 -> 04-15, 04-20 -> 05-20, 05-10 -> 06-09, 06-20 -> 07-20
  for (const [reference, day, amountMinor] of [['OWE-A', '2026-01-01', 10_000], ['OWE-B', '2026-03-16', 20_000], ['OWE-C', '2026-04-20', 30_000], ['OWE-D', '2026-05-10', 40_000], ['OWE-E', '2026-06-20', 50_000]] as const) {
    await addLedgerEntry(garage.id, { kind: 'order', amountMinor, reference, at: `${day}T12:00:00Z` })
  }
  await addLedgerEntry(garage.id, { kind: 'account_payment', amountMinor: -5_000, reference: 'BACS JUNE', at: '2026-06-25T12:00:00Z' })
})

describe('open items and ageing', () => {
  it('ages what is open on 1 July 2026 by hand-worked days, the payment settling the oldest item first', async () => {
    const s = (await sendAt(manager, 'GET', '/api/statement', ASOF)).body
    expect(s.asOf).toBe('2026-07-01')
    // days overdue on 1 July: from 31 Jan 151 (28+31+30+31+30+1), from 15 Apr 77 (15+31+30+1),
    // from 20 May 42 (11+30+1), from 9 Jun 22 (21+1); 20 Jul is still to come
    expect(s.openItems.map((i: any) => [i.reference, i.dueOn, i.daysOverdue, i.bucket, i.paidMinor, i.openMinor])).toEqual([
      ['OWE-A', '2026-01-31', 151, 'over90', 5_000, 5_000], // £50 of £100 paid by BACS JUNE
      ['OWE-B', '2026-04-15', 77, 'd61_90', 0, 20_000],
      ['OWE-C', '2026-05-20', 42, 'd31_60', 0, 30_000],
      ['OWE-D', '2026-06-09', 22, 'd1_30', 0, 40_000],
      ['OWE-E', '2026-07-20', 0, 'current', 0, 50_000],
    ])
    expect(s.ageing).toEqual({ current: 50_000, d1_30: 40_000, d31_60: 30_000, d61_90: 20_000, over90: 5_000 })
    expect(s.balanceMinor).toBe(145_000) // 1,500.00 charged - 50.00 paid
  })

  it('exports what is owed as CSV: items, then the buckets and the total', async () => {
    const csv = await sendAt(manager, 'GET', '/api/statement/open-items.csv', ASOF)
    expect(csv.headers.get('content-disposition')).toContain('still-owed-2026-07-01.csv')
    const lines = csv.text.trim().split('\n')
    expect(lines[0]).toBe('Reference,Details,Booked,Due,Days overdue,Amount (GBP),Paid (GBP),Still open (GBP)')
    expect(lines[1]).toMatch(/^OWE-A,.*,2026-01-01,2026-01-31,151,100\.00,50\.00,50\.00$/)
    expect(lines.slice(-6)).toEqual([
      ',Not yet due,,,,,,500.00', ',1-30 days overdue,,,,,,400.00', ',31-60 days overdue,,,,,,300.00',
      ',61-90 days overdue,,,,,,200.00', ',Over 90 days overdue,,,,,,50.00', ',Total still open on 2026-07-01,,,,,,1450.00',
    ])
  })

  it('is the garage manager\'s own: others are refused', async () => {
    const tech = await as(people.technician)
    const [anon, t, cs] = await Promise.all([
      new Client().get('/api/statement/open-items.csv'), tech.get('/api/statement/open-items.csv'), counter.get('/api/statement/open-items.csv'),
    ])
    expect([anon.status, t.status, cs.status]).toEqual([401, 403, 403])
  })
})

describe('account stop', () => {
  it('refuses orders on account with the reasons and the amount to clear; card orders still go through', async () => {
    const r = await sendAt(manager, 'POST', '/api/orders', ASOF, order('account'))
    expect(r.status, r.text).toBe(402)
    // over 30 days overdue on 1 July: A (50.00 open), B (200.00), C (300.00) = 550.00; D is 22 days, not yet
    expect(r.body.data.stop).toMatchObject({ onStop: true, longOverdueMinor: 55_000, overLimitMinor: 0, amountToClearMinor: 55_000, stopAfterDays: 30 })
    expect(r.body.message).toMatch(/on stop: £550\.00 is overdue by more than 30 days \(OWE-A, OWE-B, OWE-C\)\. Pay £550\.00/)
    expect(r.body.data.fields.payment).toMatch(/on stop/)
    expect((await sendAt(manager, 'POST', '/api/orders', ASOF, order('card'))).status).toBe(201)
    const s = (await sendAt(manager, 'GET', '/api/statement', ASOF)).body
    expect(s.stop).toMatchObject({ onStop: true, amountToClearMinor: 55_000 })
  })

  it('counts only items more than 30 days past their due day: on 20 May, A (109 days) and B (35 days)', async () => {
    // 31 Jan -> 20 May: 28 + 31 + 30 + 20 = 109; 15 Apr -> 20 May: 15 + 20 = 35, so B counts too
    const s = (await sendAt(manager, 'GET', '/api/statement', '2026-05-20T12:00:00Z')).body
    expect(s.stop.longOverdueMinor).toBe(5_000 + 20_000)
  })

  it('stops an account over its credit limit, naming the amount over', async () => {
    const tight = await makeGarage({ terms: 'account', creditLimitMinor: 10_000, label: 'Tight Garage' })
    await addLedgerEntry(tight.id, { kind: 'order', amountMinor: 15_000, reference: 'OWE-T', at: `${today()}T00:30:00Z` })
    const r = await (await as(tight.email)).post('/api/orders', order('account'))
    expect(r.status).toBe(402)
    expect(r.body.message).toMatch(/£150\.00 is £50\.00 over the credit limit of £100\.00.*Pay £50\.00/)
  })

  it('shows distributor staff the stop; not the garage; 404 for an unknown garage', async () => {
    const [a, cs, m, none] = await Promise.all([
      sendAt(admin, 'GET', `/api/admin/trade-accounts/${garage.id}/stop`, ASOF), sendAt(counter, 'GET', `/api/admin/trade-accounts/${garage.id}/stop`, ASOF),
      manager.get(`/api/admin/trade-accounts/${garage.id}/stop`), admin.get('/api/admin/trade-accounts/999999/stop'),
    ])
    expect([a.status, cs.status, m.status, none.status]).toEqual([200, 200, 403, 404])
    expect(a.body).toMatchObject({ onStop: true, amountToClearMinor: 55_000 })
  })

  it('lets only the admin lift it, with a reason and for a bounded time; the lift is audited and ends by itself', async () => {
    const path = `/api/admin/trade-accounts/${garage.id}/stop-lift`
    const body = { reason: 'Payment plan agreed by phone', days: 7 }
    const [anon, cs, m] = await Promise.all([new Client().post(path, body), counter.post(path, body), manager.post(path, body)])
    expect([anon.status, cs.status, m.status]).toEqual([401, 403, 403])
    expect((await admin.post('/api/admin/trade-accounts/999999/stop-lift', body)).status).toBe(404)
    const bad = await admin.post(path, { reason: 'x', days: 0, colour: 'red' })
    expect(bad.status).toBe(422)
    expect(Object.keys(bad.body.data.fields).sort()).toEqual(['colour', 'days', 'reason'])
    expect((await admin.post(path, { ...body, days: 31 })).body.data.fields.days).toMatch(/at most 30 days/)

    const lifted = await sendAt(admin, 'POST', path, ASOF, body)
    expect(lifted.status, lifted.text).toBe(201)
    expect(lifted.body).toMatchObject({ onStop: false, lift: { until: '2026-07-08', reason: body.reason } }) // 1 July + 7
    expect((await sendAt(manager, 'POST', '/api/orders', '2026-07-08T12:00:00Z', order('account'))).status).toBe(201)
    expect((await sendAt(manager, 'POST', '/api/orders', '2026-07-09T12:00:00Z', order('account'))).status).toBe(402)
    const detail = (await admin.get(`/api/admin/trade-accounts/${garage.id}`)).body
    expect(JSON.stringify(detail)).toContain('tradeAccount.stop_lifted')
  })

  it('comes off by itself when the garage pays the amount to clear', async () => {
    const pay = await admin.post(`/api/admin/trade-accounts/${garage.id}/payments`, { amountMinor: 55_000, reference: 'BACS CLEAR', receivedOn: today() })
    expect(pay.status, pay.text).toBe(201)
    const s = (await sendAt(manager, 'GET', '/api/statement', '2026-07-09T12:00:00Z')).body
    expect(s.stop.onStop).toBe(false)
    expect(s.openItems.map((i: any) => i.reference).slice(0, 2)).toEqual(['OWE-D', 'OWE-E'])
    expect((await sendAt(manager, 'POST', '/api/orders', '2026-07-09T12:00:00Z', order('account'))).status).toBe(201)
  })
})

describe('a suspended garage', () => {
  let held: TestGarage, m: Client, otherDocId: number, ownDocId: number
  beforeAll(async () => {
    held = await makeGarage({ terms: 'account', creditLimitMinor: 1_000_000, label: 'Held Garage' })
    m = await as(held.email)
    const dispatch = async (c: Client) => {
      const o = (await c.post('/api/orders', order('account'))).body
      expect((await counter.patch(`/api/counter/orders/${o.id}`, { status: 'picking' })).status).toBe(200)
      return (await counter.patch(`/api/counter/orders/${o.id}`, { status: 'dispatched' })).body.dispatches[0].invoice.id as number
    }
    const other = await makeGarage({ terms: 'account', creditLimitMinor: 1_000_000, label: 'Neighbour Garage' })
    ownDocId = await dispatch(m)
    otherDocId = await dispatch(await as(other.email))
    expect((await admin.post(`/api/admin/trade-accounts/${held.id}/suspend`, { reason: 'Cheque returned unpaid.' })).status).toBe(200)
  })

  it('still reads its statement, what it owes and its own documents', async () => {
    const [s, csv, owed, docs, doc, pdf] = await Promise.all([
      m.get('/api/statement'), m.get('/api/statement.csv'), m.get('/api/statement/open-items.csv'),
      m.get('/api/documents'), m.get(`/api/documents/${ownDocId}`), m.get(`/api/documents/${ownDocId}.pdf`),
    ])
    expect([s.status, csv.status, owed.status, docs.status, doc.status, pdf.status]).toEqual([200, 200, 200, 200, 200, 200])
    expect(s.body.balanceMinor).toBe(4_800) // £40.00 + VAT at 20 % (gov.uk "VAT rates")
    expect(docs.body.data.map((d: any) => d.id)).toEqual([ownDocId])
  })

  it('gets 404 for another garage\'s document', async () => {
    expect((await m.get(`/api/documents/${otherDocId}`)).status).toBe(404)
  })

  it('is refused everything else, with the reason', async () => {
    const [orders, place, basket] = await Promise.all([m.get('/api/orders'), m.post('/api/orders', order('card')), m.get('/api/basket')])
    expect([orders.status, place.status, basket.status]).toEqual([403, 403, 403])
    expect(orders.body.message).toMatch(/suspended \(Cheque returned unpaid\.\): only the statement and documents stay open/)
  })
})
