/**
 * The main navigation. Each entry names the ability it needs (shared/utils/abilities.ts) and which side of the
 * trade sees it; the header shows only what the signed-in person may use. Add an entry when a page lands.
 */
import type { Ability } from '#shared/utils/abilities'
import type { OrgKind } from '#shared/types/accounts'

export interface NavEntry {
  to: string
  label: string
  ability: Ability
  side: OrgKind | 'both'
  /** kept under "More" on a desk-wide header (set-up and records looked at now and then), so one row holds the rest */
  more?: true
}

export const NAV_ENTRIES: NavEntry[] = [
  { to: '/catalogue', label: 'Find by vehicle', ability: 'catalogue.view', side: 'both' },
  { to: '/catalogue/search', label: 'Part search', ability: 'catalogue.view', side: 'both' },
  { to: '/calculations/bore-check', label: 'Bore check', ability: 'calculations.use', side: 'both' },
  { to: '/garage/vehicles', label: 'Vehicles', ability: 'vehicles.use', side: 'garage' },
  { to: '/inspections', label: 'Inspections', ability: 'inspections.record', side: 'garage' },
  { to: '/quotes', label: 'Quotes', ability: 'quotes.draft', side: 'garage' },
  { to: '/admin/applications', label: 'Applications', ability: 'tradeAccounts.decide', side: 'distributor' },
  { to: '/admin/trade-accounts', label: 'Trade accounts', ability: 'tradeAccounts.view', side: 'distributor' },
  { to: '/admin/tiers', label: 'Tiers', more: true, ability: 'tiers.manage', side: 'distributor' },
  { to: '/admin/account-reminders', label: 'Reminders sent', more: true, ability: 'accountReminders.view', side: 'distributor' },
  { to: '/dashboard', label: 'Dashboard', ability: 'dashboard.distributor', side: 'distributor' },
  { to: '/dashboard', label: 'Dashboard', ability: 'dashboard.garage', side: 'garage' },
  { to: '/price-files', label: 'Price files', ability: 'priceFiles.manage', side: 'distributor' },
  { to: '/orders', label: 'Orders', ability: 'orders.place', side: 'garage' },
  { to: '/statement', label: 'Statement', ability: 'statement.view', side: 'garage' },
  { to: '/counter/orders', label: 'Order queue', ability: 'orders.work', side: 'distributor' },
  { to: '/counter/core-returns', label: 'Core returns', ability: 'coreReturns.decide', side: 'distributor' },
  { to: '/counter/returns', label: 'Returns in', ability: 'returns.decide', side: 'distributor' },
  { to: '/labour-times', label: 'Labour guide', more: true, ability: 'labour.guide', side: 'distributor' },
  { to: '/labour-times', label: 'Labour guide', more: true, ability: 'labour.ownHours', side: 'garage' },
  { to: '/garage/settings', label: 'Garage settings', more: true, ability: 'garage.settings', side: 'garage' },
  { to: '/staff', label: 'Staff', more: true, ability: 'garage.staff', side: 'garage' },
  { to: '/staff', label: 'Staff', more: true, ability: 'distributor.staff', side: 'distributor' },
]
