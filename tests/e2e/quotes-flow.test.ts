/**
 * A quote from first line to the owner's decision: prices captured from the prices in use with the garage's tier
 * and markup, core deposits, totals under the one rounding rule, sending with the link and PDF, the owner's
 * decision (which can change neither prices nor lines that were not offered, and cannot decline a required
 * line without the owner's signed acknowledgement), the garage's e-mail, read-only afterwards, and revisions.
 *
 * Reference arithmetic: mathjs BigNumber (decimal.js ROUND_HALF_UP: "if equidistant, rounds away from zero"),
 * a general-purpose library from npm, so the expected figures are not computed by the code under test.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { all, create } from 'mathjs'
import { Client, as, env, people, waitForMail } from '../support/api'
import { backdateExpiry, quoteDb, sendAndReadLink, startQuote } from '../support/quotes'
import { withWrite } from '../../server/utils/db'
import { PartPrice } from '../../server/models/catalogue'
import { makePart, type TestPart } from '../support/orders'

await setup({ host: env().baseUrl })

const math = create(all, { number: 'BigNumber', precision: 64 })
/** value × factor, rounded half away from zero to a whole minor unit */
const refRound = (value: number, factor: string) => Number(math.round(math.multiply(math.bignumber(value), math.bignumber(factor)) as never).toString())

let manager: Client, tech: Client, other: Client, anon: Client
let reman: TestPart, pads: TestPart

beforeAll(async () => {
  ;[manager, tech, other] = await Promise.all([as(people.manager), as(people.technician), as(people.otherManager)])
  anon = new Client()
  // a remanufactured unit with a core deposit, short at the garage's home branch (Northgate), plenty at Riverside
  reman = await makePart({ listPriceMinor: 10_010, coreDepositMinor: 4_000, stock: { NGT: 1, RVS: 5 }, prefix: 'QR' })
  pads = await makePart({ listPriceMinor: 4_990, stock: { NGT: 8, RVS: 8 }, prefix: 'QP' })
})

interface Line { id: number; kind: string; sku: string | null; description: string; quantity: number; unitNetMinor: number | null; markupBp: number | null; unitPriceMinor: number; amountMinor: number; taxBp: number; taxMinor: number; parentLineId: number | null; coreCharge: string | null; recommendation: string | null; ownerDecision: string | null; stock: { short: boolean; branchName: string; quantity: number; elsewhere: { branchName: string; quantity: number }[] } | null }

