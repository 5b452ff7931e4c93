/**
 * The owner's money and decisions through the routes: prices stated with tax (and a garage that shows prices so,
 * with a price ending), a discount split across two tax rates with the tax per rate on the owner's view and the
 * PDF, the owner's page arithmetic equal to the server's, the core deposit absorbed by default and, when passed
 * on, refunded to the owner when the distributor accepts the core, and declining safety work with a signed
 * acknowledgement (stored, on the PDF, in the vehicle's history, the manager told). Each garage's records stay
 * its own (404).
 *
 * Reference arithmetic: mathjs BigNumber (decimal.js ROUND_HALF_UP: "if equidistant, rounds away from zero"), or
 * worked by hand beside the check; never the code under test.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { all, create } from 'mathjs'
// pdf-parse v1's library entry (its index.js runs a self-test when imported)
import pdf from 'pdf-parse/lib/pdf-parse.js'
import { Client, as, env, people, waitForMail } from '../support/api'
import { sendAndReadLink, startQuote, uid } from '../support/quotes'
import { makeGarage, makePart, type TestGarage } from '../support/orders'
import { chosenTotals } from '#shared/utils/quote-totals'
import { DECLINE_ACKNOWLEDGEMENT } from '#shared/utils/quote-declines'
import { formatMinor } from '#shared/utils/money'
import type { OwnerQuoteView, QuoteDetail } from '#shared/types/quotes'

await setup({ host: env().baseUrl })

const math = create(all, { number: 'BigNumber', precision: 64 })
/** a x b / c rounded half away from zero, in decimal */
const ref = (a: number, b: number, c: number) => Number(math.round(math.divide(math.multiply(math.bignumber(a), math.bignumber(b)), math.bignumber(c)) as never).toString())
const gbp = (m: number) => formatMinor(m, 'GBP', 'en-GB')
const textOf = async (bytes: Buffer) => (await pdf(Buffer.from(new Uint8Array(bytes)))).text.replace(/\s+/g, ' ')
const pdfOf = async (path: string, c?: Client) => {
  const r = await fetch(new URL(path, env().baseUrl), { headers: c ? { cookie: c.cookieHeader() } : {} })
  expect(r.status).toBe(200)
  return textOf(Buffer.from(await r.arrayBuffer()))
}

const anon = new Client()

