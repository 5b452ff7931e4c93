/**
 * Starting and shaping a quote: a new draft (optionally from one of the garage's inspections of the vehicle),
 * its vehicle and owner particulars, the inspection's recommendations added later, and a new revision asked
 * for outright. Each runs in one write transaction with its audit row.
 */
import type { Inspection } from '../../models/inspections'
import { Quote } from '../../models/quotes'
import { withWrite } from '../../utils/db'
import { audit } from '../../utils/audit'
import type { FromInspectionInput, QuoteCreateInput, QuoteUpdateInput } from '../../../shared/schemas/quotes'
import { conflict, invalidInput } from '../errors'
import { addInspectionLines, findingsOf, inspectionOfVehicle, vehicleSnapshot, type Skipped } from './inspection-lines'
import { nextQuoteNumber } from './references'
import { changeQuote, type QuoteActor } from './revisions'
import { garageVehicleOf } from '../garage-vehicles/register'

/** Starts a draft; with an inspection, its findings and recommended parts come along. */
export async function createQuote(actor: QuoteActor, input: QuoteCreateInput): Promise<{ quote: Quote; skipped: Skipped[] }> {
  const { user, org } = actor
  const vehicle = await vehicleSnapshot(input.vehicleId)
  const inspection = input.inspectionId ? await inspectionOfVehicle(org.id, input.inspectionId, vehicle.id) : null
  const garageVehicle = input.garageVehicleId ? await garageVehicleOf(org.id, input.garageVehicleId) : null
  return withWrite(async (t) => {
    const q = await Quote.create({
      organisationId: org.id, number: await nextQuoteNumber(t, org.id), status: 'draft',
      vehicleId: vehicle.id, vehicleLabel: vehicle.label,
      registration: input.registration || inspection?.registration || '', odometer: input.odometer || inspection?.odometer || '',
      ownerName: input.ownerName, ownerEmail: input.ownerEmail, ownerPhone: input.ownerPhone,
      inspectionId: inspection?.id ?? null, findings: inspection ? findingsOf(inspection) : [], createdByUserId: user.id,
      garageVehicleId: garageVehicle?.id ?? null,
    }, { transaction: t })
    const fromInspection = inspection ? await addInspectionLines(t, q, org, inspection) : { added: [], skipped: [] }
    await audit(t, {
      actorUserId: user.id, organisationId: org.id, action: 'quote.create', entity: 'quote', entityId: q.id,
      // the owner's personal data stays out of the audit log
      changes: { number: q.number, vehicleId: vehicle.id, inspectionId: q.inspectionId, lines: fromInspection.added.length },
    })
    return { quote: q, skipped: fromInspection.skipped }
  })
}

/** Links the inspection (or none) and copies its findings onto the quote in plain words. */
function linkInspection(q: Quote, inspection: Inspection | null): void {
  q.inspectionId = inspection?.id ?? null
  q.findings = inspection ? findingsOf(inspection) : []
}

/** Changes the vehicle, owner particulars, note or inspection; returns the quote that holds the change. */
export async function updateQuote(quote: Quote, actor: QuoteActor, input: QuoteUpdateInput): Promise<Quote> {
  const vehicle = input.vehicleId ? await vehicleSnapshot(input.vehicleId) : null
  const inspection = input.inspectionId
    ? await inspectionOfVehicle(actor.org.id, input.inspectionId, vehicle?.id ?? quote.vehicleId ?? null)
    : null
  return changeQuote(quote, actor, 'quote.update', async (t, { quote: q }) => {
    const { vehicleId: _v, inspectionId, ...plain } = input
    q.set(Object.fromEntries(Object.entries(plain).filter(([, v]) => v !== undefined)))
    if (vehicle) { q.vehicleId = vehicle.id; q.vehicleLabel = vehicle.label }
    if (inspectionId === null || inspection) linkInspection(q, inspection)
    await q.save({ transaction: t })
    return { result: q, changes: { fields: Object.keys(input), revisedFrom: q.id === quote.id ? null : quote.id } }
  })
}

/** Adds an inspection's recommendations (default: the one the quote was drafted from), skipping parts already on it. */
export async function draftFromInspection(quote: Quote, actor: QuoteActor, input: FromInspectionInput): Promise<{ quote: Quote; added: number; skipped: Skipped[] }> {
  const inspectionId = input.inspectionId ?? quote.inspectionId
  if (!inspectionId) throw invalidInput({ inspectionId: 'Choose the inspection to draft from.' })
  const inspection = await inspectionOfVehicle(actor.org.id, inspectionId, quote.vehicleId ?? null)
  return changeQuote(quote, actor, 'quote.lines.from_inspection', async (t, { quote: q }) => {
    linkInspection(q, inspection)
    await q.save({ transaction: t })
    const { added, skipped } = await addInspectionLines(t, q, actor.org, inspection, input.choices ?? [])
    return {
      result: { quote: q, added: added.length, skipped },
      changes: { inspectionId: inspection.id, added: added.map((l) => l.sku), skipped: skipped.length },
    }
  })
}

/** A new draft revision of a quote that has left draft (409 for a draft or a replaced revision). */
export function newRevision(quote: Quote, actor: QuoteActor): Promise<Quote> {
  return changeQuote(quote, actor, 'quote.revise', async (_t, { quote: q }) => {
    if (q.id === quote.id) throw conflict('A draft is changed as it is; it needs no new revision.')
    return { result: q, changes: { from: quote.id, revision: q.revision } }
  })
}
