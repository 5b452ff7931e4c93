/**
 * What the vehicle owner sees through the link: this quote and the garage's name and contact, nothing else
 * (no trade prices, markups, the owner's own contact details or the garage's ids).
 */
import type { Transaction } from 'sequelize'
import { Organisation } from '../../models/accounts'
import type { Quote } from '../../models/quotes'
import type { OwnerQuoteView } from '../../../shared/types/quotes'
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
  const { status, taxOf, totals, approvedTotals } = quoteFigures(q, lines)
  const photos = await photosForLines({ organisationId: q.organisationId, inspectionId: q.inspectionId ?? null }, lines, t)
  const rates = [...new Set(lines.map((l) => l.taxBp))]
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
    findings: q.findings ?? [],
    messageToOwner: q.messageToOwner ?? '',
    terms: settings.quoteTerms,
    lines: lines.map((l) => ({
      id: l.id, kind: l.kind, description: l.description, quantity: l.quantity, hours: hoursOf(l),
      unitPriceMinor: l.unitPriceMinor, amountMinor: l.amountMinor, taxBp: l.taxBp, taxMinor: taxOf.get(l.id) ?? 0,
      recommendation: l.recommendation ?? null, reason: l.reason ?? null, coreCharge: l.coreCharge ?? null,
      parentLineId: l.parentLineId ?? null,
      decidable: isDecidable(l),
      declinable: isDecidable(l) && !(l.recommendation === 'required' && !l.toldOwnerDeclinedRequired),
      ownerDecision: l.ownerDecision ?? null,
      photos: photos.get(l.id) ?? [],
    })),
    totals,
    approvedTotals,
    currency,
    taxLabel: rates.length === 1 ? `Tax at ${rates[0]! / 100} %` : 'Tax',
  }
}
