/**
 * Returns of wrong, unneeded or faulty parts: the garage asks within the period its reason allows (faulty parts
 * with the date fitted, the mileage, the fault and photos); the counter accepts all, part (with a reason) or none.
 * What is accepted, and only that, is credited on a credit note against the invoice; stock comes back (not for a
 * faulty part: a warranty claim); an unneeded part sent back late carries the restocking charge; a card order is
 * refunded through the payment service. Isolation: another garage's return is a 404. Figures are worked by hand:
 * UK standard VAT 20 % (gov.uk "VAT rates"); the restocking charge 15 % after 14 days (the configured defaults,
 * counter-settings.ts); shares of a line's tax rounded half away from zero.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { Client, as, env, people, waitForMail } from '../support/api'
import { pngBytes } from '../support/accounts'
import { counterAndAccountGarage, fake, ledgerOf, makeGarage, pickAndDispatch, makePart, payOnFake, sendAt, sessionIdOf, stockOf, waitFor, type TestGarage, type TestPart } from '../support/orders'

await setup({ host: env().baseUrl })

let counter: Client
let garage: TestGarage
let c: Client
let part: TestPart

beforeAll(async () => {
  ;({ counter, garage, c } = await counterAndAccountGarage('Returns Garage'))
  part = await makePart({ listPriceMinor: 4_000, stock: { NGT: 100 } })
})

/** An order sent at `iso` (the dispatch day counts for the return periods). */
async function sentAt(client: Client, quantity: number, iso: string, payment: 'account' | 'card' = 'account') {
  const order = (await sendAt(client, 'POST', '/api/orders', iso, { lines: [{ sku: part.sku, quantity }], payment })).body
  if (payment === 'card') await payOnFake(sessionIdOf((await client.post(`/api/orders/${order.id}/checkout`)).body.url))
  return pickAndDispatch(counter, order.id, iso)
}

/** A garage of its own for an order dispatched weeks ago (its invoice falls due from then). */
const lateGarage = async () => as((await makeGarage({ terms: 'account', creditLimitMinor: 50_000_000, label: 'Returns Late Garage' })).email)
const now = () => new Date().toISOString()
const daysAfter = (iso: string, days: number) => new Date(new Date(iso).getTime() + days * 86_400_000).toISOString()

describe('a return accepted in part', () => {
  it('credits exactly the part accepted, puts it back on the shelf and tells the garage', async () => {
    const order = await sentAt(c, 3, now())
    const lineId = order.lines[0].id
    expect(order.lines[0].returnableQuantity).toBe(3)
    const asked = await c.post('/api/returns', { orderLineId: lineId, quantity: 3, reason: 'wrong_part', note: 'ordered for the wrong axle' })
    expect(asked.status, asked.text).toBe(201)
    expect(asked.body).toMatchObject({ status: 'requested', quantity: 3, reason: 'wrong_part', restockingBp: 0, creditedMinor: null })
    expect((await c.get(`/api/orders/${order.id}`)).body.lines[0].returnableQuantity).toBe(0)
    const shelf = await stockOf(part.id)
    const ledger = await ledgerOf(garage.id)

    const noReason = await counter.patch(`/api/counter/returns/${asked.body.id}`, { status: 'accepted', quantity: 2 })
    expect(noReason.status).toBe(422)
    expect(noReason.body.data.fields.reason).toMatch(/only 2 of the 3/)
    expect((await counter.patch(`/api/counter/returns/${asked.body.id}`, { status: 'accepted', quantity: 4, reason: 'x' })).status).toBe(422)
    const r = await counter.patch(`/api/counter/returns/${asked.body.id}`, { status: 'accepted', quantity: 2, reason: 'One came back with a cracked housing.' })
    expect(r.status, r.text).toBe(200)
    // invoice: 3 x £40.00 = £120.00, VAT £24.00; 2 of 3 accepted: £80.00 and 2/3 of £24.00 = £16.00: £96.00
    expect(r.body).toMatchObject({ status: 'part_accepted', acceptedQuantity: 2, creditedMinor: 9_600 })
    const note = (await c.get(`/api/documents/${r.body.creditNote.id}`)).body
    expect(note).toMatchObject({ kind: 'credit_note', reason: 'return', netMinor: 8_000, taxMinor: 1_600, totalMinor: 9_600 })
    expect(note.lines).toEqual([expect.objectContaining({ kind: 'part', quantity: 2, netMinor: 8_000, taxMinor: 1_600 })])
    expect(await stockOf(part.id)).toBe(shelf + 2)
    expect((await ledgerOf(garage.id)).slice(ledger.length)).toEqual([{ kind: 'return_credit', amountMinor: -9_600, externalId: null }])
    const mail = await waitForMail(garage.email, /Return RT-\d+: £96\.00 credited/)
    expect(mail.text).toContain('cracked housing')
    // decided once
    expect((await counter.patch(`/api/counter/returns/${asked.body.id}`, { status: 'rejected', reason: 'late' })).status).toBe(409)
  })
})

