/**
 * Parts of the quote's PDF that carry the money and the decision: each line's labels (recommendation, how a
 * core deposit is carried, the owner's choice), the totals with tax per rate, and the owner's decision: who
 * signed, when and from where, the approved totals, and each line marked required that the owner declined with
 * the statement they were shown and signed.
 */
import type { Formats } from '../../../shared/utils/format'
import { formatBp, type RateShare } from '../../../shared/utils/quote-totals'
import { RECOMMENDATION_WORDS } from '../../../shared/utils/quote-wording'
import type { OwnerQuoteLine, OwnerQuoteView } from '../../../shared/types/quotes'
import { PDF_COLOURS, type PdfPage } from '../pdf/document'

const { ink: INK, soft: SOFT, fail: FAIL } = PDF_COLOURS

/** How a core deposit is carried, in the owner's words. */
export function depositWords(l: Pick<OwnerQuoteLine, 'coreCharge' | 'coreRefund'>, money: Formats['money'], day: Formats['day']): string {
  if (l.coreCharge === 'absorbed') return 'Deposit carried by the garage: nothing for you to pay'
  if (l.coreRefund) return `Refund of ${money(l.coreRefund.amountMinor)} due to you: the supplier accepted the old unit on ${day(l.coreRefund.recordedAt)}`
  return 'Refundable deposit: refunded to you only if our supplier accepts the old unit back'
}

/** The small labels under a line's description. */
export function lineLabels(l: OwnerQuoteLine, decided: boolean, money: Formats['money'], day: Formats['day']): string[] {
  const labels: string[] = []
  if (l.recommendation) labels.push(RECOMMENDATION_WORDS[l.recommendation])
  if (l.kind === 'core_deposit') labels.push(depositWords(l, money, day))
  if (decided && l.decidable) labels.push(l.ownerDecision === 'approved' ? 'Approved' : l.declineAcknowledgement ? 'Declined: acknowledgement signed' : 'Declined')
  return labels
}

function rateRows(page: PdfPage, rates: RateShare[], money: Formats['money'], label = 'Tax'): void {
  for (const r of rates) page.totalRow(`${label} at ${formatBp(r.taxBp)} on ${money(r.netMinor)}`, money(r.taxMinor))
}

/** Totals as quoted: before tax, the tax at each rate, and what there is to pay (or, once decided, what was quoted). */
export function drawTotals(page: PdfPage, view: OwnerQuoteView, money: Formats['money']): void {
  page.doc.moveDown(0.6)
  page.totalRow('Total before tax', money(view.totals.netMinor))
  rateRows(page, view.taxByRate, money)
  if (view.taxByRate.length !== 1) page.totalRow('Tax', money(view.totals.taxMinor))
  // once the owner has decided, what there is to pay is the approved total (drawDecision), not the whole quote
  if (view.state === 'decided' && view.approvedTotals) page.totalRow('Total quoted', money(view.totals.grossMinor))
  else page.totalRow('Total to pay', money(view.totals.grossMinor), true)
}

/** The owner's decision, once made: signature, approved totals, and declined safety work with its acknowledgement. */
export function drawDecision(page: PdfPage, view: OwnerQuoteView, f: Formats): void {
  if (view.state !== 'decided' || !view.approvedTotals) return
  const { doc, left, width, heading, totalRow } = page
  const { money, moment, counted } = f
  heading('Your decision')
  const offered = view.lines.filter((l) => l.decidable)
  doc.font('body').fontSize(9.5).fillColor(INK).text(
    `Signed by ${view.signedName ?? view.ownerName} on ${moment(view.decidedAt)}${view.decisionAddress ? ` from the internet address ${view.decisionAddress}` : ''}: `
    + `${offered.filter((l) => l.ownerDecision === 'approved').length} of ${counted(offered.length, 'line', 'lines')} approved.`,
    left, doc.y, { width },
  )
  doc.moveDown(0.4)
  totalRow('Approved before tax', money(view.approvedTotals.netMinor))
  rateRows(page, view.approvedTaxByRate ?? [], money, 'Tax')
  totalRow('Total to pay', money(view.approvedTotals.grossMinor), true)
  const declined = view.lines.filter((l) => l.declineAcknowledgement)
  if (!declined.length) return
  heading('Safety work declined')
  for (const l of declined) {
    const ack = l.declineAcknowledgement!
    page.ensure(90)
    doc.font('bold').fontSize(9.5).fillColor(FAIL).text(l.description, left, doc.y, { width })
    doc.font('body').fontSize(8.5).fillColor(INK).text(ack.statement, left, doc.y, { width })
    doc.font('bold').fontSize(8.5).fillColor(INK).text(`Signed: ${ack.signedName}, ${moment(ack.signedAt)}${ack.address ? `, from ${ack.address}` : ''}`, left, doc.y, { width })
    doc.font('body').fillColor(SOFT).moveDown(0.5)
  }
}
