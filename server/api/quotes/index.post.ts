/**
 * POST /api/quotes  { vehicleId, registration?, odometer?, ownerName, ownerEmail, ownerPhone?, inspectionId? }
 * Starts a draft quote for the caller's garage (technicians and managers). With `inspectionId` (one of this
 * garage's inspections of that vehicle) the findings are copied in plain words and the recommended parts become
 * required (fail) or advised lines. -> 201 QuoteDetail (+ `skipped`: recommendations that gave no line, and why).
 * 401 signed out; 403 without `quotes.draft`; 422 with `data.fields`.
 */
import { QuoteCreateSchema } from '#shared/schemas/quotes'
import { Inspection } from '../../models/inspections'
import { Quote } from '../../models/quotes'
import { addInspectionLines, findingsOf, nextQuoteNumber, vehicleSnapshot } from '../../services/quotes'

export default defineEventHandler(async (event) => {
  requireAuth(event)
  const body = await bodyWith(event, QuoteCreateSchema)
  const auth = requireAbility(event, 'quotes.draft')
  const { user, org } = auth
  const vehicle = await vehicleSnapshot(body.vehicleId)
  if (!vehicle) throw invalidInput({ vehicleId: 'That vehicle is not in the catalogue.' })
  let inspection: Inspection | null = null
  if (body.inspectionId) {
    inspection = await Inspection.findOne({ where: { id: body.inspectionId, organisationId: org.id } })
    if (!inspection) throw invalidInput({ inspectionId: 'No such inspection at this garage.' })
    if (inspection.vehicleId !== vehicle.id) throw invalidInput({ inspectionId: 'That inspection is of another vehicle.' })
  }
  const { quote, skipped } = await withWrite(async (t) => {
    const q = await Quote.create({
      organisationId: org.id, number: await nextQuoteNumber(t, org.id), status: 'draft',
      vehicleId: vehicle.id, vehicleLabel: vehicle.label,
      registration: body.registration || inspection?.registration || '', odometer: body.odometer || inspection?.odometer || '',
      ownerName: body.ownerName, ownerEmail: body.ownerEmail, ownerPhone: body.ownerPhone,
      inspectionId: inspection?.id ?? null, findings: inspection ? findingsOf(inspection) : [], createdByUserId: user.id,
    }, { transaction: t })
    const fromInspection = inspection ? await addInspectionLines(t, q, org, inspection) : { added: [], skipped: [] }
    await audit(t, {
      actorUserId: user.id, organisationId: org.id, action: 'quote.create', entity: 'quote', entityId: q.id,
      // the owner's personal data stays out of the audit log
      changes: { number: q.number, vehicleId: vehicle.id, inspectionId: q.inspectionId, lines: fromInspection.added.length },
    })
    return { quote: q, skipped: fromInspection.skipped }
  })
  setResponseStatus(event, 201)
  return { ...(await quoteAnswer(quote, auth)), skipped }
})
