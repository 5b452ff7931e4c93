/** A follow-up as the garage reads it. Plain Node. */
import type { FollowUp, GarageCustomer, GarageVehicle } from '../../models/garage-vehicles'
import { displayRegistration } from '../../../shared/utils/vehicles/registration'
import type { FollowUpView } from '../../../shared/types/garage-vehicles'

export function followUpView(f: FollowUp, v: Pick<GarageVehicle, 'registration'> | null, customer: Pick<GarageCustomer, 'name'> | null): FollowUpView {
  return {
    id: f.id, garageVehicleId: f.garageVehicleId, registration: v?.registration ? displayRegistration(v.registration) : null,
    ownerName: customer?.name ?? null, description: f.description, recommendation: f.recommendation,
    dueAt: new Date(f.dueAt).toISOString(), status: f.status, statusNote: f.statusNote,
    sentAt: f.sentAt ? new Date(f.sentAt).toISOString() : null, quoteId: f.quoteId, newQuoteId: f.newQuoteId ?? null,
  }
}
