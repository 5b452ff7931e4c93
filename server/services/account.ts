/**
 * A person's own account: their sign-in details and profile, and the standing of their organisation as they may
 * see it. Plain Node.
 */
import { DiscountTier, SessionRecord, User, type Organisation } from '../models/accounts'
import { withWrite } from '../utils/db'
import { audit } from '../utils/audit'
import { can } from '../../shared/utils/abilities'
import type { ProfileInput } from '../../shared/schemas/accounts'
import type { AccountOverview, PersonView } from '../../shared/types/trade-accounts'
import { changedFields } from './audit-changes'
import { invalidInput } from './errors'
import { hashPasswordOutsideNitro, verifyPasswordOutsideNitro } from './password'
import { assertStrongPassword } from './password-strength'
import { securityEvent } from './security-log'
import { endSessions } from './session-ends'
import { personView } from './staff'
import { passwordAttempt } from './throttle'
import { tierView } from './trade-accounts'

/** The profile and the organisation's standing; tier and terms only for those who handle a garage's money. */
export async function accountOverview(user: User, org: Organisation): Promise<AccountOverview> {
  const seesTerms = org.kind === 'distributor' || can(user.role, 'statement.view')
  const garageTerms = seesTerms && org.kind === 'garage'
  const tier = seesTerms && org.tierId ? await DiscountTier.findByPk(org.tierId) : null
  return {
    profile: personView(user),
    organisation: {
      id: org.id, name: org.name, kind: org.kind, status: org.status, decisionReason: org.decisionReason ?? null,
      tier: tierView(tier),
      terms: garageTerms ? org.paymentTerms : null,
      creditLimitMinor: garageTerms ? org.creditLimitMinor : null,
      paymentDays: garageTerms ? org.paymentDays : null,
    },
  }
}

/** Name and phone, audited with what changed. */
export async function changeProfile(user: User, input: ProfileInput): Promise<PersonView> {
  const changes = changedFields({ name: user.name, phone: user.phone }, input)
  if (Object.keys(changes).length) {
    await withWrite(async (t) => {
      await User.update(input, { where: { id: user.id }, fields: ['name', 'phone'], transaction: t })
      await audit(t, { actorUserId: user.id, organisationId: user.organisationId, action: 'user.profile_changed', entity: 'user', entityId: user.id, changes })
    })
  }
  return personView((await User.findByPk(user.id))!)
}

/**
 * A new password, given the current one: that check is counted like a sign-in attempt, so a borrowed session
 * cannot guess it. Every other session of the person ends; `sessionId` (this one) moves to the new version.
 */
export async function changePassword(user: User, sessionId: string, input: { currentPassword: string; newPassword: string }, address: string): Promise<void> {
  const release = await passwordAttempt(user.email, address)
  if (!user.passwordHash || !(await verifyPasswordOutsideNitro(user.passwordHash, input.currentPassword))) {
    throw invalidInput({ currentPassword: 'That is not your current password.' })
  }
  await release()
  if (input.newPassword === input.currentPassword) throw invalidInput({ newPassword: 'Choose a password different from the current one.' })
  assertStrongPassword(input.newPassword, 'newPassword', [user.email, user.name])
  const passwordHash = await hashPasswordOutsideNitro(input.newPassword)
  const version = user.sessionVersion + 1
  await withWrite(async (t) => {
    await User.update({ passwordHash, sessionVersion: version }, { where: { id: user.id }, transaction: t })
    await SessionRecord.update({ sessionVersion: version }, { where: { id: sessionId }, transaction: t })
    await endSessions(t, [user.id], sessionId)
    await audit(t, { actorUserId: user.id, organisationId: user.organisationId, action: 'user.password_changed', entity: 'user', entityId: user.id })
  })
  securityEvent('password.changed', { userId: user.id, organisationId: user.organisationId, address }, 'info')
}
