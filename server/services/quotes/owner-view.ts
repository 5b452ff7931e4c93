/**
 * What the vehicle owner sees through the link: this quote and the garage's name and contact, nothing else
 * (no trade prices, markups, the owner's own contact details or the garage's ids). Lines and totals carry the
 * same figures as the garage's view and the PDF (one money rule), tax per rate included.
 */
import type { Transaction } from 'sequelize'
import { Organisation } from '../../models/accounts'
import type { Quote, QuoteLine } from '../../models/quotes'
import type { OwnerQuoteLine, OwnerQuoteView } from '../../../shared/types/quotes'
import { formatBp, type TotalsLine } from '../../../shared/utils/quote-totals'
import { declineStatement } from '../../../shared/utils/quote-declines'
import { ownerPartWords } from '../../../shared/utils/quote-wording'
import { acknowledgementOf, coreRefundOf } from './garage-view'
import { quoteReference } from './references'
import { hoursOf, iso, isDecidable, isDecided, linesOf, quoteFigures } from './rows'
import { settingsOf } from './settings'
import { photosForLines } from '../inspection-photos'

export async function ownerView(q: Quote, currency: string, t?: Transaction): Promise<OwnerQuoteView> {
  const [lines, org, settings] = await Promise.all([
    linesOf(q.id, t),
    Organisation.findByPk(q.organisationId, { attributes: ['id', 'name', 'phone', 'email'], transaction: t }),
    settingsOf(q.organisationId, t),
  ])
  const { status, lineOf, totals, approvedTotals, quoted, approved } = quoteFigures(q, lines)
  // a deposit's 0 % is not a rate the owner pays: name the one rate when there is one
  const photos = await photosForLines({ organisationId: q.organisationId, inspectionId: q.inspectionId ?? null }, lines, t)
  const rates = quoted.byRate.map((r) => r.taxBp).filter((bp) => bp > 0)
  return {
    state: status === 'superseded' ? 'superseded' : isDecided(status) ? 'decided' : 'open',
    garage: { name: org?.name ?? '', phone: org?.phone ?? '', email: org?.email ?? '', hasLogo: !!settings.logoFile },
    reference: quoteReference(q),
    status,
    vehicle: q.vehicleLabel ?? '',
    registration: q.registration ?? '',
    odometer: q.odometer ?? '',
    ownerName: q.ownerName,
    sentAt: iso(q.sentAt), expiresAt: iso(q.expiresAt), decidedAt: iso(q.decidedAt), signedName: q.signedName ?? null,
    decisionAddress: q.decisionIp ?? null,
    findings: q.findings ?? [],
    messageToOwner: q.messageToOwner ?? '',
    terms: settings.quoteTerms,
    lines: lines.map((l) => ({ ...ownerLine(l, lineOf(l)), photos: photos.get(l.id) ?? [] })),
    totals,
    approvedTotals,
    taxByRate: quoted.byRate,
    approvedTaxByRate: approved?.byRate ?? null,
    currency,
    taxLabel: rates.length === 1 ? `Tax at ${formatBp(rates[0]!)}` : 'Tax',
  }
}

/** One line for the owner: no trade price, markup or stock; for a required line, what declining it means. */
function ownerLine(l: QuoteLine, f: TotalsLine): Omit<OwnerQuoteLine, 'photos'> {
  const decidable = isDecidable(l)
  const needsAcknowledgement = decidable && l.recommendation === 'required'
  return {
    id: l.id, kind: l.kind, description: ownerPartWords(l.kind, l.description), quantity: l.quantity, hours: hoursOf(l),
    unitPriceMinor: l.unitPriceMinor, amountMinor: f.amountMinor, taxBp: f.taxBp, taxMinor: f.taxMinor, grossMinor: f.grossMinor,
    taxIncluded: !!l.taxIncluded, taxShares: f.shares,
    recommendation: l.recommendation ?? null, reason: l.reason ?? null, coreCharge: l.coreCharge ?? null, coreRefund: coreRefundOf(l),
    parentLineId: l.parentLineId ?? null,
    decidable,
    declinable: decidable,
    needsAcknowledgement,
    declineStatement: needsAcknowledgement ? declineStatement(l) : null,
    declineAcknowledgement: acknowledgementOf(l),
    ownerDecision: l.ownerDecision ?? null,
  }
}