describe('pricing the lines', () => {
  let quoteId: number
  let lines: Line[]

  it('captures the Silver net price when a part is added, applies the markup rule and adds the core deposit', async () => {
    const { quote } = await startQuote(tech)
    quoteId = quote.id
    const r = await tech.post(`/api/quotes/${quoteId}/lines`, { kind: 'part', sku: reman.sku, quantity: 2, recommendation: 'required' })
    expect(r.status, r.text).toBe(201)
    const mgr = await manager.get(`/api/quotes/${quoteId}`)
    lines = mgr.body.lines
    const part = lines.find((l) => l.kind === 'part')!
    // Millbrook is Silver (12.5 % off list): 100.10 x 0.875 = 87.5875 -> 87.59
    const net = refRound(10_010, '0.875')
    expect(net).toBe(8_759)
    // its markup for calipers is 25 %: 87.59 x 1.25 = 109.4875 -> 109.49
    expect(part).toMatchObject({ sku: reman.sku, quantity: 2, unitNetMinor: net, markupBp: 2_500, unitPriceMinor: refRound(net, '1.25'), amountMinor: 2 * refRound(net, '1.25'), recommendation: 'required' })
    // the garage pays the distributor the deposit and gets it back with the old unit: it absorbs it by default;
    // the deposit is taxed at its part's rate (one rule for deposits, as on the counter's invoices)
    const core = lines.find((l) => l.kind === 'core_deposit')!
    expect(core).toMatchObject({ parentLineId: part.id, quantity: 2, unitPriceMinor: 4_000, amountMinor: 0, taxBp: part.taxBp, taxMinor: 0, coreCharge: 'absorbed' })
  })

  it('shows stock and branch, with a warning when the home branch is short', async () => {
    const part = lines.find((l) => l.kind === 'part')!
    expect(part.stock).toMatchObject({ branchName: 'Northgate', quantity: 1, short: true })
    expect(part.stock!.elsewhere).toEqual([{ branchCode: 'RVS', branchName: 'Riverside', quantity: 5 }])
    const detail = await manager.get(`/api/quotes/${quoteId}`)
    expect(detail.body.warnings.join(' ')).toContain(reman.sku)
  })

  it('keeps the captured price when the list price moves on; a line added later takes the new one', async () => {
    quoteDb()
    await withWrite((t) => PartPrice.update({ listPriceMinor: 12_000 }, { where: { partId: reman.id }, transaction: t }))
    const later = await manager.get(`/api/quotes/${quoteId}`)
    expect(later.body.lines.find((l: Line) => l.kind === 'part').unitNetMinor).toBe(8_759)
    const { quote } = await startQuote(manager)
    const fresh = await manager.post(`/api/quotes/${quote.id}/lines`, { kind: 'part', sku: reman.sku })
    // 120.00 x 0.875 = 105.00
    expect(fresh.body.lines[0].unitNetMinor).toBe(refRound(12_000, '0.875'))
  })

  it('prices labour at the garage rate and sundries and discounts as the manager sets them', async () => {
    expect((await tech.post(`/api/quotes/${quoteId}/lines`, { kind: 'labour', description: 'Fit exchange calipers and bleed', hours: 1.25 })).status).toBe(201)
    expect((await manager.post(`/api/quotes/${quoteId}/lines`, { kind: 'sundry', description: 'Brake fluid DOT 4, 1 litre', quantity: 1, amountMinor: 1_250, recommendation: 'advised' })).status).toBe(201)
    const d = await manager.post(`/api/quotes/${quoteId}/lines`, { kind: 'discount', description: 'Loyal customer', amountMinor: 1_003 })
    expect(d.status).toBe(201)
    lines = d.body.lines
    // 1.25 h x 68.00 = 85.00 (the seeded rate)
    expect(lines.find((l) => l.kind === 'labour')).toMatchObject({ unitPriceMinor: 6_800, amountMinor: 8_500 })
    expect(lines.find((l) => l.kind === 'discount')).toMatchObject({ amountMinor: -1_003 })
    // totals: tax per line at 20 %, rounded half away from zero, summed
    const net = lines.reduce((s, l) => s + l.amountMinor, 0)
    const tax = lines.reduce((s, l) => s + refRound(l.amountMinor, '0.2'), 0)
    expect(d.body.totals).toEqual({ netMinor: net, taxMinor: tax, grossMinor: net + tax })
    // the discount's tax: -10.03 x 0.2 = -2.006 -> -2.01 (away from zero)
    expect(lines.find((l) => l.kind === 'discount')!.taxMinor).toBe(-201)
    for (const l of lines) expect(l.taxMinor, l.kind).toBe(refRound(l.amountMinor, '0.2'))
  })

  it('refuses a discount larger than the rest of the quote, and a core deposit removed on its own', async () => {
    const big = await manager.post(`/api/quotes/${quoteId}/lines`, { kind: 'discount', amountMinor: 10_000_000 })
    expect(big.status).toBe(422)
    expect(big.body.data.fields.amountMinor).toMatch(/larger/)
    const core = lines.find((l) => l.kind === 'core_deposit')!
    expect((await manager.del(`/api/quotes/${quoteId}/lines/${core.id}`)).status).toBe(409)
  })

  it('lets the manager pass a core deposit on (taxed at its part\'s rate), and moves it with its part\'s quantity', async () => {
    const core = lines.find((l) => l.kind === 'core_deposit')!
    const part = lines.find((l) => l.kind === 'part')!
    const passed = await manager.patch(`/api/quotes/${quoteId}/lines/${core.id}`, { coreCharge: 'charged' })
    // 2 x £40.00 = £80.00, tax at the part's 20 %: £16.00
    expect(passed.body.lines.find((l: Line) => l.id === core.id)).toMatchObject({ amountMinor: 8_000, taxBp: 2_000, taxMinor: 1_600, coreCharge: 'charged' })
    const absorbed = await manager.patch(`/api/quotes/${quoteId}/lines/${core.id}`, { coreCharge: 'absorbed' })
    expect(absorbed.body.lines.find((l: Line) => l.id === core.id)).toMatchObject({ amountMinor: 0, coreCharge: 'absorbed' })
    // its tax rate is not the garage's to set
    expect((await manager.patch(`/api/quotes/${quoteId}/lines/${core.id}`, { taxBp: 2000 })).status).toBe(422)
    const charged = await manager.patch(`/api/quotes/${quoteId}/lines/${core.id}`, { coreCharge: 'charged' })
    expect(charged.status).toBe(200)
    const more = await tech.patch(`/api/quotes/${quoteId}/lines/${part.id}`, { quantity: 3 })
    expect(more.body.lines.find((l: Line) => l.id === core.id)).toMatchObject({ quantity: 3, amountMinor: 12_000 })
    const markup = await manager.patch(`/api/quotes/${quoteId}/lines/${part.id}`, { markupBp: 3_000 })
    // 87.59 x 1.30 = 113.867 -> 113.87
    expect(markup.body.lines.find((l: Line) => l.id === part.id)).toMatchObject({ markupBp: 3_000, unitPriceMinor: refRound(8_759, '1.3'), amountMinor: 3 * refRound(8_759, '1.3') })
    const removed = await tech.del(`/api/quotes/${quoteId}/lines/${part.id}`)
    expect(removed.body.lines.some((l: Line) => l.kind === 'part' || l.kind === 'core_deposit')).toBe(false)
  })
})

