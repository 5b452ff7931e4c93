import { readFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'
// pdf-parse v1: the library entry (its index.js runs a self-test when imported directly)
import pdf from 'pdf-parse/lib/pdf-parse.js'
import PDFDocument from 'pdfkit'
import { renderQuotePdf } from '../../../server/services/quotes/pdf'
import { drawSvgLogo } from '../../../server/services/svg-to-pdf'
import { QUOTE_SAFETY_CAUTION } from '#shared/utils/quote-wording'
import type { OwnerQuoteView } from '#shared/types/quotes'

const font = (f: string) => readFileSync(fileURLToPath(new URL(`../../../server/assets/fonts/${f}`, import.meta.url)))
const fonts = { regular: font('inter-latin-400-normal.woff'), bold: font('inter-latin-700-normal.woff') }

/** pdf.js reads the Buffer's whole ArrayBuffer: hand it a copy that starts at byte 0 */
const text = async (b: Buffer) => (await pdf(Buffer.from(new Uint8Array(b)))).text.replace(/\s+/g, ' ')

function view(lines: number): OwnerQuoteView {
  return {
    state: 'open', garage: { name: 'Test Garage', phone: '', email: '', hasLogo: false }, reference: 'Q-0001', status: 'sent',
    vehicle: 'Corvane Estra 1.6 (2015–2019)', registration: 'KX15 ABC', odometer: '84 210 mi', ownerName: 'Jo Owner',
    sentAt: '2026-12-01T10:00:00Z', expiresAt: '2026-12-31T10:00:00Z', decidedAt: null, signedName: null,
    findings: [{ verdict: 'fail', text: 'Front left disc is 21.4 mm, under its minimum of 22.0 mm.' }],
    messageToOwner: '', terms: 'Payment on collection.',
    lines: Array.from({ length: lines }, (_, i) => ({
      id: i + 1, kind: 'part' as const, description: `Brake part number ${i + 1}`, quantity: 1, hours: null, unitPriceMinor: 1000,
      amountMinor: 1000, taxBp: 2000, taxMinor: 200, grossMinor: 1200, taxIncluded: false, taxShares: [{ taxBp: 2000, netMinor: 1000, taxMinor: 200 }],
      recommendation: i === 0 ? 'required' as const : null, reason: null, coreCharge: null, coreRefund: null, parentLineId: null,
      decidable: true, declinable: true, needsAcknowledgement: i === 0, declineStatement: null, declineAcknowledgement: null, ownerDecision: null, photos: [],
    })),
    totals: { netMinor: 1000 * lines, taxMinor: 200 * lines, grossMinor: 1200 * lines }, approvedTotals: null,
    taxByRate: [{ taxBp: 2000, netMinor: 1000 * lines, taxMinor: 200 * lines }], approvedTaxByRate: null, decisionAddress: null,
    currency: 'GBP', taxLabel: 'Tax at 20 %',
  }
}

describe('quote PDF', () => {
  it('holds the totals, the validity and the caution in the shipped font', async () => {
    const b = await renderQuotePdf(view(3), { name: 'Test Garage', address: '1 Road', phone: '', email: '', taxNumber: '' }, fonts, null)
    expect(b.subarray(0, 5).toString()).toBe('%PDF-')
    const t = await text(b)
    expect(t).toContain('£30.00')
    expect(t).toContain('£6.00')
    expect(t).toContain('£36.00')
    expect(t).toContain('Valid until 31 Dec 2026')
    expect(t).toContain(QUOTE_SAFETY_CAUTION.slice(0, 60))
    expect(b.toString('latin1')).toMatch(/FontFile2|FontFile3|Inter/) // the embedded typeface, not a standard PDF font
  })

  it('runs onto more pages for long quotes and numbers them', async () => {
    const b = await renderQuotePdf(view(80), { name: 'Test Garage', address: '', phone: '', email: '', taxNumber: '' }, fonts, null)
    const t = await text(b)
    expect(t).toMatch(/page 1 of [2-9]/)
    expect(t).toContain('£960.00')
  })
})

describe('tax per rate and the owner\'s decision in the PDF', () => {
  it('lists tax at each rate and, once decided, who signed, the approved totals and the declined safety work', async () => {
    const v = view(2)
    v.state = 'decided'
    v.status = 'partly_approved'
    v.signedName = 'Jo Owner'
    v.decidedAt = '2026-12-02T09:30:00Z'
    v.decisionAddress = '192.0.2.7'
    v.lines[0]!.ownerDecision = 'declined'
    v.lines[0]!.declineAcknowledgement = { statement: 'You are declining: Brake part number 1. What it means.', signedName: 'Jo Owner', signedAt: '2026-12-02T09:30:00Z', address: '192.0.2.7' }
    v.lines[1]!.ownerDecision = 'approved'
    v.lines.push({ ...v.lines[1]!, id: 3, kind: 'sundry', description: 'Child seat fitting', taxBp: 500, taxMinor: 50, grossMinor: 1050, taxShares: [{ taxBp: 500, netMinor: 1000, taxMinor: 50 }] })
    v.taxByRate = [{ taxBp: 2000, netMinor: 2000, taxMinor: 400 }, { taxBp: 500, netMinor: 1000, taxMinor: 50 }]
    v.totals = { netMinor: 3000, taxMinor: 450, grossMinor: 3450 }
    v.approvedTotals = { netMinor: 2000, taxMinor: 250, grossMinor: 2250 }
    v.approvedTaxByRate = [{ taxBp: 2000, netMinor: 1000, taxMinor: 200 }, { taxBp: 500, netMinor: 1000, taxMinor: 50 }]
    const t = await text(await renderQuotePdf(v, { name: 'Test Garage', address: '', phone: '', email: '', taxNumber: '' }, fonts, null))
    // the text layer runs a label into its figure
    expect(t).toContain('Tax at 20 % on £20.00£4.00')
    expect(t).toContain('Tax at 5 % on £10.00£0.50')
    expect(t).toContain('Total quoted£34.50')
    expect(t).toContain('Your decision')
    expect(t).toContain('Signed by Jo Owner on 2 Dec 2026, 09:30 from the internet address 192.0.2.7')
    expect(t).toContain('Total to pay£22.50')
    expect(t).toContain('Safety work declined')
    expect(t).toContain('Signed: Jo Owner, 2 Dec 2026, 09:30, from 192.0.2.7')
    expect(t).toContain('Declined: acknowledgement signed')
  })
})

describe('the logo in the PDF header', () => {
  const garage = { name: 'Test Garage', address: '', phone: '', email: '', taxNumber: '' }
  it('embeds a PNG logo as an image', async () => {
    const png = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==', 'base64')
    const b = await renderQuotePdf(view(1), garage, fonts, { data: png, mime: 'image/png' })
    expect(b.toString('latin1')).toContain('/Subtype /Image')
  })

  it('draws a drawing-only SVG as vector shapes, and gives up on what it cannot draw faithfully', () => {
    const doc = new PDFDocument({ font: fonts.regular as unknown as string })
    const shapes = '<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 10 10"><rect width="10" height="10" rx="2" fill="#123456"/><path d="M1 1L9 9" stroke="#fff"/><polygon points="1,9 5,1 9,9"/></svg>'
    expect(drawSvgLogo(doc, shapes, 0, 0, 100, 50)).toBe(true)
    expect(drawSvgLogo(doc, '<svg viewBox="0 0 10 10"><g transform="rotate(45)"><rect width="5" height="5"/></g></svg>', 0, 0, 100, 50)).toBe(false)
    expect(drawSvgLogo(doc, '<svg viewBox="0 0 10 10"><text>AB</text></svg>', 0, 0, 100, 50)).toBe(false)
    expect(drawSvgLogo(doc, '<svg viewBox="0 0 10 10"><rect width="5" height="5" fill="url(#g)"/></svg>', 0, 0, 100, 50)).toBe(false)
    doc.end()
  })
})
