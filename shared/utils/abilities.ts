/**
 * What each role may do: the one place this is written down. The server decides with it on every route
 * (server/utils/auth.ts `requireAbility`); the client uses it only to hide what the user cannot do.
 */
import type { Role } from '../types/accounts'

export const ABILITIES = {
  // catalogue and calculations
  'catalogue.view': ['distributor_admin', 'counter_staff', 'garage_manager', 'garage_technician'],
  'catalogue.edit': ['distributor_admin', 'counter_staff'],
  /** trade (net) prices; technicians only when their garage allows it (a garage setting, checked separately) */
  'prices.view': ['distributor_admin', 'counter_staff', 'garage_manager', 'garage_technician'],
  'calculations.use': ['distributor_admin', 'counter_staff', 'garage_manager', 'garage_technician'],
  // the garage's work
  'inspections.record': ['garage_manager', 'garage_technician'],
  'quotes.draft': ['garage_manager', 'garage_technician'],
  'quotes.price': ['garage_manager'],
  'quotes.send': ['garage_manager'],
  'orders.place': ['garage_manager'],
  'orders.pay': ['garage_manager'],
  'coreReturns.book': ['garage_manager'],
  /** ask to send back a wrong, unneeded or faulty part */
  'returns.request': ['garage_manager'],
  /** invoices and credit notes: a garage its own, the distributor all */
  'documents.view': ['distributor_admin', 'counter_staff', 'garage_manager'],
  'statement.view': ['garage_manager'],
  'garage.settings': ['garage_manager'],
  'garage.staff': ['garage_manager'],
  /** the garage's register of customers and vehicles, and registration look-ups */
  'vehicles.use': ['garage_manager', 'garage_technician'],
  /** the job card of an approved quote: read it, tick the checks, sign off */
  'jobs.work': ['garage_manager', 'garage_technician'],
  /** the garage's own invoice to the vehicle owner, and payments taken at the desk */
  'jobs.invoice': ['garage_manager'],
  /** a garage's own hours for a labour operation (over the guide's) */
  'labour.ownHours': ['garage_manager'],
  /** follow-ups of declined work: what is due, the weeks, and consent */
  'followUps.manage': ['garage_manager'],
  // the distributor's work
  'orders.work': ['distributor_admin', 'counter_staff'],
  'coreReturns.decide': ['distributor_admin', 'counter_staff'],
  /** receive returned parts and decide them (accept all, part or none) */
  'returns.decide': ['distributor_admin', 'counter_staff'],
  'priceFiles.manage': ['distributor_admin', 'counter_staff'],
  /** the labour guide's hours per vehicle and operation */
  'labour.guide': ['distributor_admin', 'counter_staff'],
  /** read the garages' trade accounts and their proof documents (counter staff check terms when working orders) */
  'tradeAccounts.view': ['distributor_admin', 'counter_staff'],
  'tradeAccounts.decide': ['distributor_admin'],
  /** book money a garage on account terms paid (bank transfer, cheque) against its balance */
  'payments.record': ['distributor_admin'],
  'tiers.manage': ['distributor_admin'],
  'distributor.staff': ['distributor_admin'],
  'audit.view': ['distributor_admin'],
  /** the statements and overdue reminders e-mailed to garages */
  'accountReminders.view': ['distributor_admin'],
  // the view from above: figures of the business over a date range
  'dashboard.distributor': ['distributor_admin', 'counter_staff'],
  'dashboard.garage': ['garage_manager'],
} as const satisfies Record<string, readonly Role[]>

export type Ability = keyof typeof ABILITIES

/** True when `role` is granted `ability`. Unknown roles are granted nothing. */
export function can(role: Role | undefined | null, ability: Ability): boolean {
  if (!role) return false
  return (ABILITIES[ability] as readonly Role[]).includes(role)
}

export function isDistributorRole(role: Role | undefined | null): boolean {
  return role === 'distributor_admin' || role === 'counter_staff'
}
