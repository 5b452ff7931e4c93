/**
 * A garage's recorded inspections: recording one (the wear verdicts, and the catalogue parts they call for on that
 * vehicle), the list and the detail. Always scoped to the caller's garage: another garage's inspection is 404.
 * Plain Node.
 */
import type { Includeable } from 'sequelize'
import { Vehicle, VehicleOption } from '../models/catalogue'
import { Inspection } from '../models/inspections'
import { User } from '../models/accounts'
import { withWrite } from '../utils/db'
import { audit } from '../utils/audit'
import { pageOf } from '../utils/page'
import { computeWear, parseWearInput, type WearInput } from '../../shared/utils/brake'
import { answerProblems, canonicalAnswers } from '../../shared/utils/catalogue/qualifiers'
import { fieldMessages } from '../../shared/utils/field-messages'
import {
  InspectionCreateSchema, type InspectionDetail, type InspectionListQuery, type InspectionSummary,
} from '../../shared/schemas/inspections'
import type { Page } from '../../shared/types/page'
import { invalidInput, notFound } from './errors'
import { cataloguePartsFor, vehicleLabel } from './inspections'
import { garageVehicleOf } from './garage-vehicles/register'
import { noteOdometerText } from './garage-vehicles/odometer'
import { photosOf } from './inspection-photos'

const VEHICLE_AND_AUTHOR: Includeable[] = [
  { model: Vehicle, as: 'vehicle', attributes: ['id', 'make', 'model', 'generation', 'yearFrom', 'yearTo'] },
  { model: User, as: 'author', attributes: ['id', 'name'] },
]

/** The list row of an inspection (vehicle and author loaded). */
export function inspectionSummary(row: Inspection): InspectionSummary {
  return {
    id: row.id,
    vehicleId: row.vehicleId,
    vehicle: row.vehicle ? vehicleLabel(row.vehicle) : `Vehicle ${row.vehicleId}`,
    registration: row.registration ?? '',
    odometer: row.odometer ?? '',
    overall: row.overall,
    author: row.author?.name ?? '',
    createdAt: new Date(row.createdAt).toISOString(),
    recommendedCount: (row.recommendedParts ?? []).length,
  }
}

/** The full record: readings, verdicts, the catalogue parts recommended and the photos of its findings. */
export function inspectionDetail(row: Inspection, photos: InspectionDetail['photos'] = []): InspectionDetail {
  return {
    ...inspectionSummary(row),
    answers: row.answers ?? {},
    wearInput: row.wearInput,
    result: row.result,
    recommendedParts: row.recommendedParts ?? [],
    photos,
  }
}

/** One page of the garage's inspections, newest first, optionally of one vehicle. */
export function listInspections(organisationId: number, query: InspectionListQuery): Promise<Page<InspectionSummary>> {
  const where = { organisationId, ...(query.vehicleId ? { vehicleId: query.vehicleId } : {}) }
  return pageOf(
    query,
    (window) => Inspection.findAndCountAll({ where, include: VEHICLE_AND_AUTHOR, order: [['createdAt', 'DESC'], ['id', 'DESC']], ...window }),
    (rows) => rows.map(inspectionSummary),
  )
}

/** One of the garage's inspections; 404 when it does not exist or is another garage's. */
export async function findInspection(organisationId: number, id: number): Promise<InspectionDetail> {
  const row = await Inspection.findOne({ where: { id, organisationId }, include: VEHICLE_AND_AUTHOR })
  if (!row) throw notFound('Inspection')
  return inspectionDetail(row, await photosOf(row.id))
}

export interface InspectionInput {
  vehicleId: number
  registration: string
  odometer: string
  answers: Record<string, string>
  wear: WearInput
  garageVehicleId?: number | null
}

/**
 * The body of POST /api/inspections read whole, so every field at fault is named in one 422: the job fields by
 * their names, the measured values (the wear-check body, read by the brake library's own parser) as `wear.<path>`.
 */
export function readInspection(body: unknown): InspectionInput {
  const head = InspectionCreateSchema.safeParse(body)
  const fields: Record<string, string> = head.success ? {} : fieldMessages(head.error.issues)
  const rawWear = (body as { wear?: unknown } | null)?.wear
  const wear = rawWear == null ? null : parseWearInput(rawWear)
  if (wear === null) fields.wear ??= 'Enter at least one measured value.'
  else if (!wear.ok) Object.assign(fields, fieldMessages(wear.issues, 'wear'))
  if (!head.success || !wear?.ok) throw invalidInput(fields)
  const { vehicleId, registration, odometer, answers, garageVehicleId } = head.data
  return { vehicleId, registration, odometer, answers, wear: wear.data, garageVehicleId }
}

/**
 * Records a garage's inspection of one vehicle (404 unknown vehicle; 422 for an answer the vehicle does not ask
 * or a value it does not offer, keyed `answers.<key>`), with the catalogue parts that fit this vehicle for each
 * part type the verdicts recommend. Audited.
 */
export async function recordInspection(organisationId: number, author: User, input: InspectionInput): Promise<InspectionDetail> {
  const vehicle = await Vehicle.findByPk(input.vehicleId)
  if (!vehicle) throw notFound('Vehicle')
  const options = await VehicleOption.findAll({ where: { vehicleId: vehicle.id } })
  const problems = answerProblems(options, input.answers)
  if (Object.keys(problems).length) {
    throw invalidInput(Object.fromEntries(Object.entries(problems).map(([k, m]) => [k.replace(/^opt\./, 'answers.'), m])))
  }
  const answers = canonicalAnswers(options, input.answers)
  const result = computeWear(input.wear)
  const recommendedParts = await cataloguePartsFor(vehicle.id, result.recommendedParts, answers)
  const garageVehicle = input.garageVehicleId ? await garageVehicleOf(organisationId, input.garageVehicleId) : null
  const row = await withWrite(async (t) => {
    await noteOdometerText(t, garageVehicle?.id, input.odometer, 'inspection')
    const created = await Inspection.create({
      organisationId, vehicleId: vehicle.id, authorUserId: author.id, garageVehicleId: garageVehicle?.id ?? null,
      registration: input.registration, odometer: input.odometer, answers,
      wearInput: result.inputs, result, overall: result.overall, recommendedParts,
    }, { transaction: t })
    await audit(t, {
      actorUserId: author.id, organisationId, action: 'inspection.record', entity: 'inspection', entityId: created.id,
      changes: { vehicleId: vehicle.id, overall: result.overall, recommended: recommendedParts.map((r) => `${r.axle}:${r.partType}`) },
    })
    return created
  })
  row.vehicle = vehicle
  row.author = author
  return inspectionDetail(row)
}
