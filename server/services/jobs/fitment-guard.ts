/**
 * The fitment guard: a part goes on a quote for a vehicle only when the catalogue says it fits that vehicle,
 * given what is known of the car (the option answers sent with the line, and the garage's record of the car:
 * its remembered answers, VIN and build month). A part whose fit depends on an unanswered question asks it; a
 * part that does not fit is refused unless a manager overrides with a reason. Plain Node.
 */
import type { Transaction } from 'sequelize'
import { Fitment, type Part, Vehicle, VehicleOption } from '../../models/catalogue'
import { GarageVehicle } from '../../models/garage-vehicles'
import type { Quote } from '../../models/quotes'
import { answerFor, matchQualifiers, type Answers } from '../../../shared/utils/catalogue/qualifiers'
import { vehicleLabel } from '../inspections'
import { DomainError, invalidInput } from '../errors'

export interface FitCheck {
  status: 'fits' | 'open' | 'none'
  /** the fitment that fits (for the fitted quantity and the axle) */
  fitment: Fitment | null
  /** the questions that decide it, when open */
  questions: { key: string; question: string; values: { value: string; label: string }[] }[]
}

/** What is known of the quote's car: the garage record's remembered answers, VIN and build month, then the line's answers. */
export async function knownAnswers(q: Pick<Quote, 'garageVehicleId' | 'organisationId'>, given: Answers | undefined, t?: Transaction): Promise<Answers> {
  const record = q.garageVehicleId ? await GarageVehicle.findOne({ where: { id: q.garageVehicleId, organisationId: q.organisationId }, transaction: t }) : null
  return {
    ...(record?.answers ?? {}),
    ...(record?.vin ? { vin: record.vin } : {}),
    ...(record?.built ? { built: record.built } : {}),
    ...(given ?? {}),
  }
}

/** How one part stands against one vehicle and the answers known. */
export async function checkFit(vehicleId: number, partId: number, answers: Answers, t?: Transaction): Promise<FitCheck> {
  const rows = await Fitment.findAll({ where: { vehicleId, partId }, order: [['id', 'ASC']], transaction: t })
  const matched = rows.map((f) => ({ f, m: matchQualifiers(f.qualifiers ?? {}, answers) }))
  const fits = matched.find((x) => x.m === 'fits')
  if (fits) return { status: 'fits', fitment: fits.f, questions: [] }
  const open = matched.filter((x) => x.m === 'open')
  if (!open.length) return { status: 'none', fitment: null, questions: [] }
  const keys = new Set(open.flatMap((x) => Object.keys(x.f.qualifiers ?? {}).filter((k) => answerFor(k, answers) === undefined)))
  const options = await VehicleOption.findAll({ where: { vehicleId }, transaction: t })
  return {
    status: 'open', fitment: null,
    questions: options.filter((o) => keys.has(o.key)).map((o) => ({ key: o.key, question: o.question, values: o.values })),
  }
}

/**
 * The fitment a part line stands on, or throws: 422 on `sku` "does not fit <vehicle>" without an override; 422
 * asking the open questions (on `answers.<key>`, and the questions in `data.questions`). With an override the
 * line goes on as it is (null fitment).
 */
export async function guardFit(
  t: Transaction, q: Pick<Quote, 'vehicleId' | 'garageVehicleId' | 'organisationId'>, part: Part,
  input: { answers?: Answers; override?: { reason: string } | null },
): Promise<Fitment | null> {
  if (!q.vehicleId) return null
  const check = await checkFit(q.vehicleId, part.id, await knownAnswers(q, input.answers, t), t)
  if (check.status === 'fits') return check.fitment
  if (input.override?.reason) return null
  const vehicle = await Vehicle.findByPk(q.vehicleId, { transaction: t })
  const label = vehicle ? vehicleLabel(vehicle) : 'this vehicle'
  if (check.status === 'open' && check.questions.length) {
    const fields = Object.fromEntries(check.questions.map((x) => [`answers.${x.key}`, x.question]))
    throw new DomainError('invalid', `Whether ${part.sku} fits depends on the car: ${check.questions.map((x) => x.question).join(' ')}`, {
      fields: { sku: `Answer first: ${check.questions.map((x) => x.question).join(' ')}`, ...fields },
      details: { questions: check.questions },
    })
  }
  throw invalidInput({ sku: `${part.sku} does not fit ${label}.` }, `${part.sku} does not fit ${label}.`)
}
