import { describe, expect, it } from 'vitest'
import { ABILITIES, can, type Ability } from '#shared/utils/abilities'
import { ROLES, type Role } from '#shared/types/accounts'

// The role matrix the product is built on (roles as the trade-accounts issue defines them).
const grants: Record<Role, Ability[]> = {
  distributor_admin: ['tradeAccounts.decide', 'payments.record', 'tiers.manage', 'distributor.staff', 'priceFiles.manage', 'orders.work', 'catalogue.edit', 'audit.view'],
  counter_staff: ['priceFiles.manage', 'orders.work', 'catalogue.edit', 'coreReturns.decide'],
  garage_manager: ['quotes.send', 'quotes.price', 'orders.place', 'orders.pay', 'garage.staff', 'garage.settings', 'statement.view'],
  garage_technician: ['catalogue.view', 'quotes.draft', 'inspections.record', 'calculations.use'],
}
const denies: Record<Role, Ability[]> = {
  distributor_admin: ['quotes.send', 'orders.pay', 'garage.staff'],
  counter_staff: ['tradeAccounts.decide', 'payments.record', 'tiers.manage', 'distributor.staff', 'quotes.draft'],
  garage_manager: ['tradeAccounts.decide', 'payments.record', 'priceFiles.manage', 'orders.work', 'catalogue.edit', 'coreReturns.decide'],
  garage_technician: ['quotes.send', 'quotes.price', 'orders.place', 'orders.pay', 'garage.staff', 'statement.view', 'priceFiles.manage'],
}

describe('abilities', () => {
  for (const role of ROLES) {
    it(`grants ${role} what the role is for`, () => {
      for (const a of grants[role]) expect(can(role, a), a).toBe(true)
    })
    it(`denies ${role} what belongs to others`, () => {
      for (const a of denies[role]) expect(can(role, a), a).toBe(false)
    })
  }
  it('grants nothing without a role', () => {
    for (const a of Object.keys(ABILITIES) as Ability[]) expect(can(undefined, a)).toBe(false)
  })
})
