/**
 * POST /api/inspections  { vehicleId, registration?, odometer?, answers?: { optionKey: value }, wear: WEAR }
 * Records a garage's inspection of one vehicle: the wear and fluid verdicts (POST /api/calculations/wear) and
 * the catalogue parts that fit this vehicle for each part type the verdicts recommend. -> 201 InspectionDetail.
 * 401 signed out; 403 without `inspections.record` (garage roles only); 422 with `data.fields` (wear fields
 * keyed `wear.<path>`, answers keyed `answers.<key>`); 404 unknown vehicle.
 */
import { computeWear, parseWearInput } from '#shared/utils/brake'
import { InspectionCreateSchema } from '#shared/schemas/inspections'
import { answerProblems, canonicalAnswers } from '#shared/utils/catalogue/qualifiers'
import { Vehicle, VehicleOption } from '../../models/catalogue'
import { Inspection } from '../../models/inspections'
import { User } from '../../models/accounts'
import { withWrite } from '../../utils/db'
import { cataloguePartsFor, inspectionDetail } from '../../services/inspections'

export default defineEventHandler(async (event) => {
  const { user, org } = requireAbility(event, 'inspections.record')
  if (org.kind !== 'garage') throw forbidden('Inspections are recorded by garages.')

  let body: unknown
  try {
    body = await readBody(event)
  } catch {
    throw invalidInput({ _: 'The request body is not valid JSON.' })
  }
  body ??= {}
  const head = InspectionCreateSchema.safeParse(body)
  const fields: Record<string, string> = head.success ? {} : fieldMessages(head.error.issues)
  const rawWear = (body as { wear?: unknown }).wear
  const wear = rawWear == null ? null : parseWearInput(rawWear)
  if (wear === null) fields.wear ??= 'Enter at least one measured value.'
  else if (!wear.ok) Object.assign(fields, fieldMessages(wear.issues, 'wear'))
  if (!head.success || !wear?.ok) throw invalidInput(fields)

  const input = head.data
  const vehicle = await Vehicle.findByPk(input.vehicleId)
  if (!vehicle) throw notFound('Vehicle')
  // Answers must be questions this vehicle asks, with one of their values.
  const options = await VehicleOption.findAll({ where: { vehicleId: vehicle.id } })
  const problems = answerProblems(options, input.answers)
  if (Object.keys(problems).length) {
    throw invalidInput(Object.fromEntries(Object.entries(problems).map(([k, m]) => [k.replace(/^opt\./, 'answers.'), m])))
  }
  const answers = canonicalAnswers(options, input.answers)

  const result = computeWear(wear.data)
  const recommendedParts = await cataloguePartsFor(vehicle.id, result.recommendedParts, answers)
  const row = await withWrite(async (t) => {
    const created = await Inspection.create({
      organisationId: org.id, vehicleId: vehicle.id, authorUserId: user.id,
      registration: input.registration, odometer: input.odometer, answers,
      wearInput: result.inputs, result, overall: result.overall, recommendedParts,
    }, { transaction: t })
    await audit(t, {
      actorUserId: user.id, organisationId: org.id, action: 'inspection.record', entity: 'inspection', entityId: created.id,
      changes: { vehicleId: vehicle.id, overall: result.overall, recommended: recommendedParts.map((r) => `${r.axle}:${r.partType}`) },
    })
    return created
  })
  row.vehicle = vehicle
  row.author = user as User
  setResponseStatus(event, 201)
  return inspectionDetail(row)
})
