/**
 * A garage's customers (vehicle owners): created with a vehicle or on their own, their details and their consent
 * to reminders, which is recorded with when and how it was given or withdrawn. Scoped to the garage. Plain Node.
 */
import { Op, type Transaction } from 'sequelize'
import { GarageCustomer, GarageVehicle } from '../../models/garage-vehicles'
import { pageOf } from '../../utils/page'
import type { CustomerDetails, GarageCustomerListQuery } from '../../../shared/schemas/garage-vehicles'
import type { GarageCustomerView } from '../../../shared/types/garage-vehicles'
import type { Page } from '../../../shared/types/page'
import { notFound } from '../errors'
import { containsText } from '../../utils/sql'

export function customerView(c: GarageCustomer, vehicleCount?: number): GarageCustomerView {
  return {
    id: c.id, name: c.name, email: c.email, phone: c.phone, reminderConsent: c.reminderConsent,
    consentChangedAt: c.consentChangedAt ? new Date(c.consentChangedAt).toISOString() : null, consentSource: c.consentSource, notes: c.notes,
    ...(vehicleCount === undefined ? {} : { vehicleCount }),
  }
}

/** One of the garage's customers; 404 when it is not the garage's. */
export async function customerOf(organisationId: number, id: number, t?: Transaction): Promise<GarageCustomer> {
  const c = await GarageCustomer.findOne({ where: { id, organisationId }, transaction: t })
  if (!c) throw notFound('Owner')
  return c
}

export function createCustomer(t: Transaction, organisationId: number, input: CustomerDetails, now = new Date()): Promise<GarageCustomer> {
  return GarageCustomer.create({
    organisationId, name: input.name, email: input.email, phone: input.phone, notes: input.notes,
    reminderConsent: input.reminderConsent, consentChangedAt: input.reminderConsent ? now : null,
    consentSource: input.reminderConsent ? input.consentSource : '',
  }, { transaction: t })
}

/** Changes a customer's details; a change of consent is stamped with the time and how it came. */
export async function updateCustomer(t: Transaction, c: GarageCustomer, input: CustomerDetails, now = new Date()): Promise<string[]> {
  const changed: string[] = []
  for (const k of ['name', 'email', 'phone', 'notes'] as const) {
    if (c[k] !== input[k]) { c[k] = input[k]; changed.push(k) }
  }
  if (c.reminderConsent !== input.reminderConsent) {
    c.reminderConsent = input.reminderConsent
    c.consentChangedAt = now
    c.consentSource = input.consentSource || (input.reminderConsent ? 'recorded by the garage' : 'withdrawn at the garage')
    changed.push('reminderConsent')
  }
  await c.save({ transaction: t })
  return changed
}

/** One page of the garage's customers by name, e-mail or phone, with how many vehicles each has. */
export async function listCustomers(organisationId: number, query: GarageCustomerListQuery): Promise<Page<GarageCustomerView>> {
  const q = query.q?.toLowerCase()
  const where = q
    ? { organisationId, [Op.or]: ['name', 'email', 'phone'].map((col) => containsText(col, q)) }
    : { organisationId }
  return pageOf(query, (window) => GarageCustomer.findAndCountAll({ where, order: [['name', 'ASC'], ['id', 'ASC']], ...window }), async (rows) => {
    const counts = rows.length
      ? await GarageVehicle.count({ where: { customerId: rows.map((r) => r.id) }, group: ['customerId'] })
      : []
    const byId = new Map(counts.map((c) => [Number(c.customerId), Number(c.count)]))
    return rows.map((r) => customerView(r, byId.get(r.id) ?? 0))
  })
}