describe('from sending to the owner\'s decision', () => {
  let quoteId: number
  let owner: string
  let token: string
  let lines: Line[]
  let pricesBefore: string

  beforeAll(async () => {
    const s = await startQuote(tech)
    quoteId = s.quote.id
    owner = s.ownerEmail
    await tech.post(`/api/quotes/${quoteId}/lines`, { kind: 'part', sku: pads.sku, quantity: 1, recommendation: 'required' })
    await tech.post(`/api/quotes/${quoteId}/lines`, { kind: 'labour', description: 'Fit front pads', hours: 0.8 })
    const last = await manager.post(`/api/quotes/${quoteId}/lines`, { kind: 'sundry', description: 'Wheel bolt covers', amountMinor: 600, recommendation: 'advised' })
    lines = last.body.lines
    pricesBefore = JSON.stringify(lines.map((l) => [l.id, l.unitPriceMinor, l.amountMinor, l.taxMinor]))
  })

  it('e-mails the owner the link (an unguessable token), the garage\'s note and the PDF', async () => {
    const sent = await sendAndReadLink(manager, quoteId, owner, { message: 'We can fit the discs on Thursday morning.' })
    expect(sent.mail.text).toContain('We can fit the discs on Thursday morning.')
    token = sent.token
    expect(sent.body).toMatchObject({ status: 'sent', mailed: true })
    // validity from the garage settings (30 days)
    const days = (Date.parse(sent.body.expiresAt) - Date.parse(sent.body.sentAt)) / 86_400_000
    expect(days).toBeCloseTo(30, 5)
    // 32 random bytes in base64url: 43 characters, 256 bits (at least 128 asked)
    expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/)
    expect(sent.mail.attachments.map((a) => a.filename)).toEqual([expect.stringMatching(/^quote-q-\d{4}\.pdf$/)])
    expect(Buffer.from(sent.mail.attachments[0]!.contentBase64, 'base64').subarray(0, 5).toString()).toBe('%PDF-')
  })

  it('shows the owner the quote without trade prices', async () => {
    const view = await anon.get(`/api/quote-links/${token}`)
    expect(view.status).toBe(200)
    expect(view.body).toMatchObject({ state: 'open', status: 'sent', ownerName: 'Robin Tester', garage: { name: 'Millbrook Motor Works' } })
    // every line may be declined; the required one only with a signed acknowledgement of the statement shown
    expect(view.body.lines.map((l: { decidable: boolean; declinable: boolean; needsAcknowledgement: boolean }) => [l.decidable, l.declinable, l.needsAcknowledgement]))
      .toEqual([[true, true, true], [true, true, false], [true, true, false]])
    expect(view.body.lines[0].declineStatement).toContain(lines[0]!.description)
    expect(view.text).not.toMatch(/unitNetMinor|markupBp/)
  })

  it('cannot change prices: any field beyond { id, approved } and signedName is refused, and nothing moves', async () => {
    const [p, lab, sun] = lines
    const tries = [
      { lines: [{ id: p!.id, approved: true, unitPriceMinor: 1 }, { id: lab!.id, approved: true }, { id: sun!.id, approved: true }], signedName: 'Robin Tester' },
      { lines: [{ id: p!.id, approved: true }, { id: lab!.id, approved: true }, { id: sun!.id, approved: true }], signedName: 'Robin Tester', totalMinor: 1 },
      { lines: [{ id: p!.id, approved: true, amountMinor: 0 }, { id: lab!.id, approved: true }, { id: sun!.id, approved: true }], signedName: 'Robin Tester' },
    ]
    for (const body of tries) {
      const r = await anon.post(`/api/quote-links/${token}/decision`, body)
      expect(r.status, JSON.stringify(body)).toBe(422)
    }
    const after = await manager.get(`/api/quotes/${quoteId}`)
    expect(after.body.status).toBe('sent')
    expect(JSON.stringify(after.body.lines.map((l: Line) => [l.id, l.unitPriceMinor, l.amountMinor, l.taxMinor]))).toBe(pricesBefore)
  })

  it('cannot decide on lines that were not offered on this quote', async () => {
    const elsewhere = (await startQuote(manager)).quote
    const foreignLine = (await manager.post(`/api/quotes/${elsewhere.id}/lines`, { kind: 'labour', description: 'Other job', hours: 1 })).body.lines[0].id
    const [p, lab, sun] = lines
    const r = await anon.post(`/api/quote-links/${token}/decision`, {
      lines: [{ id: p!.id, approved: true }, { id: lab!.id, approved: true }, { id: sun!.id, approved: true }, { id: foreignLine, approved: true }], signedName: 'Robin Tester',
    })
    expect(r.status).toBe(422)
    expect(r.body.data.fields['lines.3.id']).toMatch(/not offered/)
    const missing = await anon.post(`/api/quote-links/${token}/decision`, { lines: [{ id: p!.id, approved: true }], signedName: 'Robin Tester' })
    expect(missing.status).toBe(422)
    expect(missing.body.data.fields.lines).toMatch(/every line/)
    expect((await anon.get(`/api/quote-links/${token}`)).body.state).toBe('open')
    // the other quote's line is untouched
    expect((await manager.get(`/api/quotes/${elsewhere.id}`)).body.lines[0].ownerDecision).toBeNull()
  })

  it('cannot decline a required line without the owner\'s signed acknowledgement (422 naming it)', async () => {
    const [p, lab, sun] = lines
    const decline = { lines: [{ id: p!.id, approved: false }, { id: lab!.id, approved: true }, { id: sun!.id, approved: false }], signedName: 'Robin Tester' }
    const r = await anon.post(`/api/quote-links/${token}/decision`, decline)
    expect(r.status).toBe(422)
    expect(r.body.data.fields['lines.0.acknowledgement']).toContain(lines[0]!.description)
    expect(r.body.message).toMatch(/safe/)
  })

  it('records the decision with time and IP, e-mails the garage, then shows it read-only', async () => {
    const [p, lab, sun] = lines
    const before = Date.now()
    const r = await anon.post(`/api/quote-links/${token}/decision`, {
      lines: [{ id: p!.id, approved: true }, { id: lab!.id, approved: true }, { id: sun!.id, approved: false }], signedName: 'Robin Tester',
    })
    expect(r.status, r.text).toBe(200)
    expect(r.body).toMatchObject({ state: 'decided', status: 'partly_approved', signedName: 'Robin Tester' })
    const detail = (await manager.get(`/api/quotes/${quoteId}`)).body
    expect(detail.status).toBe('partly_approved')
    expect(detail.decisionIp).toBe('127.0.0.1')
    expect(Date.parse(detail.decidedAt)).toBeGreaterThanOrEqual(before - 1_000)
    expect(detail.lines.map((l: Line) => l.ownerDecision)).toEqual(['approved', 'approved', 'declined'])
    // approved totals: the two approved lines, tax per line
    const approved = detail.lines.filter((l: Line) => l.ownerDecision === 'approved')
    const net = approved.reduce((s: number, l: Line) => s + l.amountMinor, 0)
    const tax = approved.reduce((s: number, l: Line) => s + refRound(l.amountMinor, '0.2'), 0)
    expect(detail.approvedTotals).toEqual({ netMinor: net, taxMinor: tax, grossMinor: net + tax })
    const mail = await waitForMail(people.manager, /partly approved by the owner/)
    expect(mail.text).toContain('Robin Tester')
    await waitForMail('office@millbrook-motors.test', /partly approved by the owner/)

    const again = await anon.post(`/api/quote-links/${token}/decision`, { lines: [{ id: p!.id, approved: true }, { id: lab!.id, approved: true }, { id: sun!.id, approved: true }], signedName: 'Robin Tester' })
    expect(again.status).toBe(409)
    const view = await anon.get(`/api/quote-links/${token}`)
    expect(view.body.state).toBe('decided')
    expect(view.body.lines.map((l: { ownerDecision: string }) => l.ownerDecision)).toEqual(['approved', 'approved', 'declined'])
  })

  it('a change makes a new revision: the old one is kept as superseded, its link says so', async () => {
    const changed = await manager.patch(`/api/quotes/${quoteId}`, { odometer: '52 100 mi' })
    expect(changed.status).toBe(200)
    expect(changed.body).toMatchObject({ revision: 2, status: 'draft', supersedesQuoteId: quoteId, odometer: '52 100 mi' })
    expect(changed.body.id).not.toBe(quoteId)
    expect(changed.body.lines.map((l: Line) => l.ownerDecision)).toEqual([null, null, null])
    const old = (await manager.get(`/api/quotes/${quoteId}`)).body
    expect(old).toMatchObject({ status: 'superseded', odometer: '52 000 mi', supersededByQuoteId: changed.body.id, signedName: 'Robin Tester' })
    expect(old.lines.map((l: Line) => l.ownerDecision)).toEqual(['approved', 'approved', 'declined'])
    expect(old.revisions.map((r: { id: number; status: string }) => [r.id, r.status])).toEqual([[quoteId, 'superseded'], [changed.body.id, 'draft']])
    expect((await anon.get(`/api/quote-links/${token}`)).body.state).toBe('superseded')
    // a replaced revision itself cannot change any more
    expect((await manager.patch(`/api/quotes/${quoteId}`, { odometer: '1 mi' })).status).toBe(409)
    // the list shows the current revision, not the replaced one
    const list = (await manager.get('/api/quotes?pageSize=100')).body.data.map((q: { id: number }) => q.id)
    expect(list).toContain(changed.body.id)
    expect(list).not.toContain(quoteId)
  })
})

