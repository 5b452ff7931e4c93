/**
 * The people of the caller's own organisation, and who may manage whom. A garage manager manages the garage's
 * managers and technicians; a distributor admin manages counter staff. Nobody changes or removes themselves (a
 * garage always keeps the manager acting now). Invitations go out by e-mail after the commit. Plain Node.
 */
import { Op, UniqueConstraintError } from 'sequelize'
import { User } from '../models/accounts'
import type { AuthContext } from '../utils/auth'
import { withWrite } from '../utils/db'
import { audit } from '../utils/audit'
import { appLink, sendMail } from '../utils/mail'
import { pageOf } from '../utils/page'
import { ROLE_LABELS, type Role } from '../../shared/types/accounts'
import type { PageQuery } from '../../shared/schemas/page'
import type { PersonView, StaffList } from '../../shared/types/trade-accounts'
import { accountMail } from './account-mail'
import { enrolledAmong, removeFactor } from './second-factor'
import { securityEvent } from './security-log'
import { endSessions } from './session-ends'
import { issueToken, voidTokensOf } from './tokens'
import { conflict, forbidden, invalidInput, notFound } from './errors'

/** The caller as the staff rules see them: who, and of which organisation. */
export type Manager = Pick<AuthContext, 'user' | 'org'>

export function personView(u: User): PersonView {
  return {
    id: u.id, name: u.name, email: u.email, phone: u.phone ?? '', role: u.role, status: u.status,
    lastSignInAt: u.lastSignInAt ? new Date(u.lastSignInAt).toISOString() : null,
  }
}

export function staffAbility(auth: Pick<AuthContext, 'org'>) {
  return auth.org.kind === 'garage' ? 'garage.staff' as const : 'distributor.staff' as const
}

export function assignableRoles(auth: Pick<AuthContext, 'org'>): Role[] {
  return auth.org.kind === 'garage' ? ['garage_manager', 'garage_technician'] : ['counter_staff']
}

export function isManageable(auth: Manager, target: User): boolean {
  return target.id !== auth.user.id && target.status !== 'removed' && assignableRoles(auth).includes(target.role)
}

/** 422 on `role` unless the caller may give it; `lead` starts the message ("Choose", "You can invite:"). */
function checkAssignable(auth: Manager, role: Role, lead: string): void {
  const roles = assignableRoles(auth)
  if (!roles.includes(role)) throw invalidInput({ role: `${lead} ${roles.map((r) => ROLE_LABELS[r].toLowerCase()).join(' or ')}.` })
}

/** One page of the organisation's people (removed people left out), by name, with the roles the caller may give. */
export async function listStaff(auth: Manager, query: PageQuery): Promise<StaffList> {
  const page = await pageOf(
    query,
    (window) => User.findAndCountAll({ where: { organisationId: auth.org.id, status: { [Op.ne]: 'removed' } }, order: [['name', 'ASC'], ['id', 'ASC']], ...window }),
    async (people) => {
      const withFactor = await enrolledAmong(people.map((p) => p.id))
      return people.map((p) => ({ ...personView(p), manageable: isManageable(auth, p), isYou: p.id === auth.user.id, secondFactor: withFactor.has(p.id) }))
    },
  )
  return { ...page, assignableRoles: assignableRoles(auth) }
}

/**
 * The colleague with this id in the caller's own organisation: 404 when it is someone else's (never reveal
 * that the id exists), 409 for oneself, 403 when the caller's role may not manage that person's role.
 */
export async function loadManageable(auth: Manager, id: number): Promise<User> {
  const target = await User.findOne({ where: { id, organisationId: auth.org.id } })
  if (!target || target.status === 'removed') throw notFound('Person')
  if (target.id === auth.user.id) {
    throw conflict('You cannot change or remove yourself; ask another manager.')
  }
  if (!isManageable(auth, target)) throw forbidden('Your role does not allow managing this person.')
  return target
}

const TAKEN = 'This e-mail already belongs to a Boreline account.'

/**
 * Invites a colleague with a single-use link to set a password (valid 7 days). Inviting someone already invited
 * sends a fresh link; a removed colleague of the same organisation can be invited back. 422 for a role the caller
 * may not give or an e-mail that belongs to someone else's sign-in.
 */
