/**
 * Who may touch a quote: a garage reads and changes only its own (another garage gets 404 on every route, never
 * learning the quote exists), technicians draft but neither send nor price, distributor staff have no quotes,
 * signed-out callers get 401, and bad input is a 422 naming the field.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { Client, as, env, people } from '../support/api'
import { VEHICLE_ID, sendAndReadLink, startQuote } from '../support/quotes'
import { makePart } from '../support/orders'

await setup({ host: env().baseUrl })

let manager: Client, tech: Client, other: Client, otherTech: Client, counter: Client, anon: Client
let quote: { id: number; lines: { id: number }[] }
let owner: string
// a name no other test gives an owner, so the other garage's own quotes (other files make some) cannot match it
const ownerName = `Morwenna Access-${Date.now().toString(36)}`
let sku: string

beforeAll(async () => {
  ;[manager, tech, other, otherTech, counter] = await Promise.all([
    as(people.manager), as(people.technician), as(people.otherManager), as(people.otherTechnician), as(people.counter),
  ])
  anon = new Client()
  sku = (await makePart({ listPriceMinor: 5_000, stock: { NGT: 10 } })).sku
  const started = await startQuote(tech, { ownerName })
  owner = started.ownerEmail
  const added = await tech.post(`/api/quotes/${started.quote.id}/lines`, { kind: 'part', sku, quantity: 1, recommendation: 'required' })
  expect(added.status, added.text).toBe(201)
  quote = added.body
})

describe('another garage', () => {
  it('gets 404 on every quote route, for reading, changing and sending', async () => {
    const id = quote.id
    const lineId = quote.lines[0]!.id
    const tries = [
      other.get(`/api/quotes/${id}`),
      other.patch(`/api/quotes/${id}`, { odometer: '1 mi' }),
      other.post(`/api/quotes/${id}/lines`, { kind: 'labour', hours: 1 }),
      other.patch(`/api/quotes/${id}/lines/${lineId}`, { quantity: 3 }),
      other.del(`/api/quotes/${id}/lines/${lineId}`),
      other.post(`/api/quotes/${id}/lines/from-inspection`, {}),
      other.post(`/api/quotes/${id}/send`, {}),
      other.post(`/api/quotes/${id}/revisions`, {}),
      other.get(`/api/quotes/${id}/pdf`),
      otherTech.get(`/api/quotes/${id}`),
    ]
    for (const r of await Promise.all(tries)) {
      expect(r.status, r.text).toBe(404)
      expect(r.text).not.toContain(owner)
    }
    // and nothing changed
    const mine = await manager.get(`/api/quotes/${id}`)
    expect(mine.body).toMatchObject({ status: 'draft', odometer: '52 000 mi' })
    expect(mine.body.lines).toHaveLength(1)
    expect(mine.body.lines[0].quantity).toBe(1)
  })

  it('does not see the quote or its owner\'s personal data in its list', async () => {
    const list = await other.get('/api/quotes?status=&page=1')
    expect(list.status).toBe(200)
    expect(list.body.data.map((q: { id: number }) => q.id)).not.toContain(quote.id)
    expect(list.text).not.toContain(owner)
    expect(list.text).not.toContain(ownerName)
    const found = await other.get(`/api/quotes?q=${encodeURIComponent(ownerName)}`)
    expect(found.body.data).toEqual([])
  })

  it('cannot attach this garage\'s quote lines or inspections to its own quote', async () => {
    const theirs = (await startQuote(other)).quote
    const r = await other.patch(`/api/quotes/${theirs.id}/lines/${quote.lines[0]!.id}`, { quantity: 2 })
    expect(r.status).toBe(404)
  })
})

describe('technicians', () => {
  it('cannot send a quote (403), though they can read and draft it', async () => {
    const r = await tech.post(`/api/quotes/${quote.id}/send`, {})
    expect(r.status).toBe(403)
    expect(r.body.message).toMatch(/manager/)
    expect((await tech.get(`/api/quotes/${quote.id}`)).body.status).toBe('draft')
  })

  it('cannot price: markups, selling prices, rates, tax, sundry prices and discounts are managers\'', async () => {
    const lineId = quote.lines[0]!.id
    for (const patch of [{ markupBp: 100 }, { unitPriceMinor: 1 }, { taxBp: 0 }]) {
      const r = await tech.patch(`/api/quotes/${quote.id}/lines/${lineId}`, patch)
      expect(r.status, JSON.stringify(patch)).toBe(403)
    }
    expect((await tech.post(`/api/quotes/${quote.id}/lines`, { kind: 'discount', amountMinor: 100 })).status).toBe(403)
    expect((await tech.post(`/api/quotes/${quote.id}/lines`, { kind: 'sundry', description: 'Grease', amountMinor: 100 })).status).toBe(403)
    expect((await tech.post(`/api/quotes/${quote.id}/lines`, { kind: 'labour', hours: 1, rateMinor: 1 })).status).toBe(403)
    expect((await tech.patch(`/api/quotes/${quote.id}/lines/${lineId}`, { toldOwnerDeclinedRequired: true })).status).toBe(403)
    const after = await manager.get(`/api/quotes/${quote.id}`)
    expect(after.body.lines.map((l: { kind: string }) => l.kind)).toEqual(['part'])
  })

  it('see trade prices and markups only when their garage allows it', async () => {
    // Millbrook keeps trade prices from its technicians; Tannery Yard shows them (the demo settings)
    const own = await tech.get(`/api/quotes/${quote.id}`)
    expect(own.body.showsTradePrices).toBe(false)
    expect(own.body.lines[0]).toMatchObject({ unitNetMinor: null, markupBp: null })
    expect(own.body.lines[0].unitPriceMinor).toBeGreaterThan(0)
    const mgr = await manager.get(`/api/quotes/${quote.id}`)
    expect(mgr.body.lines[0].unitNetMinor).toBeGreaterThan(0)
    const theirs = (await startQuote(otherTech)).quote
    const line = await otherTech.post(`/api/quotes/${theirs.id}/lines`, { kind: 'part', sku })
    expect(line.body.showsTradePrices).toBe(true)
    expect(line.body.lines[0].unitNetMinor).toBeGreaterThan(0)
  })

  it('cannot read or change the garage settings', async () => {
    expect((await tech.get('/api/garage/settings')).status).toBe(403)
    expect((await tech.patch('/api/garage/settings', { labourRateMinor: 1 })).status).toBe(403)
  })
})

describe('distributor staff and signed-out callers', () => {
  it('distributor staff have no quotes: 403 for the list, 404 for a garage\'s quote', async () => {
    expect((await counter.get('/api/quotes')).status).toBe(403)
    expect((await counter.get(`/api/quotes/${quote.id}`)).status).toBe(404)
    expect((await counter.post('/api/quotes', { vehicleId: VEHICLE_ID, ownerName: 'X', ownerEmail: 'x@owners.test' })).status).toBe(403)
  })

  it('signed out: 401 before anything else', async () => {
    expect((await anon.get('/api/quotes')).status).toBe(401)
    expect((await anon.get(`/api/quotes/${quote.id}`)).status).toBe(401)
    expect((await anon.post('/api/quotes', { nonsense: 1 })).status).toBe(401)
    expect((await anon.get(`/api/quotes/${quote.id}/pdf`)).status).toBe(401)
    expect((await anon.get('/api/garage/settings')).status).toBe(401)
  })
})

describe('bad input', () => {
  it('names the fields at fault (422) and creates nothing', async () => {
    const before = (await manager.get('/api/quotes?pageSize=1')).body.meta.total
    const r = await manager.post('/api/quotes', { vehicleId: VEHICLE_ID, ownerName: '', ownerEmail: 'not-an-email', colour: 'red' })
    expect(r.status).toBe(422)
    expect(Object.keys(r.body.data.fields).sort()).toEqual(['colour', 'ownerEmail', 'ownerName'])
    expect((await manager.post('/api/quotes', { vehicleId: 999_999, ownerName: 'A', ownerEmail: 'a@owners.test' })).body.data.fields.vehicleId).toMatch(/not in the catalogue/)
    expect((await manager.get('/api/quotes?pageSize=1')).body.meta.total).toBe(before)
  })

  it('refuses lines without what their kind needs, or with what it does not take', async () => {
    const cases: [Record<string, unknown>, string][] = [
      [{ kind: 'part' }, 'sku'],
      [{ kind: 'part', sku: 'NO-SUCH-SKU' }, 'sku'],
      [{ kind: 'labour' }, 'hours'],
      [{ kind: 'labour', hours: 1.255 }, 'hours'],
      [{ kind: 'sundry' }, 'description'],
      [{ kind: 'core_deposit', amountMinor: 1 }, 'kind'],
      [{ kind: 'part', sku, quantity: 0 }, 'quantity'],
      [{ kind: 'labour', hours: 1, sku }, 'sku'],
    ]
    for (const [body, field] of cases) {
      const r = await manager.post(`/api/quotes/${quote.id}/lines`, body)
      expect(r.status, JSON.stringify(body)).toBe(422)
      expect(Object.keys(r.body.data.fields), JSON.stringify(body)).toContain(field)
    }
    const lineId = quote.lines[0]!.id
    const wrongField = await manager.patch(`/api/quotes/${quote.id}/lines/${lineId}`, { hours: 2 })
    expect(wrongField.status).toBe(422)
    expect(wrongField.body.data.fields.hours).toMatch(/no hours/)
    expect((await manager.get(`/api/quotes/${quote.id}`)).body.lines).toHaveLength(1)
  })

  it('answers 422 for a quote id that is not a number and 404 for one that does not exist', async () => {
    expect((await manager.get('/api/quotes/abc')).status).toBe(422)
    expect((await manager.get('/api/quotes/99999999')).status).toBe(404)
  })

  it('keeps the owner link routes quiet about anything but the link', async () => {
    const { token } = await sendAndReadLink(manager, (await startQuoteWithLine()).id, lastOwner)
    const view = await anon.get(`/api/quote-links/${token}`)
    expect(view.status).toBe(200)
    // no trade prices, markups, owner's contact details or other ids of the garage
    expect(view.text).not.toMatch(/unitNetMinor|markupBp|ownerEmail|ownerPhone|createdBy|organisationId/)
    expect(view.text).not.toContain(lastOwner)
  })
})

let lastOwner = ''
async function startQuoteWithLine() {
  const s = await startQuote(manager)
  lastOwner = s.ownerEmail
  const r = await manager.post(`/api/quotes/${s.quote.id}/lines`, { kind: 'labour', description: 'Inspect brakes', hours: 0.5 })
  return r.body as { id: number }
}