describe('prices that include tax', () => {
  let garage: TestGarage
  let m: Client
  let quoteId: number
  let partLine: QuoteDetail['lines'][number]

  beforeAll(async () => {
    garage = await makeGarage({ terms: 'account', creditLimitMinor: 1_000_000, label: 'Tax-inclusive Garage' })
    m = await as(garage.email)
  })

  it('a garage that shows prices with tax gets part prices with tax on its price ending, and labour with tax', async () => {
    const s = await m.patch('/api/garage/settings', {
      pricesIncludeTax: true, partPriceEndingMinor: 99, labourRateMinor: 8_160,
      markupRules: { mode: 'by_type', defaultBp: 3_000, byType: { caliper: 3_000 } },
    })
    expect(s.status, s.text).toBe(200)
    expect(s.body).toMatchObject({ pricesIncludeTax: true, partPriceEndingMinor: 99, coreDepositsPassedOn: false })
    const part = await makePart({ listPriceMinor: 3_000, stock: { NGT: 5 }, prefix: 'QI' }) // no tier: net 30.00
    const { quote } = await startQuote(m)
    quoteId = quote.id
    await m.post(`/api/quotes/${quoteId}/lines`, { kind: 'part', sku: part.sku })
    const r = await m.post(`/api/quotes/${quoteId}/lines`, { kind: 'labour', description: 'Fit and bleed', hours: 1.5 })
    expect(r.status, r.text).toBe(201)
    const [p, lab] = r.body.lines as QuoteDetail['lines']
    partLine = p!
    // 30.00 x 1.30 x 1.20 = 46.80 (mathjs), up to the .99 ending: 46.99; tax inside 46.99 / 6 = 7.831.. -> 7.83; net 39.16
    expect(ref(3_000 * 13_000, 12_000, 100_000_000)).toBe(4_680)
    expect(p).toMatchObject({ taxIncluded: true, unitPriceMinor: 4_699, grossMinor: 4_699, taxMinor: 783, amountMinor: 3_916 })
    // 1.5 h at 81.60 with tax = 122.40; tax inside 122.40 / 6 = 20.40; net 102.00
    expect(lab).toMatchObject({ taxIncluded: true, rateMinor: 8_160, grossMinor: 12_240, taxMinor: 2_040, amountMinor: 10_200 })
    expect(r.body.totals).toEqual({ netMinor: 3_916 + 10_200, taxMinor: 783 + 2_040, grossMinor: 4_699 + 12_240 })
  })

  it('the manager types 99.99 with tax: stored exactly, split into 83.32 and 16.67; restated before tax it is 83.33', async () => {
    const r = await m.patch(`/api/quotes/${quoteId}/lines/${partLine.id}`, { unitPriceMinor: 9_999 })
    expect(r.status, r.text).toBe(200)
    // 99.99 x 20/120 = 16.665 -> 16.67 (mathjs, half away from zero)
    expect(ref(9_999, 2_000, 12_000)).toBe(1_667)
    expect(r.body.lines.find((l: { id: number }) => l.id === partLine.id)).toMatchObject({ unitPriceMinor: 9_999, grossMinor: 9_999, amountMinor: 8_332, taxMinor: 1_667 })
    // the same amount read back by the owner's link and printed on the PDF
    const { token } = await sendAndReadLink(m, quoteId, r.body.ownerEmail)
    const view = (await anon.get(`/api/quote-links/${token}`)).body as OwnerQuoteView
    expect(view.lines.find((l) => l.id === partLine.id)).toMatchObject({ grossMinor: 9_999, amountMinor: 8_332, taxMinor: 1_667 })
    expect(view.totals).toEqual(r.body.totals)
    expect(await pdfOf(`/api/quote-links/${token}/pdf`)).toContain(gbp(9_999))
    // stated before tax instead (a new revision now it is sent): 99.99 / 1.2 = 83.325 -> 83.33, and 83.33 + 16.67 = 100.00:
    // no price before tax comes to 99.99, which is why a price can be stated with tax
    const net = await m.patch(`/api/quotes/${quoteId}/lines/${partLine.id}`, { taxIncluded: false })
    expect(net.status, net.text).toBe(200)
    expect(net.body.lines[0]).toMatchObject({ taxIncluded: false, unitPriceMinor: 8_333, amountMinor: 8_333, taxMinor: 1_667, grossMinor: 10_000 })
  })

  it('refuses a price ending outside 0-99 by name and keeps the one saved', async () => {
    const r = await m.patch('/api/garage/settings', { partPriceEndingMinor: 100, pricesIncludeTax: 'yes' })
    expect(r.status).toBe(422)
    expect(Object.keys(r.body.data.fields).sort()).toEqual(['partPriceEndingMinor', 'pricesIncludeTax'])
    expect((await m.get('/api/garage/settings')).body.partPriceEndingMinor).toBe(99)
    expect((await (await as(people.technician)).patch('/api/garage/settings', { pricesIncludeTax: false })).status).toBe(403)
  })

  it('a technician may not choose how a price is stated', async () => {
    const { quote } = await startQuote(m)
    const tech = await as(people.technician)
    expect((await tech.post(`/api/quotes/${quote.id}/lines`, { kind: 'labour', hours: 1, taxIncluded: false })).status).toBe(404)
    const mill = await startQuote(tech)
    expect((await tech.post(`/api/quotes/${mill.quote.id}/lines`, { kind: 'labour', hours: 1, taxIncluded: true })).status).toBe(403)
  })
})