describe('what the garage may send back, and when', () => {
  it('charges restocking on an unneeded part sent back after 14 days', async () => {
    const sentOn = '2026-11-02T10:00:00Z'
    // its own garage: an invoice dated back then is overdue today and would put the shared one on stop
    const c = await lateGarage()
    const order = await sentAt(c, 2, sentOn)
    const lineId = order.lines[0].id
    // 20 days after dispatch: past the 14 days, within the 30
    const asked = await sendAt(c, 'POST', '/api/returns', daysAfter(sentOn, 20), { orderLineId: lineId, quantity: 2, reason: 'not_needed' })
    expect(asked.status, asked.text).toBe(201)
    expect(asked.body.restockingBp).toBe(1500)
    const r = await counter.patch(`/api/counter/returns/${asked.body.id}`, { status: 'accepted' })
    // parts 2 x £40.00 = £80.00, VAT £16.00; restocking 15 %: £12.00 and 15 % of the VAT, £2.40
    // credited £80.00 - £12.00 = £68.00 net, £16.00 - £2.40 = £13.60 VAT: £81.60
    expect(r.body).toMatchObject({ status: 'accepted', creditedMinor: 8_160 })
    const note = (await c.get(`/api/documents/${r.body.creditNote.id}`)).body
    expect(note.lines.map((l: { kind: string; netMinor: number; taxMinor: number }) => [l.kind, l.netMinor, l.taxMinor]))
      .toEqual([['part', 8_000, 1_600], ['restocking', -1_200, -240]])
    expect(note).toMatchObject({ netMinor: 6_800, taxMinor: 1_360, totalMinor: 8_160 })
  })

  it('refuses a wrong part after 30 days, but takes a faulty one as a warranty claim with its details', async () => {
    const sentOn = '2026-10-01T10:00:00Z'
    // its own garage: an invoice dated back then is overdue today and would put the shared one on stop
    const c = await lateGarage()
    const order = await sentAt(c, 1, sentOn)
    const lineId = order.lines[0].id
    const late = await sendAt(c, 'POST', '/api/returns', daysAfter(sentOn, 31), { orderLineId: lineId, quantity: 1, reason: 'wrong_part' })
    expect(late.status).toBe(422)
    expect(late.body.data.fields.reason).toMatch(/within 30 days/)
    const bare = await sendAt(c, 'POST', '/api/returns', daysAfter(sentOn, 31), { orderLineId: lineId, quantity: 1, reason: 'faulty' })
    expect(bare.status).toBe(422)
    expect(Object.keys(bare.body.data.fields).sort()).toEqual(['fault', 'fittedOn', 'mileage'])
    const early = await sendAt(c, 'POST', '/api/returns', daysAfter(sentOn, 31), { orderLineId: lineId, quantity: 1, reason: 'faulty', fittedOn: '2026-09-01', mileage: 48_200, fault: 'Piston seized after two weeks' })
    expect(early.body.data.fields.fittedOn).toMatch(/between/)
    const claim = await sendAt(c, 'POST', '/api/returns', daysAfter(sentOn, 31), { orderLineId: lineId, quantity: 1, reason: 'faulty', fittedOn: '2026-10-03', mileage: 48_200, fault: 'Piston seized after two weeks' })
    expect(claim.status, claim.text).toBe(201)
    expect(claim.body).toMatchObject({ warranty: true, fittedOn: '2026-10-03', mileage: 48_200 })

    // a photo of it, checked by its bytes
    const form = new FormData()
    form.append('photo', new Blob([pngBytes()], { type: 'image/png' }), 'seized.png')
    const photo = await c.request(`/api/returns/${claim.body.id}/photos`, { method: 'POST', body: form })
    expect(photo.status, photo.text).toBe(200)
    expect(photo.body.photos).toEqual([{ id: expect.any(Number), name: 'seized.png' }])
    const notImage = new FormData()
    notImage.append('photo', new Blob([Buffer.from('not an image at all')], { type: 'image/png' }), 'fake.png')
    const refused = await c.request(`/api/returns/${claim.body.id}/photos`, { method: 'POST', body: notImage })
    expect(refused.status).toBe(415)
    expect(refused.body.data.fields.photo).toMatch(/JPEG, PNG or WebP/)
    const shown = await counter.get(`/api/returns/${claim.body.id}/photos/${photo.body.photos[0].id}`)
    expect(shown.status).toBe(200)
    expect(shown.headers.get('content-type')).toBe('image/png')

    // the distributor settles the claim in full, and a faulty part does not go back on the shelf
    const shelf = await stockOf(part.id)
    const settled = await counter.patch(`/api/counter/returns/${claim.body.id}`, { status: 'accepted' })
    // £40.00 + VAT £8.00 = £48.00
    expect(settled.body).toMatchObject({ status: 'accepted', creditedMinor: 4_800 })
    expect((await c.get(`/api/documents/${settled.body.creditNote.id}`)).body.reason).toBe('warranty')
    expect(await stockOf(part.id)).toBe(shelf)
  })

  it('turns a return down with the reason, credits nothing, and frees the units to be asked again', async () => {
    const order = await sentAt(c, 1, now())
    const asked = (await c.post('/api/returns', { orderLineId: order.lines[0].id, quantity: 1, reason: 'not_needed' })).body
    const ledger = await ledgerOf(garage.id)
    expect((await counter.patch(`/api/counter/returns/${asked.id}`, { status: 'rejected' })).status).toBe(422)
    const r = await counter.patch(`/api/counter/returns/${asked.id}`, { status: 'rejected', reason: 'Box opened and the part fitted' })
    expect(r.body).toMatchObject({ status: 'rejected', creditedMinor: null, creditNote: null })
    expect(await ledgerOf(garage.id)).toEqual(ledger)
    expect((await c.get(`/api/orders/${order.id}`)).body.lines[0].returnableQuantity).toBe(1)
  })

  it('refuses a line that has not been sent', async () => {
    const order = (await c.post('/api/orders', { lines: [{ sku: part.sku, quantity: 1 }], payment: 'account' })).body
    expect((await c.post('/api/returns', { orderLineId: order.lines[0].id, quantity: 1, reason: 'wrong_part' })).status).toBe(409)
  })
})

