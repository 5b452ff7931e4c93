/**
 * The quote as the garage's own people see it: every line with stock at the home branch (and where else has
 * enough when it is short), the owner's signed acknowledgement on a declined required line, a core deposit's
 * refund due to the owner, warnings, totals and tax per rate, the revision history; trade prices and markups
 * only for those who may see them (managers; technicians when their garage allows).
 */
import { Op, type Transaction } from 'sequelize'
import { Branch, User, type Organisation } from '../../models/accounts'
import { StockLevel } from '../../models/catalogue'
import { Quote, type QuoteLine } from '../../models/quotes'
import { vehicleLabel } from '../inspections'
import { can } from '../../../shared/utils/abilities'
import { effectiveQuoteStatus } from '../../../shared/utils/quote-states'
import type { CoreRefundNote, DeclineAcknowledgement, QuoteDetail, QuoteLineView, QuoteSummary, StockNote } from '../../../shared/types/quotes'
import type { TotalsLine } from '../../../shared/utils/quote-totals'
import type { Role } from '../../../shared/types/accounts'
import { quoteReference } from './references'
import { hoursOf, iso, linesOf, quoteFigures } from './rows'
import { settingsOf } from './settings'

export interface Viewer { role: Role; org: Organisation }

/** Managers see trade prices and markups; technicians only when their garage allows it. */
export function seesTradePrices(role: Role, org: Pick<Organisation, 'techniciansSeePrices'>): boolean {
  return can(role, 'quotes.price') || (role === 'garage_technician' && !!org.techniciansSeePrices)
}

/** Stock of the quote's parts at the garage's home branch, and elsewhere when that is short. */
export async function stockNotes(lines: QuoteLine[], org: Pick<Organisation, 'homeBranchId'>, t?: Transaction): Promise<Map<number, StockNote>> {
  const out = new Map<number, StockNote>()
  const partLines = lines.filter((l) => l.kind === 'part' && l.partId)
  if (!partLines.length) return out
  const partIds = [...new Set(partLines.map((l) => l.partId!))]
  const [levels, branches] = await Promise.all([
    StockLevel.findAll({ where: { partId: { [Op.in]: partIds } }, transaction: t }),
    Branch.findAll({ order: [['id', 'ASC']], transaction: t }),
  ])
  const home = branches.find((b) => b.id === org.homeBranchId) ?? branches[0]
  if (!home) return out
  const needed = new Map<number, number>()
  for (const l of partLines) needed.set(l.partId!, (needed.get(l.partId!) ?? 0) + l.quantity)
  const qty = (partId: number, branchId: number) => levels.find((s) => s.partId === partId && s.branchId === branchId)?.quantity ?? 0
  for (const l of partLines) {
    const need = needed.get(l.partId!)!
    const atHome = qty(l.partId!, home.id)
    const short = atHome < need
    out.set(l.id, {
      branchCode: home.code, branchName: home.name, quantity: atHome, short,
      elsewhere: short
        ? branches.filter((b) => b.id !== home.id && qty(l.partId!, b.id) >= need)
          .map((b) => ({ branchCode: b.code, branchName: b.name, quantity: qty(l.partId!, b.id) }))
        : [],
    })
  }
  return out
}

/** What the owner signed when declining a required line, as stored on it. */
export function acknowledgementOf(l: QuoteLine): DeclineAcknowledgement | null {
  if (!l.declineSignedName || !l.declineSignedAt) return null
  return { statement: l.declineStatement ?? '', signedName: l.declineSignedName, signedAt: iso(l.declineSignedAt)!, address: l.declineAddress ?? null }
}

/** The refund due to the owner on a passed-on core deposit, once the distributor accepted the old unit. */
export function coreRefundOf(l: QuoteLine): CoreRefundNote | null {
  return l.coreRefundMinor > 0 && l.coreRefundRecordedAt ? { amountMinor: l.coreRefundMinor, recordedAt: iso(l.coreRefundRecordedAt)! } : null
}

export function lineView(l: QuoteLine, showTrade: boolean, stock: StockNote | null, figures: TotalsLine): QuoteLineView {
  return {
    id: l.id, fitOverride: l.fitOverrideReason ?? null, labourOperation: l.labourOperation ?? null,
    guideHours: l.guideHundredths == null ? null : l.guideHundredths / 100, position: l.position, kind: l.kind, partId: l.partId ?? null, sku: l.sku ?? null, partType: l.partType ?? null,
    description: l.description, quantity: l.quantity, hours: hoursOf(l), rateMinor: l.rateMinor ?? null,
    unitNetMinor: showTrade ? (l.unitNetMinor ?? null) : null,
    markupBp: showTrade ? (l.markupBp ?? null) : null,
    unitPriceMinor: l.unitPriceMinor, amountMinor: figures.amountMinor, taxBp: figures.taxBp, taxMinor: figures.taxMinor,
    grossMinor: figures.grossMinor, taxIncluded: !!l.taxIncluded, taxShares: figures.shares,
    recommendation: l.recommendation ?? null, reason: l.reason ?? null, coreCharge: l.coreCharge ?? null, coreRefund: coreRefundOf(l),
    parentLineId: l.parentLineId ?? null, ownerDecision: l.ownerDecision ?? null,
    toldOwnerDeclinedRequired: !!l.toldOwnerDeclinedRequired, declineAcknowledgement: acknowledgementOf(l), stock,
  }
}