describe('a discount across two tax rates, and the owner\'s page totals', () => {
  let garage: TestGarage
  let m: Client
  let token: string
  let quoteId: number
  let view: OwnerQuoteView

  beforeAll(async () => {
    garage = await makeGarage({ terms: 'account', creditLimitMinor: 1_000_000, label: 'Two Rates Garage' })
    m = await as(garage.email)
    const s = await startQuote(m)
    quoteId = s.quote.id
    await m.post(`/api/quotes/${quoteId}/lines`, { kind: 'labour', description: 'Brake overhaul', hours: 1, rateMinor: 10_000 })
    await m.post(`/api/quotes/${quoteId}/lines`, { kind: 'sundry', description: 'Child seat refitted', amountMinor: 5_000, taxBp: 500 })
    const d = await m.post(`/api/quotes/${quoteId}/lines`, { kind: 'discount', description: 'Loyal customer', amountMinor: 1_000 })
    expect(d.status, d.text).toBe(201)
    token = (await sendAndReadLink(m, quoteId, s.ownerEmail)).token
    view = (await anon.get(`/api/quote-links/${token}`)).body
  })

  it('splits the discount in proportion and taxes each share at its rate (worked by hand)', async () => {
    // 100.00 at 20 % and 50.00 at 5 %; 10.00 off: 6.67 and 3.33 (largest remainder);
    // tax 20.00 - 1.334 -> 1.33 = 18.67 and 2.50 - 0.1665 -> 0.17 = 2.33; net 140.00, tax 21.00, gross 161.00
    const detail = (await m.get(`/api/quotes/${quoteId}`)).body as QuoteDetail
    expect(detail.totals).toEqual({ netMinor: 14_000, taxMinor: 2_100, grossMinor: 16_100 })
    expect(detail.taxByRate).toEqual([{ taxBp: 2000, netMinor: 9_333, taxMinor: 1_867 }, { taxBp: 500, netMinor: 4_667, taxMinor: 233 }])
    expect(detail.lines.find((l) => l.kind === 'discount')!.taxShares).toEqual([{ taxBp: 2000, netMinor: -667, taxMinor: -133 }, { taxBp: 500, netMinor: -333, taxMinor: -17 }])
    expect(view.totals).toEqual(detail.totals)
    expect(view.taxByRate).toEqual(detail.taxByRate)
    const text = await pdfOf(`/api/quotes/${quoteId}/pdf`, m)
    expect(text).toContain(`Tax at 20 % on ${gbp(9_333)}${gbp(1_867)}`)
    expect(text).toContain(`Tax at 5 % on ${gbp(4_667)}${gbp(233)}`)
    expect(text).toContain(`Total to pay${gbp(16_100)}`)
  })

  it('the owner\'s page counts the choices as the server does, before and after the decision', async () => {
    const sundry = view.lines.find((l) => l.kind === 'sundry')!
    const choose = (id: number) => id !== sundry.id
    // what the page shows as the owner declines the sundry: its own arithmetic on what the link gave it
    const onPage = chosenTotals(view.lines, choose)
    // by hand: the whole 10.00 now falls on the 100.00 at 20 %: net 90.00, tax 20.00 - 2.00 = 18.00, gross 108.00
    expect(onPage).toMatchObject({ netMinor: 9_000, taxMinor: 1_800, grossMinor: 10_800 })
    const html = (await anon.get(`/q/${token}`)).text
    expect(html).toContain(`Everything on this quote comes to ${gbp(view.totals.grossMinor)}`)
    const r = await anon.post(`/api/quote-links/${token}/decision`, {
      lines: view.lines.filter((l) => l.decidable).map((l) => ({ id: l.id, approved: choose(l.id) })), signedName: 'Dana Owner',
    })
    expect(r.status, r.text).toBe(200)
    const detail = (await m.get(`/api/quotes/${quoteId}`)).body as QuoteDetail
    expect(detail.approvedTotals).toEqual({ netMinor: onPage.netMinor, taxMinor: onPage.taxMinor, grossMinor: onPage.grossMinor })
    expect(detail.approvedTaxByRate).toEqual(onPage.byRate)
    const decidedPage = (await anon.get(`/q/${token}`)).text
    expect(/data-owner-total[^>]*>([^<]+)</.exec(decidedPage)?.[1]).toBe(gbp(10_800))
  })
})

