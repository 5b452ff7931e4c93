/**
 * PATCH /api/quotes/:id  { vehicleId?, registration?, odometer?, ownerName?, ownerEmail?, ownerPhone?, messageToOwner?, inspectionId? }
 * Changes a draft in place. A quote that has been sent (or decided, or has expired) is never changed: the change
 * goes into a new revision (same number, revision + 1), the old one is kept as superseded. -> QuoteDetail of the
 * quote that now holds the change (its `id` differs from the URL's when a revision was made).
 * 401; 422 with `data.fields`; 404 not this garage's quote; 403 without `quotes.draft`; 409 a replaced revision.
 */
import { QuoteUpdateSchema } from '#shared/schemas/quotes'
import { Inspection } from '../../../models/inspections'
import { editableQuote, findingsOf, vehicleSnapshot } from '../../../services/quotes'

export default defineEventHandler(async (event) => {
  requireAuth(event)
  const body = await bodyWith(event, QuoteUpdateSchema)
  const { auth, quote } = await loadOwnQuote(event)
  const vehicle = body.vehicleId ? await vehicleSnapshot(body.vehicleId) : null
  if (body.vehicleId && !vehicle) throw invalidInput({ vehicleId: 'That vehicle is not in the catalogue.' })
  let inspection: Inspection | null = null
  if (body.inspectionId) {
    inspection = await Inspection.findOne({ where: { id: body.inspectionId, organisationId: auth.org.id } })
    if (!inspection) throw invalidInput({ inspectionId: 'No such inspection at this garage.' })
    if (inspection.vehicleId !== (vehicle?.id ?? quote.vehicleId)) throw invalidInput({ inspectionId: 'That inspection is of another vehicle.' })
  }
  const target = await withWrite(async (t) => {
    const { quote: q } = await editableQuote(t, quote, auth.user.id)
    const { vehicleId: _v, inspectionId, ...plain } = body
    q.set(Object.fromEntries(Object.entries(plain).filter(([, v]) => v !== undefined)))
    if (vehicle) { q.vehicleId = vehicle.id; q.vehicleLabel = vehicle.label }
    if (inspectionId === null) { q.inspectionId = null; q.findings = [] }
    if (inspection) { q.inspectionId = inspection.id; q.findings = findingsOf(inspection) }
    await q.save({ transaction: t })
    await audit(t, {
      actorUserId: auth.user.id, organisationId: auth.org.id, action: 'quote.update', entity: 'quote', entityId: q.id,
      changes: { fields: Object.keys(body), revisedFrom: q.id === quote.id ? null : quote.id },
    })
    return q
  })
  return quoteAnswer(target, auth)
})
