/**
 * Settling what is owed: due dates from the invoice's date, the statement's "available" box while on stop, a
 * suspended and stopped garage paying by card, the admin allocating a payment to chosen items, the statement as a
 * PDF, and the account reminder job sending each e-mail once. Days are worked by hand and checked with GNU
 * `date -u -d '<day> +N days'` (an outside calendar); the garages have 30 payment days ("net 30", common practice).
 */
import { execFile } from 'node:child_process'
import { mkdtempSync, readdirSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { promisify } from 'node:util'
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { Client, as, env, mailFor, people } from '../support/api'
import { addLedgerEntry, fake, makeGarage, makePart, payOnFake, pickAndDispatch, sessionIdOf, type TestGarage, type TestPart } from '../support/orders'
import { backdateOrderCharges, bytesOf, noonDaysAgo, runAccountsRemind } from '../support/money-owed'

await setup({ host: env().baseUrl })

const DAY = 86_400_000
// the installation's calendar day (Europe/London), as the statement writes it
const dayOf = (d: Date) => new Intl.DateTimeFormat('en-CA', { timeZone: 'Europe/London' }).format(d)
let part: TestPart, admin: Client, counter: Client
const accountOrder = () => ({ lines: [{ sku: part.sku, quantity: 1 }], payment: 'account' })

beforeAll(async () => {
  part = await makePart({ listPriceMinor: 4_000, stock: { NGT: 100 } })
  ;[admin, counter] = await Promise.all([as(people.admin), as(people.counter)])
})

const dispatchNow = (orderId: number) => pickAndDispatch(counter, orderId)

describe('due dates run from the invoice', () => {
  it('an order booked 40 days ago and invoiced today is due in 30 days, not overdue; one not yet sent has no due day', async () => {
    const g = await makeGarage({ terms: 'account', creditLimitMinor: 1_000_000, label: 'Invoice Dated' })
    const m = await as(g.email)
    const sent = (await m.post('/api/orders', accountOrder())).body
    const waiting = (await m.post('/api/orders', accountOrder())).body
    await dispatchNow(sent.id)
    await backdateOrderCharges(sent.id, new Date(noonDaysAgo(40)))
    const s = (await m.get('/api/statement')).body
    const [first, second] = s.openItems
    // booked 40 days ago: the old rule would have made it due 10 days ago; from the invoice (today) + 30 it is not due
    expect(first).toMatchObject({ bookedOn: dayOf(new Date(noonDaysAgo(40))), invoicedOn: s.asOf, dueOn: dayOf(new Date(Date.parse(`${s.asOf}T12:00:00Z`) + 30 * DAY)), daysOverdue: 0 })
    expect(first.invoice).toMatch(/^INV-\d{6}$/)
    expect(second).toMatchObject({ reference: `BL-${String(waiting.id).padStart(6, '0')}`, invoice: null, dueOn: null, daysOverdue: 0, bucket: 'current' })
    expect(s.stop.onStop).toBe(false)
  })
})

describe('a stopped and suspended garage pays by card', () => {
  let g: TestGarage, m: Client
  beforeAll(async () => {
    g = await makeGarage({ terms: 'account', creditLimitMinor: 100_000, label: 'Card Settles' })
    m = await as(g.email)
    // booked 70 days ago, no document: due 40 days ago, over the 30-day stop
    await addLedgerEntry(g.id, { kind: 'order', amountMinor: 12_000, reference: 'OWE-CARD', at: noonDaysAgo(70) })
  })

  it('shows nothing available on account while on stop, and why', async () => {
    const s = (await m.get('/api/statement')).body
    expect(s.stop).toMatchObject({ onStop: true, amountToClearMinor: 12_000 })
    expect(s.availableMinor).toBe(100_000 - 12_000) // the limit less the balance; the page shows 0 and the stop
    expect((await m.post('/api/orders', accountOrder())).status).toBe(402)
  })

  it('refuses others and bad amounts', async () => {
    const tech = await as(people.technician)
    const [anon, t, cs, over, zero, extra] = await Promise.all([
      new Client().post('/api/statement/card-payment', { amountMinor: 100 }), tech.post('/api/statement/card-payment', { amountMinor: 100 }),
      counter.post('/api/statement/card-payment', { amountMinor: 100 }), m.post('/api/statement/card-payment', { amountMinor: 12_001 }),
      m.post('/api/statement/card-payment', { amountMinor: 0 }), m.post('/api/statement/card-payment', { amountMinor: 100, organisationId: 1 }),
    ])
    expect([anon.status, t.status, cs.status, over.status, zero.status, extra.status]).toEqual([401, 403, 403, 422, 422, 422])
    expect(over.body.data.fields.amountMinor).toMatch(/You owe £120\.00/)
  })

  it('pays while suspended: the payment is booked once from the webhook and the stop ends', async () => {
    expect((await admin.post(`/api/admin/trade-accounts/${g.id}/suspend`, { reason: 'Two months unpaid.' })).status).toBe(200)
    expect((await m.get('/api/orders')).status).toBe(403)
    const r = await m.post('/api/statement/card-payment', { amountMinor: 12_000 })
    expect(r.status, r.text).toBe(200)
    const paid = await payOnFake(sessionIdOf(r.body.url))
    expect(paid.status).toBe(200)
    await expect.poll(async () => (await m.get('/api/statement')).body.balanceMinor, { timeout: 10_000 }).toBe(0)
    const s = (await m.get('/api/statement')).body
    expect(s.entries.filter((e: any) => e.kind === 'account_payment').map((e: any) => e.amountMinor)).toEqual([-12_000])
    expect(s.stop.onStop).toBe(false)
    expect((await m.get('/api/orders')).status).toBe(403) // still suspended: only the statement, documents and paying
  })
})

describe('a card payment on the account whose webhook is lost', () => {
  it('is booked by the sweep from the payment service\'s completed checkouts, once', async () => {
    const g = await makeGarage({ terms: 'account', creditLimitMinor: 100_000, label: 'Lost Webhook' })
    const m = await as(g.email)
    await addLedgerEntry(g.id, { kind: 'order', amountMinor: 4_500, reference: 'OWE-LOST', at: noonDaysAgo(10) })
    const r = await m.post('/api/statement/card-payment', { amountMinor: 4_500 })
    expect(r.status, r.text).toBe(200)
    const { json: before } = await fake('GET', '/_fake/config')
    try {
      expect((await fake('POST', '/_fake/config', { webhookUrl: null })).status).toBe(200)
      expect((await payOnFake(sessionIdOf(r.body.url))).status).toBe(200)
    } finally {
      await fake('POST', '/_fake/config', { webhookUrl: before.config.webhookUrl })
    }
    expect((await m.get('/api/statement')).body.balanceMinor).toBe(4_500) // nothing told us yet
    const swept = await counter.post('/api/counter/orders/sweep')
    expect(swept.status, swept.text).toBe(200)
    expect(swept.body.paid).toBeGreaterThanOrEqual(1)
    expect((await counter.post('/api/counter/orders/sweep')).status).toBe(200)
    const s = (await m.get('/api/statement')).body
    expect(s.balanceMinor).toBe(0)
    expect(s.entries.filter((e: any) => e.kind === 'account_payment').map((e: any) => e.amountMinor)).toEqual([-4_500])
  })
})

describe('the admin allocates a payment', () => {
  let g: TestGarage, ids: number[]
  beforeAll(async () => {
    g = await makeGarage({ terms: 'account', creditLimitMinor: 1_000_000, label: 'Remittance' })
    ids = []
    for (const [reference, daysAgo, amountMinor] of [['ALC-A', 50, 10_000], ['ALC-B', 40, 20_000], ['ALC-C', 20, 30_000]] as const) {
      ids.push(await addLedgerEntry(g.id, { kind: 'order', amountMinor, reference, at: noonDaysAgo(daysAgo) }))
    }
  })

  it('lists the open items to distributor staff only', async () => {
    const [a, cs, m, none] = await Promise.all([
      admin.get(`/api/admin/trade-accounts/${g.id}/open-items`), counter.get(`/api/admin/trade-accounts/${g.id}/open-items`),
      (await as(g.email)).get(`/api/admin/trade-accounts/${g.id}/open-items`), admin.get('/api/admin/trade-accounts/999999/open-items'),
    ])
    expect([a.status, cs.status, m.status, none.status]).toEqual([200, 200, 403, 404])
    expect(a.body.data.map((i: any) => i.reference)).toEqual(['ALC-A', 'ALC-B', 'ALC-C'])
    expect(a.body.meta).toMatchObject({ total: 3, page: 1 })
  })

  it('refuses an allocation to an item that is not open here, or for more than is open, naming the field', async () => {
    const base = { amountMinor: 25_000, reference: 'REM-BAD', receivedOn: dayOf(new Date()) }
    const bad = await admin.post(`/api/admin/trade-accounts/${g.id}/payments`, { ...base, amountMinor: 40_000, allocations: [{ entryId: 999_999, amountMinor: 100 }, { entryId: ids[2], amountMinor: 30_001 }] })
    expect(bad.status).toBe(422)
    expect(Object.keys(bad.body.data.fields).sort()).toEqual(['allocations.0.entryId', 'allocations.1.amountMinor'])
    const more = await admin.post(`/api/admin/trade-accounts/${g.id}/payments`, { ...base, allocations: [{ entryId: ids[2], amountMinor: 25_001 }] })
    expect(more.body.data.fields.allocations).toMatch(/more than the payment/)
  })

  it('pays the chosen item first, the rest the oldest first: 250.00 with 150.00 to C clears A and leaves B and half of C', async () => {
    const r = await admin.post(`/api/admin/trade-accounts/${g.id}/payments`, {
      amountMinor: 25_000, reference: 'REM-1', receivedOn: dayOf(new Date()), allocations: [{ entryId: ids[2], amountMinor: 15_000 }],
    })
    expect(r.status, r.text).toBe(201)
    // 250.00 - 150.00 = 100.00 pooled: A (100.00) paid; B 200.00 open; C 300.00 - 150.00 = 150.00 open
    const items = (await (await as(g.email)).get('/api/statement')).body.openItems
    expect(items.map((i: any) => [i.reference, i.paidMinor, i.openMinor])).toEqual([['ALC-B', 0, 20_000], ['ALC-C', 15_000, 15_000]])
  })
})

describe('the statement as a PDF', () => {
  it('carries the same figures as the screen, for the manager only', async () => {
    const g = await makeGarage({ terms: 'account', creditLimitMinor: 50_000, label: 'Printed Statement' })
    await addLedgerEntry(g.id, { kind: 'order', amountMinor: 12_345, reference: 'PDF-A', at: noonDaysAgo(45) })
    const m = await as(g.email)
    const pdf = await bytesOf(m, '/api/statement.pdf')
    expect(pdf.status).toBe(200)
    expect(pdf.type).toBe('application/pdf')
    const dir = mkdtempSync(join(tmpdir(), 'statement-pdf-'))
    writeFileSync(join(dir, 's.pdf'), pdf.bytes)
    const { stdout } = await promisify(execFile)('pdftotext', ['-layout', join(dir, 's.pdf'), '-'])
    // booked 45 days ago, due 15 days ago: 1-30 days overdue, £123.45
    expect(stdout).toMatch(/1-30 days overdue\s+£123\.45/)
    expect(stdout).toMatch(/PDF-A/)
    expect(stdout).toContain(g.name)
    if (process.env.BORELINE_SCREENSHOTS) {
      await promisify(execFile)('pdftoppm', ['-png', '-r', '60', join(dir, 's.pdf'), join(process.env.BORELINE_SCREENSHOTS, 'statement-pdf')])
    }
    expect(readdirSync(dir)).toContain('s.pdf')
    expect((await bytesOf(await as(people.technician), '/api/statement.pdf')).status).toBe(403)
  })
})

describe('account reminders', () => {
  let g: TestGarage
  const now = new Date()
  beforeAll(async () => {
    g = await makeGarage({ terms: 'account', creditLimitMinor: 1_000_000, label: 'Reminded' })
    // A booked 60 days ago: due 30 days ago, 30 days overdue (past 7 and 21); B booked 40 days ago: 10 days overdue (past 7)
    await addLedgerEntry(g.id, { kind: 'order', amountMinor: 11_100, reference: 'REM-A', at: noonDaysAgo(60, now) })
    await addLedgerEntry(g.id, { kind: 'order', amountMinor: 22_200, reference: 'REM-B', at: noonDaysAgo(40, now) })
  })

  it('sends last month\'s statement and one overdue reminder, once, even with two runs at the same time', async () => {
    await Promise.all([runAccountsRemind(now), runAccountsRemind(now)])
    const mails = await mailFor(g.email)
    const statements = mails.filter((x) => /^Your statement for/.test(x.subject))
    // the statement e-mails are checked by month in the admin's list below
    const overdue = mails.filter((x) => /^Overdue on your trade account/.test(x.subject))
    expect(statements).toHaveLength(1)
    expect(statements[0]!.attachments.map((a) => a.filename)).toEqual([expect.stringMatching(/^statement-\d{4}-\d{2}\.pdf$/)])
    expect(overdue).toHaveLength(1)
    expect(overdue[0]!.subject).toBe('Overdue on your trade account: £333.00') // 111.00 + 222.00
    expect(overdue[0]!.text).toMatch(/REM-A: £111\.00 still open.*30 days overdue/)
    expect(overdue[0]!.text).toMatch(/REM-B: £222\.00 still open.*10 days overdue/)
  })

  it('reminds again only when an item passes the next threshold: 12 days on, B is 22 days overdue', async () => {
    await runAccountsRemind(new Date(now.getTime() + 12 * DAY))
    const overdue = (await mailFor(g.email)).filter((x) => /^Overdue on your trade account/.test(x.subject))
    expect(overdue).toHaveLength(2)
    expect(overdue.map((x) => x.subject)).toContain('Overdue on your trade account: £222.00')
    await runAccountsRemind(new Date(now.getTime() + 12 * DAY))
    expect((await mailFor(g.email)).filter((x) => /^Overdue on your trade account/.test(x.subject))).toHaveLength(2)
  })

  it('shows the admin what was sent; nobody else', async () => {
    const list = await admin.get(`/api/admin/account-reminders?garageId=${g.id}`)
    expect(list.status).toBe(200)
    const rows = list.body.data as any[]
    expect(rows.filter((r) => r.kind === 'overdue').map((r) => `${r.about} ${r.status}`).sort()).toEqual(['21 days overdue sent', '21 days overdue sent', '7 days overdue sent'])
    // one statement a month: the month before today, and the month before the moved clock (the same month or the next)
    const months = new Set([now, new Date(now.getTime() + 12 * DAY)].map((d) => { const x = new Date(d); x.setUTCDate(0); return x.toISOString().slice(0, 7) }))
    expect(rows.filter((r) => r.kind === 'statement').map((r) => r.about).sort()).toEqual([...months].sort())
    expect(list.body.data[0].recipients).toContain(g.email.toLowerCase())
    const [cs, m, bad] = await Promise.all([
      counter.get('/api/admin/account-reminders'), (await as(g.email)).get('/api/admin/account-reminders'), admin.get('/api/admin/account-reminders?kind=weekly'),
    ])
    expect([cs.status, m.status, bad.status]).toEqual([403, 403, 422])
  })
})