describe('a card order\'s return', () => {
  it('is refunded to the card by its credit note', async () => {
    const g = await makeGarage({ terms: 'card', label: 'Returns Card Garage' })
    const card = await as(g.email)
    const order = await sentAt(card, 1, now(), 'card')
    const asked = (await card.post('/api/returns', { orderLineId: order.lines[0].id, quantity: 1, reason: 'wrong_part' })).body
    const r = await counter.patch(`/api/counter/returns/${asked.id}`, { status: 'accepted' })
    // £40.00 + VAT £8.00; the refund is sent after the commit (it may already have gone when the answer comes)
    expect(r.body).toMatchObject({ status: 'accepted', creditedMinor: 4_800 })
    await waitFor(async () => !(await card.get(`/api/returns/${asked.id}`)).body.refundPending, 'the return refund')
    const refunds = (await fake('GET', '/_fake/requests?path=/v1/refunds&method=POST')).json.data
      .filter((x: { idempotencyKey: string }) => x.idempotencyKey?.startsWith(`boreline-return-${asked.id}-`))
    expect(refunds.map((x: { body: { amount: string } }) => Number(x.body.amount))).toEqual([4_800])
    expect((await ledgerOf(g.id)).slice(-2).map((e) => [e.kind, e.amountMinor])).toEqual([['return_credit', -4_800], ['refund', 4_800]])
  })
})

describe('who sees a return', () => {
  it('answers 404 to another garage, 403 to roles without the ability, 401 signed out', async () => {
    const order = await sentAt(c, 1, now())
    const asked = (await c.post('/api/returns', { orderLineId: order.lines[0].id, quantity: 1, reason: 'wrong_part' })).body
    const other = await as((await makeGarage({ terms: 'card', label: 'Nosy Returns Garage' })).email)
    expect((await other.get(`/api/returns/${asked.id}`)).status).toBe(404)
    expect((await other.post('/api/returns', { orderLineId: order.lines[0].id, quantity: 1, reason: 'wrong_part' })).status).toBe(404)
    expect((await other.get('/api/returns')).body.data.some((x: { id: number }) => x.id === asked.id)).toBe(false)
    expect((await other.get(`/api/returns/lines/${order.lines[0].id}`)).status).toBe(404)
    expect((await c.get('/api/returns')).body.data.some((x: { id: number }) => x.id === asked.id)).toBe(true)
    expect((await c.patch(`/api/counter/returns/${asked.id}`, { status: 'accepted' })).status).toBe(403)
    expect((await c.get('/api/counter/returns')).status).toBe(403)
    expect((await counter.post('/api/returns', { orderLineId: order.lines[0].id, quantity: 1, reason: 'wrong_part' })).status).toBe(403)
    expect((await (await as(people.technician)).get('/api/returns')).status).toBe(403)
    expect((await new Client().get('/api/returns')).status).toBe(401)
    expect((await counter.get('/api/counter/returns')).body.data.some((x: { id: number; garage: { name: string } }) => x.id === asked.id && x.garage.name === garage.name)).toBe(true)
  })
})
