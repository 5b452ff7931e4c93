/**
 * Who is calling. `server/middleware/10.session.ts` resolves the caller from the server-side session record
 * on every request (role and account status read from the database, never from the cookie) and puts it in
 * `event.context.auth`. Routes then call `requireAuth` / `requireAbility` first.
 */
import type { H3Event } from 'h3'
import { forbidden, unauthenticated } from '../services/errors'
import type { Organisation, User } from '../models/accounts'
import { can, type Ability } from '../../shared/utils/abilities'
import { staffAbility } from '../services/staff'

export interface AuthContext {
  user: User
  org: Organisation
  sessionId: string
}

declare module 'h3' {
  interface H3EventContext {
    auth?: AuthContext | null
  }
}

interface RequireOptions {
  /** pending/rejected garages may still read their own application status */
  allowUnapproved?: boolean
  /** a suspended garage may still read its statement and documents, to settle what it owes */
  allowSuspended?: boolean
}

/** 401 without a live session; 403 when the organisation is not approved (suspended, pending, rejected). */
export function requireAuth(event: H3Event, options: RequireOptions = {}): AuthContext {
  const auth = event.context.auth
  if (!auth) throw unauthenticated()
  const suspendedLetIn = options.allowSuspended && auth.org.status === 'suspended'
  if (!options.allowUnapproved && !suspendedLetIn && auth.org.status !== 'approved') {
    const why = auth.org.status === 'suspended'
      ? `This trade account is suspended${auth.org.decisionReason ? ` (${auth.org.decisionReason})` : ''}: only the statement and documents stay open. Please contact the distributor.`
      : 'This trade account has not been approved yet.'
    throw forbidden(why)
  }
  return auth
}

/** `requireAuth` plus the role check from shared/utils/abilities.ts (403). */
export function requireAbility(event: H3Event, ability: Ability, options: RequireOptions = {}): AuthContext {
  const auth = requireAuth(event, options)
  if (!can(auth.user.role, ability)) {
    throw forbidden()
  }
  return auth
}

export function isDistributor(auth: AuthContext): boolean {
  return auth.org.kind === 'distributor'
}

/** 401 / 403 (pending garage, wrong role) for the staff routes: managers for a garage, the admin for the distributor. */
export function requireStaffManager(event: H3Event): AuthContext {
  const auth = event.context.auth
  return requireAbility(event, auth ? staffAbility(auth) : 'garage.staff')
}
