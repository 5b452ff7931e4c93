/**
 * The quote as a PDF: from the garage's route and attached to the owner's e-mail, in the shipped typeface, with
 * the vehicle, the lines, the tax and totals the API states, the validity and the safety caution.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
// pdf-parse v1's library entry (its index.js runs a self-test when imported)
import pdf from 'pdf-parse/lib/pdf-parse.js'
import { type Client, as, env, people } from '../support/api'
import { sendAndReadLink, startQuote } from '../support/quotes'
import { makePart } from '../support/orders'
import { QUOTE_SAFETY_CAUTION } from '#shared/utils/quote-wording'
import { formatMinor } from '#shared/utils/money'

await setup({ host: env().baseUrl })

/** pdf.js reads the Buffer's whole ArrayBuffer: give it bytes that start at 0 */
const textOf = async (bytes: Buffer) => (await pdf(Buffer.from(new Uint8Array(bytes)))).text.replace(/\s+/g, ' ')
// formatted the way people read them (ECMA-402 Intl, en-GB, GBP)
const gbp = (m: number) => formatMinor(m, 'GBP', 'en-GB')

let manager: Client, tech: Client, other: Client
let quote: { id: number; reference: string; totals: { netMinor: number; taxMinor: number; grossMinor: number } }
let owner: string

beforeAll(async () => {
  ;[manager, tech, other] = await Promise.all([as(people.manager), as(people.technician), as(people.otherManager)])
  const part = await makePart({ listPriceMinor: 7_777, coreDepositMinor: 2_500, stock: { NGT: 4 }, prefix: 'QF' })
  const s = await startQuote(tech, { registration: 'PD12 FTX' })
  owner = s.ownerEmail
  await tech.post(`/api/quotes/${s.quote.id}/lines`, { kind: 'part', sku: part.sku, quantity: 1, recommendation: 'required' })
  await tech.post(`/api/quotes/${s.quote.id}/lines`, { kind: 'labour', description: 'Fit caliper and bleed the brakes', hours: 1.5 })
  quote = (await manager.post(`/api/quotes/${s.quote.id}/lines`, { kind: 'discount', description: 'Winter offer', amountMinor: 500 })).body
})

describe('GET /api/quotes/:id/pdf', () => {
  it('is a PDF with the totals, the lines, the validity note and the caution', async () => {
    const r = await fetch(new URL(`/api/quotes/${quote.id}/pdf`, env().baseUrl), { headers: { cookie: tech.cookieHeader() } })
    expect(r.status).toBe(200)
    expect(r.headers.get('content-type')).toBe('application/pdf')
    expect(r.headers.get('content-disposition')).toMatch(/^attachment; filename="quote-q-\d{4}\.pdf"$/)
    expect(r.headers.get('x-content-type-options')).toBe('nosniff')
    const bytes = Buffer.from(await r.arrayBuffer())
    expect(bytes.subarray(0, 5).toString()).toBe('%PDF-')
    const text = await textOf(bytes)
    expect(text).toContain('Millbrook Motor Works')
    expect(text).toContain('PD12 FTX')
    expect(text).toContain('Fit caliper and bleed the brakes')
    expect(text).toContain('Fix now')
    // the garage carries the core deposit unless it passes it on
    expect(text).toContain('Deposit carried by the garage')
    expect(text).toContain(gbp(quote.totals.netMinor))
    expect(text).toContain(gbp(quote.totals.taxMinor))
    expect(text).toContain(gbp(quote.totals.grossMinor))
    expect(text).toContain('Safety caution')
    expect(text).toContain(QUOTE_SAFETY_CAUTION.slice(0, 80).replace(/\s+/g, ' '))
    // trade prices never appear on the owner's document
    expect(text).not.toMatch(/markup|net each/i)
    // the typeface is embedded (Inter), not a standard PDF font
    expect(bytes.toString('latin1')).toMatch(/\/FontFile[23]? /)
    expect(bytes.toString('latin1')).not.toContain('/BaseFont /Helvetica')
  })

  it('is 404 for another garage', async () => {
    expect((await other.get(`/api/quotes/${quote.id}/pdf`)).status).toBe(404)
  })
})

describe('the owner\'s e-mail', () => {
  it('carries the same PDF with the validity date, and the owner can download it from the link too', async () => {
    const { token, mail, body } = await sendAndReadLink(manager, quote.id, owner)
    const attached = Buffer.from(mail.attachments[0]!.contentBase64, 'base64')
    const text = await textOf(attached)
    expect(text).toContain(gbp(quote.totals.grossMinor))
    const until = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeZone: 'Europe/London' }).format(new Date(body.expiresAt))
    expect(text).toContain(`Valid until ${until}`)
    expect(mail.text).toContain(until)
    expect(mail.text).toContain(QUOTE_SAFETY_CAUTION.slice(0, 40))
    const r = await fetch(new URL(`/api/quote-links/${token}/pdf`, env().baseUrl))
    expect(r.status).toBe(200)
    expect(await textOf(Buffer.from(await r.arrayBuffer()))).toContain(gbp(quote.totals.grossMinor))
  })
})
