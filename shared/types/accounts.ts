import { z } from 'zod'

export const ROLES = ['distributor_admin', 'counter_staff', 'garage_manager', 'garage_technician'] as const
export const RoleSchema = z.enum(ROLES)
export type Role = z.infer<typeof RoleSchema>

export const DISTRIBUTOR_ROLES = ['distributor_admin', 'counter_staff'] as const satisfies readonly Role[]
export const GARAGE_ROLES = ['garage_manager', 'garage_technician'] as const satisfies readonly Role[]

export type OrgKind = 'distributor' | 'garage'
export type OrgStatus = 'pending' | 'approved' | 'rejected' | 'suspended'
export type PaymentTerms = 'card' | 'account'
export type UserStatus = 'active' | 'invited' | 'removed'

/** What the client knows about the signed-in person: small on purpose (the cookie stays far under 4 KB). */
export interface SessionUser {
  id: number
  name: string
  role: Role
  organisationId: number
  organisationKind: OrgKind
}

export const ROLE_LABELS: Record<Role, string> = {
  distributor_admin: 'Distributor admin',
  counter_staff: 'Counter staff',
  garage_manager: 'Garage manager',
  garage_technician: 'Technician',
}