describe('a sent quote changed by adding a line', () => {
  it('goes into a new revision; the owner\'s old link no longer offers a choice', async () => {
    const s = await startQuote(manager)
    await manager.post(`/api/quotes/${s.quote.id}/lines`, { kind: 'labour', description: 'Brake check', hours: 0.5 })
    const { token } = await sendAndReadLink(manager, s.quote.id, s.ownerEmail)
    const added = await tech.post(`/api/quotes/${s.quote.id}/lines`, { kind: 'part', sku: pads.sku })
    expect(added.status).toBe(201)
    expect(added.body).toMatchObject({ revision: 2, supersedesQuoteId: s.quote.id })
    expect(added.body.lines).toHaveLength(2)
    expect((await manager.get(`/api/quotes/${s.quote.id}`)).body.lines).toHaveLength(1)
    const view = await anon.get(`/api/quote-links/${token}`)
    expect(view.body.state).toBe('superseded')
    const decide = await anon.post(`/api/quote-links/${token}/decision`, { lines: [{ id: view.body.lines[0].id, approved: true }], signedName: 'Robin Tester' })
    expect(decide.status).toBe(409)
  })
})

describe('required lines the owner was talked through', () => {
  it('the manager records it without a new revision; declining still takes the owner\'s signature', async () => {
    const s = await startQuote(manager)
    const withPart = await manager.post(`/api/quotes/${s.quote.id}/lines`, { kind: 'part', sku: pads.sku, recommendation: 'required' })
    const partId = withPart.body.lines[0].id
    const { token } = await sendAndReadLink(manager, s.quote.id, s.ownerEmail)
    const told = await manager.patch(`/api/quotes/${s.quote.id}/lines/${partId}`, { toldOwnerDeclinedRequired: true })
    expect(told.status).toBe(200)
    expect(told.body).toMatchObject({ id: s.quote.id, status: 'sent' })
    const view = await anon.get(`/api/quote-links/${token}`)
    expect(view.body.lines[0]).toMatchObject({ recommendation: 'required', declinable: true, needsAcknowledgement: true })
    expect((await anon.post(`/api/quote-links/${token}/decision`, { lines: [{ id: partId, approved: false }], signedName: 'Robin Tester' })).status).toBe(422)
    const r = await anon.post(`/api/quote-links/${token}/decision`, {
      lines: [{ id: partId, approved: false, acknowledgement: { understood: true, signedName: 'Robin Tester' } }], signedName: 'Robin Tester',
    })
    expect(r.status).toBe(200)
    expect(r.body.status).toBe('declined')
  })
})

