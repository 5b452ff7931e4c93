/**
 * The job card as a PDF for the ramp: the approved work by wheel, what the owner declined (not to be done), the
 * torque figures, fluid grade and capacity, the bleeding sequence, the checks with boxes, and the sign-off.
 */
import type { JobCardView } from '../../../shared/types/jobs'
import type { Formats } from '../../../shared/utils/format'
import { BLEEDING_SIDE_UNKNOWN } from '../../../shared/utils/jobs/bleeding'
import { newPdf, PDF_COLOURS, type PdfFonts } from '../pdf/document'
import { drawLetterhead, type PdfGarage, type PdfLogo } from '../pdf/letterhead'

export function renderJobCardPdf(card: JobCardView, garage: PdfGarage, logo: PdfLogo | null, fonts: PdfFonts, formats: Formats): Promise<Buffer> {
  const page = newPdf(fonts, { title: `Job card ${card.reference}`, author: garage.name, subject: card.vehicle })
  const { doc, left, width, ensure, heading } = page
  const text = (s: string, colour: string = PDF_COLOURS.ink, size = 9.5, indent = 0) => {
    ensure(16)
    doc.font('body').fontSize(size).fillColor(colour).text(s, left + indent, doc.y, { width: width - indent })
  }
  // a box to tick by hand, ticked when done (drawn: the typeface has no box characters)
  const boxed = (s: string, done: boolean) => {
    ensure(16)
    const y = doc.y + 1.5
    doc.rect(left, y, 8, 8).lineWidth(0.7).strokeColor(PDF_COLOURS.ink).stroke()
    if (done) doc.moveTo(left + 1.5, y + 4).lineTo(left + 3.5, y + 6.5).lineTo(left + 7, y + 1.5).lineWidth(1.2).stroke()
    text(s, PDF_COLOURS.ink, 9.5, 14)
  }
  drawLetterhead(page, garage, logo, 'Job card', [card.reference, card.registration, card.odometerAtQuote ? `In at ${card.odometerAtQuote}` : ''].filter(Boolean))
  text(card.vehicle)

  for (const g of card.groups) {
    heading(g.label)
    for (const l of g.lines) {
      boxed(`${l.description}${l.sku ? `  (${l.sku})` : ''}  ·  ${l.hours != null ? `${l.hours} h` : `× ${l.quantity}`}`, false)
      if (l.reason) text(l.reason, PDF_COLOURS.soft, 8, 14)
    }
  }
  if (card.declined.length) {
    heading('Declined by the owner: do not fit')
    for (const l of card.declined) text(`${l.description}${l.sku ? `  (${l.sku})` : ''}  ·  declined by the owner`, PDF_COLOURS.fail)
  }

  heading('Figures for this vehicle')
  for (const tq of card.torques) text(`${tq.what}: ${tq.nm} N·m`)
  text(`Brake fluid: ${card.fluid.grade || 'as the maker specifies'}${card.fluid.capacityMl ? `, system capacity about ${(card.fluid.capacityMl / 1000).toFixed(1)} l` : ''}`)

  heading('Bleeding sequence')
  if (card.circuitSplitLabel) text(`Circuits: ${card.circuitSplitLabel}${card.steeringSide ? `; ${card.steeringSide}-hand drive, so the master cylinder is on the ${card.steeringSide}` : ''}`, PDF_COLOURS.soft, 8.5)
  if (!card.bleedingSequence.length) text(BLEEDING_SIDE_UNKNOWN)
  card.bleedingSequence.forEach((w, i) => text(`${i + 1}.  ${w[0]!.toUpperCase()}${w.slice(1)}`))

  heading('Checks before the car goes back')
  for (const c of card.checks) boxed(c.label, c.done)

  heading('Sign-off')
  if (card.signedOff) text(`Signed off by ${card.signedOff.by} on ${formats.moment(card.signedOff.at)}${card.signedOff.odometer != null ? ` at ${formats.count(card.signedOff.odometer)} ${card.odometerUnit} on the odometer` : ''}.`)
  else text('Technician: ____________________   Time: __________   Odometer: __________')
  doc.moveDown(0.6)
  text(card.caution, PDF_COLOURS.soft, 8)
  return page.finish(`${garage.name} · Job card ${card.reference}`)
}
