/**
 * Which quote a change applies to. A draft changes in place; a quote that has left draft is never changed: the
 * change goes into a new revision (same number, revision + 1, lines copied without the owner's decisions or
 * their signed acknowledgements) and the old one is kept as superseded, so its link stops offering a choice.
 * Superseded revisions are final.
 */
import type { Transaction } from 'sequelize'
import type { Organisation } from '../../models/accounts'
import { Quote, QuoteLine } from '../../models/quotes'
import { withWrite } from '../../utils/db'
import { audit } from '../../utils/audit'
import { effectiveQuoteStatus, nextQuoteStatus, quoteEditMode } from '../../../shared/utils/quote-states'
import type { Role } from '../../../shared/types/accounts'
import { conflict } from '../errors'
import { linesOf } from './rows'

/** Who makes a change: one of the garage's people (the session's user and organisation). */
export interface QuoteActor { user: { id: number; role: Role }; org: Organisation }

export interface EditableQuote {
  quote: Quote
  /** old line id -> new line id when a revision was made */
  lineIds: Map<number, number> | null
}

/** A new draft revision of a quote that has left draft; returns it with old line id -> new line id. */
export async function reviseQuote(t: Transaction, old: Quote, actorUserId: number): Promise<{ quote: Quote; lineIds: Map<number, number> }> {
  const status = effectiveQuoteStatus(old.status, old.expiresAt ?? null)
  if (nextQuoteStatus(status, 'supersede') !== 'superseded') {
    throw conflict(status === 'superseded'
      ? 'This revision has been replaced: change the latest one.'
      : 'A draft is changed as it is; it needs no new revision.')
  }
  const [changed] = await Quote.update({ status: 'superseded' }, { where: { id: old.id, status: old.status }, transaction: t })
  if (changed !== 1) throw conflict('The quote changed meanwhile. Reload it and try again.')
  const quote = await Quote.create({
    organisationId: old.organisationId, number: old.number, revision: old.revision + 1, supersedesQuoteId: old.id,
    status: 'draft', vehicleId: old.vehicleId, vehicleLabel: old.vehicleLabel, registration: old.registration, odometer: old.odometer,
    ownerName: old.ownerName, ownerEmail: old.ownerEmail, ownerPhone: old.ownerPhone, inspectionId: old.inspectionId, garageVehicleId: old.garageVehicleId,
    findings: old.findings, messageToOwner: old.messageToOwner, createdByUserId: actorUserId,
  }, { transaction: t })
  const lineIds = new Map<number, number>()
  const oldLines = await linesOf(old.id, t)
  const rateOf = new Map(oldLines.map((l) => [l.id, l.taxBp]))
  for (const l of oldLines) { // parents come before their core deposits
    const copy = await QuoteLine.create({
      quoteId: quote.id, position: l.position, kind: l.kind,
      parentLineId: l.parentLineId ? (lineIds.get(l.parentLineId) ?? null) : null,
      partId: l.partId, sku: l.sku, partType: l.partType, description: l.description, quantity: l.quantity,
      hoursHundredths: l.hoursHundredths, rateMinor: l.rateMinor, unitNetMinor: l.unitNetMinor, markupBp: l.markupBp,
      // a new revision is a new document: its core deposits come under the one rule for deposits (the part's rate)
      unitPriceMinor: l.unitPriceMinor, amountMinor: l.amountMinor, taxBp: l.kind === 'core_deposit' ? (rateOf.get(l.parentLineId ?? 0) ?? l.taxBp) : l.taxBp,
      taxIncluded: l.taxIncluded, recommendation: l.recommendation,
      reason: l.reason, coreCharge: l.coreCharge, ownerDecision: null,
      toldOwnerDeclinedRequired: l.toldOwnerDeclinedRequired, toldOwnerRecordedByUserId: l.toldOwnerRecordedByUserId,
      toldOwnerRecordedAt: l.toldOwnerRecordedAt,
      fitOverrideReason: l.fitOverrideReason, labourOperation: l.labourOperation, guideHundredths: l.guideHundredths,
    }, { transaction: t })
    lineIds.set(l.id, copy.id)
  }
  return { quote, lineIds }
}

/**
 * The quote a change applies to: the draft itself, or a new revision of a quote that has left draft.
 * Expired quotes are marked so first. Superseded ones cannot change (the latest revision can).
 */
export async function editableQuote(t: Transaction, q: Quote, actorUserId: number): Promise<EditableQuote> {
  const status = effectiveQuoteStatus(q.status, q.expiresAt ?? null)
  if (status !== q.status) {
    await Quote.update({ status }, { where: { id: q.id }, transaction: t })
    q.status = status
  }
  const mode = quoteEditMode(status)
  if (mode === 'in_place') return { quote: q, lineIds: null }
  if (mode === 'locked') throw conflict('This revision has been replaced by a newer one: change the latest revision.')
  return reviseQuote(t, q, actorUserId)
}

/**
 * Runs one change in a write transaction on the quote it applies to (the draft, or a new revision; `inPlace`
 * skips that for the one change allowed on a quote with the owner) and records it in the audit log.
 */
export async function changeQuote<T>(
  quote: Quote, actor: QuoteActor, action: string,
  apply: (t: Transaction, target: EditableQuote) => Promise<{ result: T; changes: Record<string, unknown> }>,
  options: { inPlace?: boolean } = {},
): Promise<T> {
  return withWrite(async (t) => {
    const target = options.inPlace ? { quote, lineIds: null } : await editableQuote(t, quote, actor.user.id)
    const { result, changes } = await apply(t, target)
    await audit(t, { actorUserId: actor.user.id, organisationId: actor.org.id, action, entity: 'quote', entityId: target.quote.id, changes })
    return result
  })
}
