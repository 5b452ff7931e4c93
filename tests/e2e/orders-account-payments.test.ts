/**
 * Money a garage on account terms pays by transfer or cheque, booked by the distributor admin: the balance falls
 * by exactly the amount, the credit it frees is usable for the next order at once, the garage's statement shows
 * it and the garage is told. An overpayment, a reference booked before, a date in the future and bad input are
 * refused by field and change nothing; only the admin may book. The statement is read month by month, each month
 * opening with the balance brought forward (the running balance counted from the first entry: common practice
 * for a trade account statement).
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { Client, as, env, people, waitForMail } from '../support/api'
import { addLedgerEntry, ledgerOf, makeGarage, makePart, type TestGarage, type TestPart } from '../support/orders'

await setup({ host: env().baseUrl })

// £40.00 net (no tier) + VAT at 20 % (gov.uk "VAT rates") = £48.00 a unit, as in the credit-limit tests
const UNIT_TOTAL = 4_800
let part: TestPart, garage: TestGarage, manager: Client, admin: Client
const today = () => new Date().toISOString().slice(0, 10)
const order = () => ({ lines: [{ sku: part.sku, quantity: 1 }], payment: 'account' })

beforeAll(async () => {
  part = await makePart({ listPriceMinor: 4_000, stock: { NGT: 20 } })
  garage = await makeGarage({ terms: 'account', creditLimitMinor: 2 * UNIT_TOTAL, label: 'Paying Garage' })
  ;[manager, admin] = await Promise.all([as(garage.email), as(people.admin)])
  for (let i = 0; i < 2; i++) expect((await manager.post('/api/orders', order())).status).toBe(201)
  expect((await manager.post('/api/orders', order())).status).toBe(402) // at the limit
})

describe('booking a payment received', () => {
  it('shows the admin what the garage owes', async () => {
    const r = await admin.get(`/api/admin/trade-accounts/${garage.id}`)
    expect(r.body.balanceMinor).toBe(2 * UNIT_TOTAL)
  })

  it('refuses bad input, a future date and an overpayment by field, and books nothing', async () => {
    const before = await ledgerOf(garage.id)
    const bad = await admin.post(`/api/admin/trade-accounts/${garage.id}/payments`, { amountMinor: 0, reference: 'x', receivedOn: '2026-02-30', colour: 'red' })
    expect(bad.status).toBe(422)
    expect(Object.keys(bad.body.data.fields).sort()).toEqual(['amountMinor', 'colour', 'receivedOn', 'reference'])
    const tomorrow = new Date(Date.now() + 86_400_000).toISOString().slice(0, 10)
    const future = await admin.post(`/api/admin/trade-accounts/${garage.id}/payments`, { amountMinor: 100, reference: 'BACS 1', receivedOn: tomorrow })
    expect(future.status).toBe(422)
    expect(future.body.data.fields.receivedOn).toMatch(/future/)
    const over = await admin.post(`/api/admin/trade-accounts/${garage.id}/payments`, { amountMinor: 2 * UNIT_TOTAL + 1, reference: 'BACS 1', receivedOn: today() })
    expect(over.status).toBe(422)
    expect(over.body.data.fields.amountMinor).toMatch(/owes £96\.00.*at most £96\.00/)
    expect(await ledgerOf(garage.id)).toEqual(before)
  })

  it('is for the distributor admin only, and only for a garage that exists', async () => {
    const body = { amountMinor: 100, reference: 'BACS 2', receivedOn: today() }
    const [anon, counter, self] = await Promise.all([
      new Client().post(`/api/admin/trade-accounts/${garage.id}/payments`, body),
      (await as(people.counter)).post(`/api/admin/trade-accounts/${garage.id}/payments`, body),
      manager.post(`/api/admin/trade-accounts/${garage.id}/payments`, body),
    ])
    expect([anon.status, counter.status, self.status]).toEqual([401, 403, 403])
    expect((await admin.post('/api/admin/trade-accounts/999999/payments', body)).status).toBe(404)
  })

  it('lowers the balance by exactly the amount, frees the credit at once, shows on the statement and tells the garage', async () => {
    const r = await admin.post(`/api/admin/trade-accounts/${garage.id}/payments`, { amountMinor: UNIT_TOTAL, reference: 'BACS 778812', receivedOn: today(), note: 'March statement' })
    expect(r.status, r.text).toBe(201)
    expect(r.body).toMatchObject({ amountMinor: UNIT_TOTAL, balanceMinor: UNIT_TOTAL, availableMinor: UNIT_TOTAL })
    const statement = (await manager.get('/api/statement')).body
    expect(statement.entries.at(-1)).toMatchObject({ kind: 'account_payment', kindLabel: 'Payment received', amountMinor: -UNIT_TOTAL, balanceMinor: UNIT_TOTAL, reference: 'BACS 778812' })
    expect(statement.availableMinor).toBe(UNIT_TOTAL)
    const mail = await waitForMail(garage.email, /payment of £48\.00 received/)
    expect(mail.text).toMatch(/Balance now owed: £48\.00\. Credit available for orders on account: £48\.00/)
    expect((await manager.post('/api/orders', order())).status).toBe(201) // the freed credit is usable
  })

  it('refuses the same reference twice for the garage, however it is spaced or cased', async () => {
    const before = await ledgerOf(garage.id)
    const again = await admin.post(`/api/admin/trade-accounts/${garage.id}/payments`, { amountMinor: 100, reference: 'bacs  778812', receivedOn: today() })
    expect(again.status).toBe(409)
    expect(again.body.data.fields.reference).toMatch(/already booked/)
    expect(await ledgerOf(garage.id)).toEqual(before)
  })
})

describe('the statement, month by month', () => {
  let c: Client
  beforeAll(async () => {
    const g = await makeGarage({ terms: 'account', creditLimitMinor: 100_000, label: 'Monthly Garage' })
    c = await as(g.email)
    await addLedgerEntry(g.id, { kind: 'order', amountMinor: 10_000, reference: 'BL-OCT', at: '2025-10-05T10:00:00Z' })
    await addLedgerEntry(g.id, { kind: 'order', amountMinor: 5_000, reference: 'BL-NOV', at: '2025-11-10T09:00:00Z' })
    await addLedgerEntry(g.id, { kind: 'account_payment', amountMinor: -8_000, reference: 'BACS NOV', at: '2025-11-30T23:59:00Z' })
    await addLedgerEntry(g.id, { kind: 'order', amountMinor: 1_000, reference: 'BL-DEC', at: '2025-12-01T00:00:00Z' })
  })

  it('shows one month with the balance brought forward and carried out, and the balance now', async () => {
    const r = await c.get('/api/statement?month=2025-11')
    expect(r.status).toBe(200)
    expect(r.body.entries.map((e: { reference: string; balanceMinor: number }) => [e.reference, e.balanceMinor])).toEqual([['BL-NOV', 15_000], ['BACS NOV', 7_000]])
    expect(r.body.period).toEqual({ month: '2025-11', openingBalanceMinor: 10_000, closingBalanceMinor: 7_000 })
    expect(r.body.balanceMinor).toBe(8_000)
    expect(r.body.months).toEqual(['2025-12', '2025-11', '2025-10'])
    const empty = await c.get('/api/statement?month=2025-09')
    expect(empty.body).toMatchObject({ entries: [], period: { openingBalanceMinor: 0, closingBalanceMinor: 0 } })
    expect((await c.get('/api/statement')).body).toMatchObject({ period: null, balanceMinor: 8_000 })
  })

  it('exports the month as CSV starting with the balance brought forward, and refuses a malformed month', async () => {
    const csv = await c.get('/api/statement.csv?month=2025-11')
    expect(csv.headers.get('content-disposition')).toContain('statement-2025-11.csv')
    const lines = csv.text.trim().split('\n')
    expect(lines[1]).toMatch(/^2025-11-01,Brought forward,,,Balance when 2025-11 began,0\.00,100\.00$/)
    expect(lines.at(-1)).toMatch(/BACS NOV.*,-80\.00,70\.00$/)
    const bad = await c.get('/api/statement?month=2025-13')
    expect(bad.status).toBe(422)
    expect(bad.body.data.fields.month).toMatch(/YYYY-MM/)
  })
})
