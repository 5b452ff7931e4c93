/**
 * Who may manage whom. A garage manager manages the garage's managers and technicians; a distributor admin
 * manages counter staff. Nobody changes or removes themselves (a garage always keeps the manager acting now).
 */
import { createError, type H3Event } from 'h3'
import { User } from '../models/accounts'
import { requireAbility, type AuthContext } from '../utils/auth'
import { notFound } from '../utils/validate'
import type { Role } from '../../shared/types/accounts'

export function staffAbility(auth: AuthContext) {
  return auth.org.kind === 'garage' ? 'garage.staff' as const : 'distributor.staff' as const
}

/** 401 / 403 (pending garage, wrong role) for the staff routes. */
export function requireStaffManager(event: H3Event): AuthContext {
  const auth = event.context.auth
  return requireAbility(event, auth ? staffAbility(auth) : 'garage.staff')
}

export function assignableRoles(auth: AuthContext): Role[] {
  return auth.org.kind === 'garage' ? ['garage_manager', 'garage_technician'] : ['counter_staff']
}

export function isManageable(auth: AuthContext, target: User): boolean {
  return target.id !== auth.user.id && target.status !== 'removed' && assignableRoles(auth).includes(target.role)
}

/**
 * The colleague with this id in the caller's own organisation: 404 when it is someone else's (never reveal
 * that the id exists), 409 for oneself, 403 when the caller's role may not manage that person's role.
 */
export async function loadManageable(auth: AuthContext, id: number): Promise<User> {
  const target = await User.findOne({ where: { id, organisationId: auth.org.id } })
  if (!target || target.status === 'removed') throw notFound('Person')
  if (target.id === auth.user.id) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'You cannot change or remove yourself; ask another manager.' })
  }
  if (!isManageable(auth, target)) throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: 'Your role does not allow managing this person.' })
  return target
}