describe('the core deposit', () => {
  let garage: TestGarage
  let m: Client
  let counter: Client

  beforeAll(async () => {
    garage = await makeGarage({ terms: 'account', creditLimitMinor: 2_000_000, label: 'Core Deposit Garage' })
    ;[m, counter] = await Promise.all([as(garage.email), as(people.counter)])
  })

  it('is absorbed by the garage by default, taxed at its part\'s rate; a garage may pass deposits on by default', async () => {
    const part = await makePart({ listPriceMinor: 10_000, coreDepositMinor: 3_000, stock: { NGT: 5 }, prefix: 'QC' })
    const { quote } = await startQuote(m)
    const r = await m.post(`/api/quotes/${quote.id}/lines`, { kind: 'part', sku: part.sku, quantity: 2 })
    expect(r.body.lines[1]).toMatchObject({ kind: 'core_deposit', coreCharge: 'absorbed', unitPriceMinor: 3_000, amountMinor: 0, taxBp: 2_000, taxMinor: 0 })
    expect((await m.patch('/api/garage/settings', { coreDepositsPassedOn: true })).status).toBe(200)
    const passed = await m.post(`/api/quotes/${quote.id}/lines`, { kind: 'part', sku: part.sku })
    // £30.00 + 20 % = £36.00
    expect(passed.body.lines[3]).toMatchObject({ kind: 'core_deposit', coreCharge: 'charged', amountMinor: 3_000, taxMinor: 600, grossMinor: 3_600 })
    expect((await m.patch('/api/garage/settings', { coreDepositsPassedOn: false })).status).toBe(200)
  })

  it('passed on, it is refunded to the owner only when the distributor accepts the old unit, and recorded then', async () => {
    const part = await makePart({ listPriceMinor: 10_000, coreDepositMinor: 3_000, stock: { NGT: 5 }, prefix: 'QC' })
    const s = await startQuote(m)
    const added = await m.post(`/api/quotes/${s.quote.id}/lines`, { kind: 'part', sku: part.sku, quantity: 2 })
    const core = added.body.lines[1]
    expect((await m.patch(`/api/quotes/${s.quote.id}/lines/${core.id}`, { coreCharge: 'charged' })).status).toBe(200)
    const { token } = await sendAndReadLink(m, s.quote.id, s.ownerEmail)
    const view = (await anon.get(`/api/quote-links/${token}`)).body as OwnerQuoteView
    // 2 x £30.00 = £60.00 + 20 % £12.00 = £72.00
    expect(view.lines[1]).toMatchObject({ coreCharge: 'charged', grossMinor: 7_200, coreRefund: null })
    const decided = await anon.post(`/api/quote-links/${token}/decision`, { lines: [{ id: view.lines[0]!.id, approved: true }], signedName: 'Kit Owner' })
    expect(decided.status, decided.text).toBe(200)
    const order = await m.post('/api/orders', { quoteId: s.quote.id, payment: 'account' })
    expect(order.status, order.text).toBe(201)
    for (const status of ['picking', 'dispatched']) expect((await counter.patch(`/api/counter/orders/${order.body.id}`, { status })).status).toBe(200)
    // the old units are expected once the parts are sent
    const cr = (await m.get(`/api/orders/${order.body.id}`)).body.coreReturns[0]
    expect((await m.post('/api/core-returns', { coreReturnId: cr.id, quantity: 2 })).status).toBe(200)
    // nothing is due to the owner before the distributor decides
    expect((await m.get(`/api/quotes/${s.quote.id}`)).body.lines[1].coreRefund).toBeNull()
    const accepted = await counter.patch(`/api/counter/core-returns/${cr.id}`, { status: 'accepted' })
    expect(accepted.status, accepted.text).toBe(200)
    const after = (await m.get(`/api/quotes/${s.quote.id}`)).body as QuoteDetail
    // 2 old units x £30.00 charged on the quote, with its 20 % tax: £72.00 back to the owner
    expect(after.lines[1]!.coreRefund).toMatchObject({ amountMinor: 7_200 })
    expect((await anon.get(`/api/quote-links/${token}`)).body.lines[1].coreRefund).toMatchObject({ amountMinor: 7_200 })
  })
})