describe('links that are not valid', () => {
  it('a wrong token is a plain 404 "This link is not valid", for the API and the page', async () => {
    const wrong = 'A'.repeat(43)
    const r = await anon.get(`/api/quote-links/${wrong}`)
    expect(r.status).toBe(404)
    expect(r.body.message).toBe('This link is not valid.')
    expect((await anon.post(`/api/quote-links/${wrong}/decision`, { lines: [{ id: 1, approved: true }], signedName: 'X Y' })).status).toBe(404)
    expect((await anon.get('/api/quote-links/short')).status).toBe(404)
    const page = await anon.get(`/q/${wrong}`)
    expect(page.status).toBe(404)
    expect(page.text).toContain('This link is not valid')
  })

  it('an expired quote\'s link is 404, and the quote shows as expired', async () => {
    const s = await startQuote(manager)
    await manager.post(`/api/quotes/${s.quote.id}/lines`, { kind: 'labour', description: 'Brake check', hours: 0.5 })
    const { token } = await sendAndReadLink(manager, s.quote.id, s.ownerEmail)
    expect((await anon.get(`/api/quote-links/${token}`)).status).toBe(200)
    await backdateExpiry(s.quote.id)
    const r = await anon.get(`/api/quote-links/${token}`)
    expect(r.status).toBe(404)
    expect(r.body.message).toBe('This link is not valid.')
    expect((await anon.get(`/q/${token}`)).status).toBe(404)
    expect((await anon.post(`/api/quote-links/${token}/decision`, { lines: [{ id: 1, approved: true }], signedName: 'X Y' })).status).toBe(404)
    expect((await manager.get(`/api/quotes/${s.quote.id}`)).body.status).toBe('expired')
    expect((await manager.post(`/api/quotes/${s.quote.id}/send`, {})).status).toBe(409)
    // an expired quote can be revised and sent again
    const rev = await manager.post(`/api/quotes/${s.quote.id}/revisions`, {})
    expect(rev.status).toBe(201)
    expect(rev.body).toMatchObject({ status: 'draft', revision: 2 })
  })

  it('the owner\'s page renders the quote on the server for a valid link', async () => {
    const s = await startQuote(manager)
    await manager.post(`/api/quotes/${s.quote.id}/lines`, { kind: 'labour', description: 'Brake fluid change', hours: 0.7 })
    const { token } = await sendAndReadLink(manager, s.quote.id, s.ownerEmail)
    const page = await anon.get(`/q/${token}`)
    expect(page.status).toBe(200)
    expect(page.text).toContain('Brake fluid change')
    expect(page.headers.get('cache-control')).toContain('no-store')
    expect(page.headers.get('referrer-policy')).toBe('no-referrer')
  })
})

describe('another garage and the owner\'s link', () => {
  it('the link shows only this quote; another garage still cannot reach it through the API', async () => {
    const s = await startQuote(manager)
    await manager.post(`/api/quotes/${s.quote.id}/lines`, { kind: 'labour', description: 'Brake check', hours: 0.5 })
    const { token } = await sendAndReadLink(manager, s.quote.id, s.ownerEmail)
    expect((await other.get(`/api/quotes/${s.quote.id}`)).status).toBe(404)
    const view = await other.get(`/api/quote-links/${token}`)
    expect(view.body.reference).toMatch(/^Q-\d{4}$/)
    expect(view.body.lines).toHaveLength(1)
  })
})