export function quoteSummary(q: Quote, grossMinor: number, lines: QuoteLine[]): QuoteSummary {
  return {
    id: q.id, reference: quoteReference(q), number: q.number, revision: q.revision,
    status: effectiveQuoteStatus(q.status, q.expiresAt ?? null),
    vehicle: q.vehicleLabel || (q.vehicle ? vehicleLabel(q.vehicle) : ''),
    registration: q.registration ?? '', ownerName: q.ownerName, grossMinor,
    declinedRequired: lines.filter((l) => l.ownerDecision === 'declined' && l.recommendation === 'required').length,
    sentAt: iso(q.sentAt), expiresAt: iso(q.expiresAt), decidedAt: iso(q.decidedAt),
    createdAt: iso(q.createdAt)!, updatedAt: iso(q.updatedAt)!,
  }
}

/** What the garage should look at before sending: short stock, unpriced labour and sundries, capped discounts. */
function warningsFor(lines: QuoteLine[], stock: Map<number, StockNote>, discountCapped: boolean): string[] {
  const warnings: string[] = []
  for (const l of lines) {
    const s = stock.get(l.id)
    if (s?.short) {
      const alt = s.elsewhere.map((e) => `${e.branchName} has ${e.quantity}`).join(', ')
      warnings.push(`${l.sku}: ${s.quantity} on the shelf at ${s.branchName}, the quote needs ${l.quantity}${alt ? ` (${alt})` : ' and no branch has enough'}.`)
    }
    if (l.kind === 'labour' && !l.rateMinor) warnings.push(`"${l.description}" has no labour rate: set one in the garage settings or on the line.`)
    if (l.kind === 'sundry' && !l.amountMinor) warnings.push(`"${l.description}" has no price yet.`)
    if (l.fitOverrideReason) warnings.push(`${l.sku} does not fit this vehicle by the catalogue; put on by a manager: ${l.fitOverrideReason}`)
    if (l.kind === 'labour' && l.guideHundredths != null && l.guideHundredths !== l.hoursHundredths) {
      warnings.push(`"${l.description}": ${(l.hoursHundredths ?? 0) / 100} h against the labour guide's ${l.guideHundredths / 100} h.`)
    }
  }
  if (discountCapped) warnings.push('The discounts are larger than the rest of the quote; only part of them counts.')
  return warnings
}

/** The full quote for the garage's own people. */
export async function quoteDetail(q: Quote, viewer: Viewer, currency: string, t?: Transaction): Promise<QuoteDetail> {
  const lines = await linesOf(q.id, t)
  const showTrade = seesTradePrices(viewer.role, viewer.org)
  const figures = quoteFigures(q, lines)
  const [stock, revisions, successor, author, settings] = await Promise.all([
    stockNotes(lines, viewer.org, t),
    Quote.findAll({ where: { organisationId: q.organisationId, number: q.number }, attributes: ['id', 'revision', 'status', 'expiresAt', 'createdAt'], order: [['revision', 'ASC']], transaction: t }),
    Quote.findOne({ where: { supersedesQuoteId: q.id }, attributes: ['id'], transaction: t }),
    User.findByPk(q.createdByUserId, { attributes: ['id', 'name'], transaction: t }),
    settingsOf(q.organisationId, t),
  ])
  return {
    ...quoteSummary(q, figures.quoted.grossMinor, lines),
    status: figures.status,
    vehicleId: q.vehicleId ?? null,
    odometer: q.odometer ?? '',
    ownerEmail: q.ownerEmail,
    ownerPhone: q.ownerPhone ?? '',
    inspectionId: q.inspectionId ?? null,
    findings: q.findings ?? [],
    messageToOwner: q.messageToOwner ?? '',
    supersedesQuoteId: q.supersedesQuoteId ?? null,
    supersededByQuoteId: successor?.id ?? null,
    decisionIp: q.decisionIp ?? null,
    signedName: q.signedName ?? null,
    createdBy: author?.name ?? '',
    lines: lines.map((l) => lineView(l, showTrade, stock.get(l.id) ?? null, figures.lineOf(l))),
    totals: figures.totals,
    approvedTotals: figures.approvedTotals,
    taxByRate: figures.quoted.byRate,
    approvedTaxByRate: figures.approved?.byRate ?? null,
    revisions: revisions.map((r) => ({ id: r.id, revision: r.revision, status: effectiveQuoteStatus(r.status, r.expiresAt ?? null), createdAt: iso(r.createdAt)! })),
    currency,
    pricesIncludeTax: settings.pricesIncludeTax,
    showsTradePrices: showTrade,
    warnings: warningsFor(lines, stock, figures.quoted.discountCapped),
  }
}