describe('declining safety work, on record', () => {
  let manager: Client, tech: Client, other: Client
  let quoteId: number
  let token: string
  let registration: string
  let view: OwnerQuoteView

  beforeAll(async () => {
    ;[manager, tech, other] = await Promise.all([as(people.manager), as(people.technician), as(people.otherManager)])
    const pads = await makePart({ listPriceMinor: 4_990, stock: { NGT: 8 }, prefix: 'QD' })
    registration = `DW${uid().slice(0, 2).toUpperCase()} SAF`
    const s = await startQuote(tech, { registration })
    quoteId = s.quote.id
    await tech.post(`/api/quotes/${quoteId}/lines`, { kind: 'part', sku: pads.sku, recommendation: 'required' })
    await tech.post(`/api/quotes/${quoteId}/lines`, { kind: 'labour', description: 'Fit front pads', hours: 0.8 })
    token = (await sendAndReadLink(manager, quoteId, s.ownerEmail)).token
    view = (await anon.get(`/api/quote-links/${token}`)).body
  })

  it('cannot be declined without the signed acknowledgement, nor with half of one', async () => {
    const [p, lab] = view.lines
    const tries = [
      { lines: [{ id: p!.id, approved: false }, { id: lab!.id, approved: true }], signedName: 'Alex Owner' },
      { lines: [{ id: p!.id, approved: false, acknowledgement: { understood: false, signedName: 'Alex Owner' } }, { id: lab!.id, approved: true }], signedName: 'Alex Owner' },
      { lines: [{ id: p!.id, approved: false, acknowledgement: { understood: true, signedName: '' } }, { id: lab!.id, approved: true }], signedName: 'Alex Owner' },
    ]
    for (const body of tries) {
      const r = await anon.post(`/api/quote-links/${token}/decision`, body)
      expect(r.status, JSON.stringify(body)).toBe(422)
      expect(Object.keys(r.body.data.fields).some((k) => k.startsWith('lines.0.acknowledgement')), r.text).toBe(true)
    }
    expect((await anon.get(`/api/quote-links/${token}`)).body.state).toBe('open')
  })

  it('is stored with the statement shown, the name, the time and the address, and the manager is told at once', async () => {
    const [p, lab] = view.lines
    const before = Date.now()
    const r = await anon.post(`/api/quote-links/${token}/decision`, {
      lines: [{ id: p!.id, approved: false, acknowledgement: { understood: true, signedName: 'Alex Owner' } }, { id: lab!.id, approved: true }],
      signedName: 'Alex Owner',
    })
    expect(r.status, r.text).toBe(200)
    const detail = (await manager.get(`/api/quotes/${quoteId}`)).body as QuoteDetail
    const ack = detail.lines[0]!.declineAcknowledgement!
    expect(ack).toMatchObject({ signedName: 'Alex Owner', address: '127.0.0.1' })
    expect(ack.statement).toBe(`${view.lines[0]!.declineStatement}\n${DECLINE_ACKNOWLEDGEMENT}`)
    expect(Date.parse(ack.signedAt)).toBeGreaterThanOrEqual(before - 1_000)
    expect(detail.lines[1]!.declineAcknowledgement).toBeNull()
    expect((r.body as OwnerQuoteView).lines[0]!.declineAcknowledgement).toMatchObject({ signedName: 'Alex Owner' })
    // every manager hears of it, the subject says so
    const mail = await waitForMail(people.manager, /Safety work declined: quote/)
    expect(mail.text).toContain(view.lines[0]!.description)
    expect(mail.text).toContain('signed by Alex Owner')
    // the PDF carries the decision and what was signed
    const text = await pdfOf(`/api/quote-links/${token}/pdf`)
    expect(text).toContain('Safety work declined')
    expect(text).toContain('Signed: Alex Owner')
    expect(text).toContain('from the internet address 127.0.0.1')
    // the list marks it
    const list = (await manager.get(`/api/quotes?q=${encodeURIComponent(registration)}`)).body.data
    expect(list[0]).toMatchObject({ id: quoteId, declinedRequired: 1 })
  })

  it('is in the vehicle\'s history, by registration (spaces and case ignored), for the garage\'s own people only', async () => {
    const plate = registration.toLowerCase().replace(' ', '')
    const mine = await tech.get(`/api/quotes/declined-work?registration=${encodeURIComponent(plate)}`)
    expect(mine.status, mine.text).toBe(200)
    expect(mine.body.meta).toMatchObject({ page: 1, total: 1 })
    expect(mine.body.data[0]).toMatchObject({ quoteId, registration, description: view.lines[0]!.description, acknowledgement: { signedName: 'Alex Owner' } })
    expect((await manager.get('/api/quotes/declined-work?vehicleId=1&pageSize=100')).body.data.some((d: { quoteId: number }) => d.quoteId === quoteId)).toBe(true)
    // another garage sees none of it, and cannot reach the quote
    expect((await other.get(`/api/quotes/declined-work?registration=${encodeURIComponent(plate)}`)).body.meta.total).toBe(0)
    expect((await other.get(`/api/quotes/${quoteId}`)).status).toBe(404)
    expect((await other.patch(`/api/quotes/${quoteId}/lines/${view.lines[0]!.id}`, { taxIncluded: true })).status).toBe(404)
    expect((await anon.get('/api/quotes/declined-work')).status).toBe(401)
    expect((await tech.get('/api/quotes/declined-work?pageSize=500')).status).toBe(422)
    const counter = await as(people.counter)
    expect((await counter.get('/api/quotes/declined-work')).status).toBe(403)
  })
})
