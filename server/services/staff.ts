/**
 * Who may manage whom. A garage manager manages the garage's managers and technicians; a distributor admin
 * manages counter staff. Nobody changes or removes themselves (a garage always keeps the manager acting now).
 */
import { User } from '../models/accounts'
import type { AuthContext } from '../utils/auth'
import type { Role } from '../../shared/types/accounts'
import { notFound, conflict, forbidden } from './errors'

export function staffAbility(auth: AuthContext) {
  return auth.org.kind === 'garage' ? 'garage.staff' as const : 'distributor.staff' as const
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
    throw conflict('You cannot change or remove yourself; ask another manager.')
  }
  if (!isManageable(auth, target)) throw forbidden('Your role does not allow managing this person.')
  return target
}
