/**
 * The link in a reminder that stops reminders without signing in: the token (only its SHA-256 is stored) names
 * the reminder, and through it the owner. Stopping withdraws the owner's consent (stamped with the time and
 * "unsubscribe link") and stops every follow-up still waiting for their vehicles. Using it twice is harmless.
 * Plain Node.
 */
import { Organisation } from '../../models/accounts'
import { FollowUp, GarageCustomer, GarageVehicle } from '../../models/garage-vehicles'
import { withWrite } from '../../utils/db'
import { audit } from '../../utils/audit'
import { DomainError } from '../errors'
import { hashReminderToken } from './send'

const notValid = () => new DomainError('not_found', 'This link is not valid.')

async function ownerOfToken(token: string) {
  const f = await FollowUp.findOne({ where: { unsubscribeHash: hashReminderToken(token) }, include: [{ model: GarageVehicle, as: 'garageVehicle', include: [{ model: GarageCustomer, as: 'customer' }] }] })
  const owner = f?.garageVehicle?.customer
  if (!f || !owner) throw notValid()
  return { followUp: f, owner }
}

/** What the page shows: the garage's name and whether reminders are still on. */
export async function reminderLink(token: string): Promise<{ garage: string; subscribed: boolean }> {
  const { followUp, owner } = await ownerOfToken(token)
  const org = await Organisation.findByPk(followUp.organisationId)
  return { garage: org?.name ?? 'The garage', subscribed: owner.reminderConsent }
}

export async function unsubscribe(token: string, now = new Date()): Promise<{ garage: string; subscribed: false }> {
  const { followUp, owner } = await ownerOfToken(token)
  await withWrite(async (t) => {
    const vehicles = await GarageVehicle.findAll({ where: { customerId: owner.id }, attributes: ['id'], transaction: t })
    await FollowUp.update({ status: 'stopped', statusNote: 'The owner stopped reminders.' }, { where: { garageVehicleId: vehicles.map((v) => v.id), status: 'scheduled' }, transaction: t })
    if (!owner.reminderConsent) return
    await GarageCustomer.update({ reminderConsent: false, consentChangedAt: now, consentSource: 'unsubscribe link in a reminder' }, { where: { id: owner.id }, transaction: t })
    await audit(t, { actorUserId: null, organisationId: followUp.organisationId, action: 'garageCustomer.unsubscribe', entity: 'garage_customer', entityId: owner.id, changes: { reminderConsent: false } })
  })
  const org = await Organisation.findByPk(followUp.organisationId)
  return { garage: org?.name ?? 'The garage', subscribed: false }
}
