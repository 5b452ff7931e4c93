/**
 * POST /api/quotes/:id/lines/from-inspection  { inspectionId?, choices?: [{ index, sku | null }] }
 * Turns one of this garage's inspections of the quote's vehicle (default: the one the quote was drafted from)
 * into lines: each recommended part type gets the first catalogue part that certainly fits (or the SKU chosen
 * for that recommendation, or none when the choice is null), marked required for a fail verdict and advised for
 * an advise verdict, with the finding as its reason. The findings are copied onto the quote in plain words.
 * -> QuoteDetail + `added` (line count) + `skipped` [{ index, what, why }].
 * 401; 422; 404 not this garage's quote; 403 without `quotes.draft`; 409 a replaced revision.
 */
import { FromInspectionSchema } from '#shared/schemas/quotes'
import { Inspection } from '../../../../models/inspections'
import { addInspectionLines, editableQuote, findingsOf } from '../../../../services/quotes'

export default defineEventHandler(async (event) => {
  requireAuth(event)
  const body = await bodyWith(event, FromInspectionSchema)
  const { auth, quote } = await loadOwnQuote(event)
  const inspectionId = body.inspectionId ?? quote.inspectionId
  if (!inspectionId) throw invalidInput({ inspectionId: 'Choose the inspection to draft from.' })
  const inspection = await Inspection.findOne({ where: { id: inspectionId, organisationId: auth.org.id } })
  if (!inspection) throw invalidInput({ inspectionId: 'No such inspection at this garage.' })
  if (inspection.vehicleId !== quote.vehicleId) throw invalidInput({ inspectionId: 'That inspection is of another vehicle.' })
  const result = await withWrite(async (t) => {
    const { quote: q } = await editableQuote(t, quote, auth.user.id)
    q.inspectionId = inspection.id
    q.findings = findingsOf(inspection)
    await q.save({ transaction: t })
    const { added, skipped } = await addInspectionLines(t, q, auth.org, inspection, body.choices ?? [])
    await audit(t, {
      actorUserId: auth.user.id, organisationId: auth.org.id, action: 'quote.lines.from_inspection', entity: 'quote', entityId: q.id,
      changes: { inspectionId: inspection.id, added: added.map((l) => l.sku), skipped: skipped.length },
    })
    return { q, added: added.length, skipped }
  })
  return { ...(await quoteAnswer(result.q, auth)), added: result.added, skipped: result.skipped }
})
