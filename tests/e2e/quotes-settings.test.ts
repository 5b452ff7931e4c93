/**
 * Garage settings (managers only) and the logo: PNG, JPEG or SVG under 2 MB, checked by its bytes, an SVG with
 * anything but drawing refused, served only to the garage's own people and to the owner's page of its quotes.
 * Settings are changed on Tannery Yard and put back, so the other tests keep Millbrook's demo settings.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { Client, as, env, people } from '../support/api'
import { sendAndReadLink, startQuote } from '../support/quotes'
import { makePart } from '../support/orders'

await setup({ host: env().baseUrl })

// a 1 x 1 PNG (PNG signature + IHDR + IDAT + IEND, from the PNG specification's structure)
const PNG = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==', 'base64')
const SVG_OK = '<?xml version="1.0"?><svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 40 20"><rect width="40" height="20" fill="#9a5225"/><text x="4" y="14" fill="#fff">TY</text></svg>'

let marek: Client, ada: Client, hattie: Client
let original: Record<string, unknown>

function upload(c: Client, name: string, type: string, data: Buffer | string) {
  const form = new FormData()
  form.append('logo', new Blob([data], { type }), name)
  return c.request('/api/garage/logo', { method: 'POST', body: form })
}

beforeAll(async () => {
  ;[marek, ada, hattie] = await Promise.all([as(people.otherManager), as(people.otherTechnician), as(people.manager)])
  original = (await marek.get('/api/garage/settings')).body
})
afterAll(async () => {
  await marek.patch('/api/garage/settings', {
    labourRateMinor: original.labourRateMinor, taxRateBp: original.taxRateBp, quoteValidityDays: original.quoteValidityDays,
    quoteTerms: original.quoteTerms, markupRules: original.markupRules, techniciansSeePrices: original.techniciansSeePrices,
  })
  await marek.del('/api/garage/logo')
})

describe('garage settings', () => {
  it('a manager reads them with the installation currency and the shared technicians flag', async () => {
    expect(original).toMatchObject({ organisationName: 'Tannery Yard Autos', currency: 'GBP', techniciansSeePrices: true, taxRateBp: 2000 })
  })

  it('saves labour rate, markup bands, tax, validity and terms; new lines use them', async () => {
    const r = await marek.patch('/api/garage/settings', {
      labourRateMinor: 7_250, taxRateBp: 0, quoteValidityDays: 14, quoteTerms: 'Pay on collection.',
      markupRules: { mode: 'by_cost', bands: [{ upToMinor: 5_000, bp: 5_000 }, { upToMinor: null, bp: 2_000 }] },
    })
    expect(r.status, r.text).toBe(200)
    expect(r.body).toMatchObject({ labourRateMinor: 7_250, taxRateBp: 0, quoteValidityDays: 14, quoteTerms: 'Pay on collection.' })
    const cheap = await makePart({ listPriceMinor: 4_000, stock: { RVS: 3 }, prefix: 'QS' }) // Bronze: 5 % off -> 38.00
    const dear = await makePart({ listPriceMinor: 10_000, stock: { RVS: 3 }, prefix: 'QS' }) // -> 95.00
    const { quote } = await startQuote(marek)
    await marek.post(`/api/quotes/${quote.id}/lines`, { kind: 'part', sku: cheap.sku })
    await marek.post(`/api/quotes/${quote.id}/lines`, { kind: 'part', sku: dear.sku })
    const last = await marek.post(`/api/quotes/${quote.id}/lines`, { kind: 'labour', description: 'Fit', hours: 2 })
    const [a, b, lab] = last.body.lines
    // 40.00 x 0.95 = 38.00, up to 50.00: +50 % = 57.00; 100.00 x 0.95 = 95.00, dearer: +20 % = 114.00 (worked by hand)
    expect(a).toMatchObject({ unitNetMinor: 3_800, markupBp: 5_000, unitPriceMinor: 5_700, taxBp: 0, taxMinor: 0 })
    expect(b).toMatchObject({ unitNetMinor: 9_500, markupBp: 2_000, unitPriceMinor: 11_400 })
    expect(lab).toMatchObject({ rateMinor: 7_250, amountMinor: 14_500 })
    expect(last.body.totals).toEqual({ netMinor: 5_700 + 11_400 + 14_500, taxMinor: 0, grossMinor: 5_700 + 11_400 + 14_500 })
  })

  it('refuses bad values by name and keeps the old ones', async () => {
    const r = await marek.patch('/api/garage/settings', {
      labourRateMinor: -5, taxRateBp: 10_001, quoteValidityDays: 0,
      markupRules: { mode: 'by_cost', bands: [{ upToMinor: 100, bp: 10 }] },
    })
    expect(r.status).toBe(422)
    expect(Object.keys(r.body.data.fields)).toEqual(expect.arrayContaining(['labourRateMinor', 'taxRateBp', 'quoteValidityDays', 'markupRules.bands']))
    expect((await marek.get('/api/garage/settings')).body.labourRateMinor).toBe(7_250)
    expect((await marek.patch('/api/garage/settings', { currency: 'EUR' })).status).toBe(422)
  })

  it('the technicians flag decides whether technicians see trade prices on quotes', async () => {
    const { quote } = await startQuote(ada)
    const part = await makePart({ listPriceMinor: 2_000, stock: { RVS: 1 }, prefix: 'QS' })
    await ada.post(`/api/quotes/${quote.id}/lines`, { kind: 'part', sku: part.sku })
    expect((await ada.get(`/api/quotes/${quote.id}`)).body.lines[0].unitNetMinor).toBe(1_900)
    const off = await marek.patch('/api/garage/settings', { techniciansSeePrices: false })
    expect(off.status).toBe(200)
    expect(off.body.techniciansSeePrices).toBe(false)
    expect((await ada.get(`/api/quotes/${quote.id}`)).body.lines[0]).toMatchObject({ unitNetMinor: null, markupBp: null })
    expect((await marek.patch('/api/garage/settings', { techniciansSeePrices: true })).status).toBe(200)
    expect((await ada.get(`/api/quotes/${quote.id}`)).body.showsTradePrices).toBe(true)
  })
})

describe('the logo', () => {
  it('takes a PNG and serves it to the garage\'s own people, inert (nosniff, no script)', async () => {
    const r = await upload(marek, 'logo.png', 'image/png', PNG)
    expect(r.status, r.text).toBe(200)
    expect(r.body.logo).toMatchObject({ mime: 'image/png' })
    const got = await ada.get('/api/garage/logo')
    expect(got.status).toBe(200)
    expect(got.headers.get('content-type')).toBe('image/png')
    expect(got.headers.get('x-content-type-options')).toBe('nosniff')
    expect(got.headers.get('content-security-policy')).toContain("default-src 'none'")
    // Millbrook has no logo: it never gets Tannery Yard's
    expect((await hattie.get('/api/garage/logo')).status).toBe(404)
    expect((await new Client().get('/api/garage/logo')).status).toBe(401)
  })

  it('takes a drawing-only SVG and refuses SVGs that script, embed HTML or reach outside', async () => {
    expect((await upload(marek, 'logo.svg', 'image/svg+xml', SVG_OK)).status).toBe(200)
    const bad = [
      '<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>',
      '<svg xmlns="http://www.w3.org/2000/svg" onload="alert(1)"><rect width="1" height="1"/></svg>',
      '<svg xmlns="http://www.w3.org/2000/svg"><foreignObject><p>hi</p></foreignObject></svg>',
      '<svg xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink"><image xlink:href="http://elsewhere.test/x.png"/></svg>',
      '<!DOCTYPE svg [<!ENTITY x SYSTEM "file:///etc/passwd">]><svg xmlns="http://www.w3.org/2000/svg"><text>&x;</text></svg>',
      '<svg xmlns="http://www.w3.org/2000/svg"><style>@import url(http://elsewhere.test/a.css);</style></svg>',
    ]
    for (const svg of bad) {
      const r = await upload(marek, 'logo.svg', 'image/svg+xml', svg)
      expect(r.status, svg).toBe(415)
      expect(r.body.data.fields.logo).toBeTruthy()
    }
    // the drawing-only one is still the logo
    expect((await marek.get('/api/garage/settings')).body.logo.mime).toBe('image/svg+xml')
  })

  it('refuses other types by their bytes, files of 2 MB or more, and non-multipart bodies', async () => {
    const gif = Buffer.from('R0lGODlhAQABAIAAAAAAAP///yH5BAEAAAAALAAAAAABAAEAAAIBRAA7', 'base64')
    expect((await upload(marek, 'logo.png', 'image/png', gif)).status).toBe(415)
    expect((await upload(marek, 'logo.png', 'image/png', 'just text')).status).toBe(415)
    const big = Buffer.concat([PNG, Buffer.alloc(2 * 1024 * 1024)])
    expect((await upload(marek, 'logo.png', 'image/png', big)).status).toBe(413)
    const raw = await marek.request('/api/garage/logo', { method: 'POST', body: PNG, headers: { 'content-type': 'application/octet-stream' } })
    expect(raw.status).toBe(415)
    expect((await upload(ada, 'logo.png', 'image/png', PNG)).status).toBe(403)
    expect((await marek.get('/api/garage/settings')).body.logo.mime).toBe('image/svg+xml')
  })

  it('reaches the owner only through the link of one of the garage\'s quotes', async () => {
    const s = await startQuote(marek)
    await marek.post(`/api/quotes/${s.quote.id}/lines`, { kind: 'labour', description: 'Check', hours: 0.5 })
    const { token } = await sendAndReadLink(marek, s.quote.id, s.ownerEmail)
    const view = await new Client().get(`/api/quote-links/${token}`)
    expect(view.body.garage.hasLogo).toBe(true)
    const logo = await new Client().get(`/api/quote-links/${token}/logo`)
    expect(logo.status).toBe(200)
    expect(logo.headers.get('content-type')).toBe('image/svg+xml')
    expect(logo.headers.get('content-security-policy')).toContain('sandbox')
    expect((await new Client().get(`/api/quote-links/${'B'.repeat(43)}/logo`)).status).toBe(404)
  })
})
