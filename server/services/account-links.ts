/**
 * The e-mailed single-use links of a person's account: choosing a new password (one hour) and accepting an
 * invitation (7 days). Using one sets the password and ends every session the person had. Plain Node.
 */
import { Organisation, User } from '../models/accounts'
import { withWrite } from '../utils/db'
import { audit } from '../utils/audit'
import { appLink, sendMail } from '../utils/mail'
import type { Role } from '../../shared/types/accounts'
import { accountMail } from './account-mail'
import { hashPasswordOutsideNitro } from './password'
import { endSessions } from './session-ends'
import { forgetSignInFailures, mayRequestReset } from './throttle'
import { deadLink, findLiveToken, issueToken, useToken } from './tokens'

/**
 * E-mails a reset link to an active person with a password, unless requests for this e-mail or address are over
 * their quiet cap (the form cannot flood an inbox). Never throws: the caller answers the same either way, so
 * whether an address has an account never shows.
 */
export async function sendResetLink(email: string, address: string): Promise<void> {
  try {
    if (!(await mayRequestReset(email, address))) return
    const user = await User.findOne({ where: { email, status: 'active' } })
    if (!user || !user.passwordHash) return
    const token = await withWrite((t) => issueToken(t, user.id, 'reset'))
    await sendMail({ to: user.email, ...accountMail.resetLink({ name: user.name, url: appLink(`/reset/${token}`) }) })
  } catch (err) {
    console.error('[boreline] reset link not sent:', (err as Error).message)
  }
}

/** Whose password a live reset link sets (410 otherwise). */
export async function resetLinkEmail(token: string): Promise<{ email: string }> {
  const row = await findLiveToken(token, 'reset')
  const user = row ? await User.findOne({ where: { id: row.userId, status: 'active' } }) : null
  if (!user) throw deadLink()
  return { email: user.email }
}

/** Uses the reset link (410 when expired, used or unknown) and sets the new password; the person signs in again. */
export async function resetPassword(token: string, password: string): Promise<void> {
  const passwordHash = await hashPasswordOutsideNitro(password)
  const user = await withWrite(async (t) => {
    const row = await useToken(t, token, 'reset')
    const user = row ? await User.findOne({ where: { id: row.userId, status: 'active' }, transaction: t }) : null
    if (!user) throw deadLink()
    await User.update({ passwordHash, sessionVersion: user.sessionVersion + 1 }, { where: { id: user.id }, transaction: t })
    await endSessions(t, [user.id])
    await audit(t, { actorUserId: user.id, organisationId: user.organisationId, action: 'user.password_reset', entity: 'user', entityId: user.id })
    return user
  })
  // the owner of the address has proved themselves: they may sign in at once
  await forgetSignInFailures(user.email)
}

/** Who a live invitation is for and where to (410 otherwise). */
export async function invitationOf(token: string): Promise<{ email: string; name: string; role: Role; organisation: string }> {
  const row = await findLiveToken(token, 'invite')
  const user = row ? await User.findOne({ where: { id: row.userId, status: 'invited' } }) : null
  const org = user ? await Organisation.findByPk(user.organisationId) : null
  if (!user || !org) throw deadLink()
  return { email: user.email, name: user.name, role: user.role, organisation: org.name }
}

/**
 * Uses the invitation (410 when expired, used, unknown or the person was removed meanwhile), sets the password
 * and activates the person, who then signs in. Returns their e-mail.
 */
export async function acceptInvitation(token: string, password: string, name?: string): Promise<string> {
  const passwordHash = await hashPasswordOutsideNitro(password)
  const user = await withWrite(async (t) => {
    const row = await useToken(t, token, 'invite')
    const user = row ? await User.findOne({ where: { id: row.userId, status: 'invited' }, transaction: t }) : null
    if (!user) throw deadLink()
    await User.update(
      { passwordHash, status: 'active', ...(name ? { name } : {}), sessionVersion: user.sessionVersion + 1 },
      { where: { id: user.id, status: 'invited' }, transaction: t },
    )
    await audit(t, {
      actorUserId: user.id, organisationId: user.organisationId, action: 'user.invitation_accepted', entity: 'user', entityId: user.id,
      changes: { status: { from: 'invited', to: 'active' }, ...(name && name !== user.name ? { name: { from: user.name, to: name } } : {}) },
    })
    return user
  })
  return user.email
}
