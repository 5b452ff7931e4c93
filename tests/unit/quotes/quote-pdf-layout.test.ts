import { readFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'
import { renderQuotePdf } from '../../../server/services/quotes/pdf'
import type { OwnerQuoteLine, OwnerQuoteView } from '#shared/types/quotes'
import { describeOverlaps, overlaps, textBoxes } from '../../support/pdf-layout'

// The checks here read the PDF's own text positions back with pdf.js (an independent reader): no two pieces of
// text may be printed over each other, whatever the length of names, dates and descriptions.

const font = (f: string) => readFileSync(fileURLToPath(new URL(`../../../server/assets/fonts/${f}`, import.meta.url)))
const fonts = { regular: font('inter-latin-400-normal.woff'), bold: font('inter-latin-700-normal.woff') }

const LONG_NAME = 'Alexandrina Maximiliana Featherstonehaugh-Cholmondeley-Worthington'
const garage = { name: 'Harrowgate Lane Brake and Clutch Specialists Limited of Upper Wetherby', address: 'Unit 14, The Old Tannery Industrial Estate, Long Sutton Road', phone: '01632 960 418', email: 'workshop@harrowgate-lane-brakes.example', taxNumber: 'GB 123 4567 89' }

function line(id: number, over: Partial<OwnerQuoteLine> = {}): OwnerQuoteLine {
  return {
    id, kind: 'part', description: `Front brake disc pair, vented, 288 mm by 25 mm, with fitting kit and wear indicator lead ${id}`,
    quantity: 2, hours: null, unitPriceMinor: 123_456, amountMinor: 246_912, taxBp: 2000, taxMinor: 49_382, grossMinor: 296_294,
    taxIncluded: id % 3 === 0, taxShares: [{ taxBp: 2000, netMinor: 246_912, taxMinor: 49_382 }],
    recommendation: id % 2 ? 'required' : 'advised', reason: 'Measured 21.4 mm against a discard thickness of 22.0 mm on the outer face.',
    coreCharge: null, coreRefund: null, parentLineId: null, decidable: true, declinable: true, needsAcknowledgement: id % 2 === 1,
    declineStatement: null, declineAcknowledgement: null, ownerDecision: 'approved', photos: [], ...over,
  }
}

function decidedView(lines: number): OwnerQuoteView {
  const all = Array.from({ length: lines }, (_, i) => line(i + 1, i % 4 === 1 ? {
    ownerDecision: 'declined',
    declineAcknowledgement: {
      statement: `You are declining required safety work: ${line(i + 1).description}. Driving with brakes below their limits can lengthen stopping distances.`,
      signedName: LONG_NAME, signedAt: '2026-12-02T23:59:00Z', address: '2001:db8:85a3:0000:0000:8a2e:0370:7334',
    },
  } : {}))
  all.push(line(lines + 1, { kind: 'sundry', description: 'Child seat refitting', taxBp: 500, taxMinor: 12_346, grossMinor: 259_258, taxShares: [{ taxBp: 500, netMinor: 246_912, taxMinor: 12_346 }], recommendation: null }))
  return {
    state: 'decided', garage: { name: garage.name, phone: garage.phone, email: garage.email, hasLogo: false }, reference: 'Q-2026-000123', status: 'partly_approved',
    vehicle: 'Corvane Estra Tourer 2.0 turbo-diesel automatic (2015–2019)', registration: 'KX15 ABC', odometer: '184 210 mi', ownerName: LONG_NAME,
    sentAt: '2026-11-28T10:00:00Z', expiresAt: '2026-12-28T10:00:00Z', decidedAt: '2026-12-02T23:59:00Z', signedName: LONG_NAME,
    findings: [{ verdict: 'fail', text: 'Front left disc is 21.4 mm, under its minimum of 22.0 mm.' }],
    messageToOwner: 'We can fit the discs on Thursday if you approve by Wednesday noon.', terms: 'Payment on collection.',
    lines: all,
    totals: { netMinor: 98_765_432, taxMinor: 19_753_086, grossMinor: 118_518_518 },
    approvedTotals: { netMinor: 87_654_321, taxMinor: 17_530_864, grossMinor: 105_185_185 },
    taxByRate: [{ taxBp: 2000, netMinor: 98_518_520, taxMinor: 19_703_704 }, { taxBp: 500, netMinor: 246_912, taxMinor: 12_346 }],
    approvedTaxByRate: [{ taxBp: 2000, netMinor: 87_407_409, taxMinor: 17_481_482 }, { taxBp: 500, netMinor: 246_912, taxMinor: 12_346 }],
    decisionAddress: '2001:db8:85a3:0000:0000:8a2e:0370:7334', currency: 'GBP', taxLabel: 'Tax at 20 %',
  }
}

describe('the quote PDF lays out without overlapping text', () => {
  it.each([1, 6, 40])('a decided quote with %i lines, long names, long dates and two tax rates', async (n) => {
    const boxes = await textBoxes(await renderQuotePdf(decidedView(n), garage, fonts, null))
    expect(boxes.length).toBeGreaterThan(20)
    expect(describeOverlaps(overlaps(boxes))).toEqual([])
  })

  it('an open quote of one line', async () => {
    const v = decidedView(1)
    v.state = 'open'; v.status = 'sent'; v.decidedAt = null; v.signedName = null; v.approvedTotals = null; v.approvedTaxByRate = null
    for (const l of v.lines) { l.ownerDecision = null; l.declineAcknowledgement = null }
    const boxes = await textBoxes(await renderQuotePdf(v, garage, fonts, null))
    expect(describeOverlaps(overlaps(boxes))).toEqual([])
  })

  it('a decided quote names the approved figure as the one to pay, and the whole quote as quoted', async () => {
    const boxes = await textBoxes(await renderQuotePdf(decidedView(6), garage, fonts, null))
    const texts = boxes.map((b) => b.text)
    const toPay = texts.indexOf('Total to pay')
    expect(toPay).toBeGreaterThan(-1)
    // £1,051,851.85 is approvedTotals.grossMinor 105 185 185 pence written out; the whole quote's £1,185,185.18 is not "to pay"
    expect(texts[toPay + 1]).toBe('£1,051,851.85')
    expect(texts).toContain('Total quoted')
    expect(texts.filter((t) => t === 'Total to pay')).toHaveLength(1)
  })
})

describe('the overlap check itself', () => {
  it('finds text printed over text, and not text side by side or on the next line', async () => {
    const { default: PDFDocument } = await import('pdfkit')
    const doc = new PDFDocument({ font: fonts.regular as unknown as string })
    const chunks: Buffer[] = []
    doc.on('data', (c: Buffer) => chunks.push(c))
    const done = new Promise<Buffer>((resolve) => doc.on('end', () => resolve(Buffer.concat(chunks))))
    doc.fontSize(10).text('Approved by someone', 100, 100, { lineBreak: false })
    doc.text('Total', 130, 103, { lineBreak: false }) // 3 pt lower, over the first: an overlap
    doc.text('Beside', 300, 100, { lineBreak: false })
    doc.text('Next line', 100, 115, { lineBreak: false }) // 12 pt below the second line of 10 pt type: neighbours
    doc.end()
    const pairs = overlaps(await textBoxes(await done))
    expect(describeOverlaps(pairs)).toEqual(['page 1: "Approved by someone" over "Total"'])
  })
})