export async function inviteColleague(auth: Manager, input: { email: string; name: string; role: Role }): Promise<PersonView> {
  checkAssignable(auth, input.role, 'You can invite:')
  const { person, token } = await withWrite(async (t) => {
    const existing = await User.findOne({ where: { email: input.email }, transaction: t })
    if (existing && (existing.organisationId !== auth.org.id || existing.status === 'active')) throw invalidInput({ email: TAKEN })
    let person: User
    if (existing) {
      await User.update(
        { name: input.name, role: input.role, status: 'invited', passwordHash: null, sessionVersion: existing.sessionVersion + 1 },
        { where: { id: existing.id }, transaction: t },
      )
      person = (await User.findByPk(existing.id, { transaction: t }))!
    } else {
      person = await User.create({ organisationId: auth.org.id, email: input.email, name: input.name, role: input.role, status: 'invited', passwordHash: null }, { transaction: t })
    }
    const token = await issueToken(t, person.id, 'invite', auth.user.id)
    await audit(t, {
      actorUserId: auth.user.id, organisationId: auth.org.id, action: 'user.invited', entity: 'user', entityId: person.id,
      changes: { email: input.email, role: { from: existing?.role ?? null, to: input.role }, status: { from: existing?.status ?? null, to: 'invited' } },
    })
    return { person, token }
  }).catch((err) => {
    if (err instanceof UniqueConstraintError) throw invalidInput({ email: TAKEN })
    throw err
  })
  await sendMail({
    to: person.email,
    ...accountMail.invitation({ name: person.name, inviter: auth.user.name, organisation: auth.org.name, role: person.role, url: appLink(`/invite/${token}`) }),
  })
  return personView(person)
}

/** Gives a colleague another role within what the caller may give; it counts from their next request. */
export async function changeRole(auth: Manager, target: User, role: Role): Promise<PersonView> {
  checkAssignable(auth, role, 'Choose')
  if (role !== target.role) {
    await withWrite(async (t) => {
      await User.update({ role }, { where: { id: target.id }, transaction: t })
      await audit(t, { actorUserId: auth.user.id, organisationId: auth.org.id, action: 'user.role_changed', entity: 'user', entityId: target.id, changes: { role: { from: target.role, to: role } } })
    })
    securityEvent('role.changed', { userId: auth.user.id, organisationId: auth.org.id, targetUserId: target.id, reason: `${target.role} to ${role}` }, 'info')
  }
  return personView((await User.findByPk(target.id))!)
}

/**
 * Removes a colleague: every session of theirs ends at once and their open links stop working. The row stays
 * (the audit log points at it).
 */
export async function removeColleague(auth: Manager, target: User): Promise<void> {
  await withWrite(async (t) => {
    await User.update({ status: 'removed', sessionVersion: target.sessionVersion + 1 }, { where: { id: target.id }, transaction: t })
    await voidTokensOf(t, [target.id])
    await endSessions(t, [target.id])
    await audit(t, { actorUserId: auth.user.id, organisationId: auth.org.id, action: 'user.removed', entity: 'user', entityId: target.id, changes: { status: { from: target.status, to: 'removed' }, role: target.role } })
  })
  securityEvent('person.removed', { userId: auth.user.id, organisationId: auth.org.id, targetUserId: target.id }, 'info')
}

/**
 * Resets a colleague's two-step sign-in (their app and recovery codes stop working, e.g. after a lost phone): every
 * session of theirs ends, and at their next sign-in distributor staff set up an app again. Audited; they are e-mailed.
 * 409 when they have none.
 */
export async function resetSecondFactor(auth: Manager, target: User): Promise<PersonView> {
  const had = await enrolledAmong([target.id])
  if (!had.size) throw conflict(`${target.name} does not use two-step sign-in.`)
  await withWrite(async (t) => {
    await removeFactor(t, target.id)
    await User.update({ sessionVersion: target.sessionVersion + 1 }, { where: { id: target.id }, transaction: t })
    await endSessions(t, [target.id])
    await audit(t, { actorUserId: auth.user.id, organisationId: auth.org.id, action: 'user.mfa_reset', entity: 'user', entityId: target.id })
  })
  securityEvent('mfa.reset', { userId: auth.user.id, organisationId: auth.org.id, targetUserId: target.id }, 'info')
  await sendMail({ to: target.email, ...accountMail.secondFactorReset({ name: target.name, by: auth.user.name, signInUrl: appLink('/sign-in') }) })
  return personView((await User.findByPk(target.id))!)
}
