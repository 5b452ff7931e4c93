/**
 * How a garage vehicle reads in answers: the list row, the full record (owner, remembered answers in the
 * vehicle's own words, the VIN read, the finder's query for the parts that fit) and the search behind the header's
 * box (registration, VIN or its end, owner's name). Plain Node.
 */
import { Op, Sequelize, type WhereOptions } from 'sequelize'
import { Vehicle, VehicleOption } from '../../models/catalogue'
import { FollowUp, GarageCustomer, GarageVehicle } from '../../models/garage-vehicles'
import { pageOf } from '../../utils/page'
import { IDENTITY_LABELS } from '../../../shared/utils/catalogue/qualifiers'
import { displayRegistration, normaliseRegistration } from '../../../shared/utils/vehicles/registration'
import type { GarageVehicleListQuery } from '../../../shared/schemas/garage-vehicles'
import type { GarageVehicleDetail, GarageVehicleSummary, OdometerView, RememberedAnswer } from '../../../shared/types/garage-vehicles'
import type { Page } from '../../../shared/types/page'
import { vehicleRef } from './catalogue-match'
import { customerView } from './customers'
import { latestReadings } from './odometer'
import { vinAnswer } from './vin-reading'
import { followUpView } from '../follow-ups/views'
import { containsText } from '../../utils/sql'

const WITH_OWNER_AND_VEHICLE = [
  { model: GarageCustomer, as: 'customer' },
  { model: Vehicle, as: 'vehicle' },
]

export function summaryOf(v: GarageVehicle, lastOdometer: OdometerView | null): GarageVehicleSummary {
  return {
    id: v.id, registration: v.registration ? displayRegistration(v.registration) : null, vin: v.vin,
    vehicle: v.vehicle ? vehicleRef(v.vehicle) : null,
    owner: v.customer ? { id: v.customer.id, name: v.customer.name } : null,
    lastOdometer, updatedAt: new Date(v.updatedAt).toISOString(),
  }
}

/** The finder's query (app/stores/finder.ts) for this car: make, model, year, vehicle and every remembered answer. */
export function partsQueryOf(v: Pick<GarageVehicle, 'vehicleId' | 'answers' | 'vin' | 'built'> & { vehicle?: Vehicle | null }): Record<string, string> {
  if (!v.vehicleId || !v.vehicle) return {}
  const c = v.vehicle
  const builtYear = v.built ? Number(v.built.slice(0, 4)) : null
  const year = builtYear && builtYear >= c.yearFrom && (c.yearTo === null || builtYear <= c.yearTo) ? builtYear : c.yearFrom
  const q: Record<string, string> = { make: c.make, model: c.model, year: String(year), vehicle: String(c.id) }
  for (const [k, value] of Object.entries(v.answers ?? {})) q[`opt.${k}`] = value
  if (v.vin) q['opt.vin'] = v.vin
  if (v.built) q['opt.built'] = v.built
  return q
}

async function answerLabels(vehicleId: number | null, answers: Record<string, string>): Promise<RememberedAnswer[]> {
  const options = vehicleId ? await VehicleOption.findAll({ where: { vehicleId } }) : []
  return Object.entries(answers).map(([key, value]) => {
    const o = options.find((x) => x.key === key)
    return { key, label: o?.label ?? IDENTITY_LABELS[key] ?? key, value, valueLabel: o?.values.find((x) => x.value === value)?.label ?? value }
  })
}

/** The full record of one of the garage's vehicles (already scoped by the caller). */
export async function detailOf(id: number): Promise<GarageVehicleDetail> {
  const v = (await GarageVehicle.findByPk(id, { include: WITH_OWNER_AND_VEHICLE }))!
  const [last, labels, vinReading, followUps] = await Promise.all([
    latestReadings([v.id]),
    answerLabels(v.vehicleId ?? null, v.answers ?? {}),
    v.vin ? vinAnswer(v.vin) : null,
    FollowUp.findAll({ where: { garageVehicleId: v.id }, order: [['dueAt', 'DESC'], ['id', 'DESC']], limit: 50 }),
  ])
  return {
    ...summaryOf(v, last.get(v.id) ?? null),
    customer: v.customer ? customerView(v.customer) : null,
    answers: v.answers ?? {}, answerLabels: labels, built: v.built ?? null, notes: v.notes, vinReading,
    partsQuery: partsQueryOf(v),
    followUps: followUps.map((f) => followUpView(f, v, v.customer ?? null)),
  }
}

/** `%` and `_` are plain characters in a search: not LIKE. */
const contains = (column: string, text: string) => containsText(column, text)

function whereOf(organisationId: number, q: string | undefined): WhereOptions {
  if (!q) return { organisationId }
  const mark = normaliseRegistration(q)
  const ors = [contains('customer.name', q)]
  if (mark) ors.push(contains('GarageVehicle.registration', mark), contains('GarageVehicle.vin', mark))
  return { organisationId, [Op.or]: ors }
}

/** One page of the garage's vehicles: exact registration or VIN first, then most recently changed. */
export async function listGarageVehicles(organisationId: number, query: GarageVehicleListQuery): Promise<Page<GarageVehicleSummary>> {
  const mark = query.q ? normaliseRegistration(query.q) : ''
  const exactFirst = Sequelize.literal(`CASE WHEN "GarageVehicle"."registration" = ${GarageVehicle.sequelize!.escape(mark)} OR "GarageVehicle"."vin" = ${GarageVehicle.sequelize!.escape(mark)} THEN 0 ELSE 1 END`)
  return pageOf(query, (window) => GarageVehicle.findAndCountAll({
    where: whereOf(organisationId, query.q), include: WITH_OWNER_AND_VEHICLE, subQuery: false, distinct: true,
    order: [[exactFirst, 'ASC'], ['updatedAt', 'DESC'], ['id', 'DESC']], ...window,
  }), async (rows) => {
    const last = await latestReadings(rows.map((r) => r.id))
    return rows.map((r) => summaryOf(r, last.get(r.id) ?? null))
  })
}
