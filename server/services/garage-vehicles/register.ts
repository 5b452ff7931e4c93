/**
 * Adding and changing a garage's vehicles (with their owner, answers and odometer readings), each in one write
 * transaction with its audit row (no personal data in it). Plain Node.
 */
import type { Transaction } from 'sequelize'
import { GarageVehicle, type GarageCustomer } from '../../models/garage-vehicles'
import { withWrite } from '../../utils/db'
import { audit } from '../../utils/audit'
import type { GarageVehicleCreate, GarageVehicleUpdate } from '../../../shared/schemas/garage-vehicles'
import { invalidInput, notFound } from '../errors'
import { createCustomer, customerOf, updateCustomer } from './customers'
import { assertUnique, assertVinUsable, checkedAnswers } from './identity-checks'
import { addReading } from './odometer'

export interface RegisterActor { userId: number; organisationId: number }

/** The garage's vehicle; 404 when it is not the garage's. */
export async function garageVehicleOf(organisationId: number, id: number, t?: Transaction): Promise<GarageVehicle> {
  const v = await GarageVehicle.findOne({ where: { id, organisationId }, transaction: t })
  if (!v) throw notFound('Vehicle')
  return v
}

/** The owner for a vehicle: an existing customer of the garage (404 otherwise), a new one, or none. */
async function ownerFor(t: Transaction, organisationId: number, input: Pick<GarageVehicleCreate, 'customerId' | 'customer'>): Promise<GarageCustomer | null> {
  if (input.customerId) return customerOf(organisationId, input.customerId, t)
  return input.customer ? createCustomer(t, organisationId, input.customer) : null
}

export async function createGarageVehicle(actor: RegisterActor, input: GarageVehicleCreate): Promise<GarageVehicle> {
  assertVinUsable(input.vin)
  return withWrite(async (t) => {
    await assertUnique(t, actor.organisationId, input)
    const answers = await checkedAnswers(t, input.vehicleId ?? null, input.answers ?? {})
    const owner = await ownerFor(t, actor.organisationId, input)
    const v = await GarageVehicle.create({
      organisationId: actor.organisationId, customerId: owner?.id ?? null, registration: input.registration ?? null, vin: input.vin ?? null,
      vehicleId: input.vehicleId ?? null, answers, built: input.built ?? null, notes: input.notes ?? '',
    }, { transaction: t })
    if (input.odometer) await addReading(t, v.id, input.odometer, 'recorded')
    await audit(t, {
      actorUserId: actor.userId, organisationId: actor.organisationId, action: 'garageVehicle.create', entity: 'garage_vehicle', entityId: v.id,
      changes: { vehicleId: v.vehicleId, answers: Object.keys(answers), newOwner: !!input.customer },
    })
    return v
  })
}

export async function updateGarageVehicle(actor: RegisterActor, id: number, input: GarageVehicleUpdate): Promise<GarageVehicle> {
  assertVinUsable(input.vin)
  return withWrite(async (t) => {
    const v = await garageVehicleOf(actor.organisationId, id, t)
    const changed: string[] = []
    const set = <K extends 'registration' | 'vin' | 'built' | 'notes'>(k: K, value: GarageVehicle[K] | undefined) => {
      if (value !== undefined && v[k] !== value) { v[k] = value; changed.push(k) }
    }
    set('registration', input.registration)
    set('vin', input.vin)
    set('built', input.built)
    set('notes', input.notes)
    if (!v.registration && !v.vin) throw invalidInput({ registration: 'Keep the registration or the VIN: a vehicle needs one of them.' })
    await assertUnique(t, actor.organisationId, { registration: input.registration, vin: input.vin }, v.id)
    if (input.vehicleId !== undefined || input.answers !== undefined) {
      const vehicleId = input.vehicleId !== undefined ? input.vehicleId : v.vehicleId
      // a different catalogue vehicle asks different questions: its answers start afresh unless given with it
      const answers = input.answers ?? (vehicleId === v.vehicleId ? v.answers : {})
      v.answers = await checkedAnswers(t, vehicleId ?? null, answers)
      v.vehicleId = vehicleId ?? null
      changed.push('vehicle')
    }
    if (input.customerId !== undefined) { v.customerId = input.customerId ? (await customerOf(actor.organisationId, input.customerId, t)).id : null; changed.push('owner') }
    if (input.customer) {
      const details = input.customer
      if (v.customerId) changed.push(...(await updateCustomer(t, await customerOf(actor.organisationId, v.customerId, t), details)).map((k) => `owner.${k}`))
      else { v.customerId = (await createCustomer(t, actor.organisationId, details)).id; changed.push('owner') }
    }
    if (input.odometer) { await addReading(t, v.id, input.odometer, 'recorded'); changed.push('odometer') }
    v.changed('updatedAt', true)
    await v.save({ transaction: t })
    await audit(t, { actorUserId: actor.userId, organisationId: actor.organisationId, action: 'garageVehicle.update', entity: 'garage_vehicle', entityId: v.id, changes: { fields: changed } })
    return v
  })
}
