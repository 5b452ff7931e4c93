/**
 * What a garage vehicle's identity must satisfy before it is stored: a VIN whose check digit is right where the
 * region requires one, a catalogue vehicle that exists, answers that vehicle asks, and a registration and VIN
 * that no other vehicle of the same garage holds (two garages may hold the same car). Plain Node.
 */
import { Op, type Transaction } from 'sequelize'
import { Vehicle, VehicleOption } from '../../models/catalogue'
import { GarageVehicle } from '../../models/garage-vehicles'
import { answerProblems, canonicalAnswers } from '../../../shared/utils/catalogue/qualifiers'
import { readVin } from '../../../shared/utils/vehicles/vin'
import { displayRegistration } from '../../../shared/utils/vehicles/registration'
import { conflict, invalidInput } from '../errors'

/** 422 beside `vin` for a wrong check digit where the region makes it compulsory. */
export function assertVinUsable(vin: string | null | undefined): void {
  if (!vin) return
  const reading = readVin(vin)
  if (!reading.valid) throw invalidInput({ vin: reading.warning ?? 'This VIN is not valid.' })
}

/** The catalogue vehicle (422 beside `vehicleId` when there is none) and the answers spelt as it spells them. */
export async function checkedAnswers(t: Transaction, vehicleId: number | null, answers: Record<string, string>): Promise<Record<string, string>> {
  if (!vehicleId) {
    if (Object.keys(answers).length) throw invalidInput({ vehicleId: 'Choose the vehicle before answering its questions.' })
    return {}
  }
  const vehicle = await Vehicle.findByPk(vehicleId, { transaction: t })
  if (!vehicle) throw invalidInput({ vehicleId: 'There is no such vehicle in the catalogue.' })
  const options = await VehicleOption.findAll({ where: { vehicleId }, transaction: t })
  const problems = answerProblems(options, answers)
  if (Object.keys(problems).length) {
    throw invalidInput(Object.fromEntries(Object.entries(problems).map(([k, m]) => [k.replace(/^opt\./, 'answers.'), m])))
  }
  return canonicalAnswers(options, answers)
}

/** 409 naming the field when another vehicle of the garage holds the registration or the VIN. */
export async function assertUnique(t: Transaction, organisationId: number, v: { registration?: string | null; vin?: string | null }, exceptId?: number): Promise<void> {
  const others = { organisationId, ...(exceptId ? { id: { [Op.ne]: exceptId } } : {}) }
  if (v.registration && await GarageVehicle.findOne({ where: { ...others, registration: v.registration }, transaction: t })) {
    throw conflict(`${displayRegistration(v.registration)} is already on another of your vehicles.`, undefined, { registration: 'Already on another of your vehicles: open that one.' })
  }
  if (v.vin && await GarageVehicle.findOne({ where: { ...others, vin: v.vin }, transaction: t })) {
    throw conflict('This VIN is already on another of your vehicles.', undefined, { vin: 'Already on another of your vehicles: open that one.' })
  }
}
