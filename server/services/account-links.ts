/**
 * The e-mailed single-use links of a person's account: choosing a new password (one hour) and accepting an
 * invitation (7 days). Using one sets the password and ends every session the person had. Every request that
 * presents a link is throttled per address, and the link is checked *before* the new password is looked at or
 * hashed: a made-up token costs a hash lookup, never 128 MiB of scrypt. Plain Node.
 */
import { Organisation, User } from '../models/accounts'
import { withWrite } from '../utils/db'
import { audit } from '../utils/audit'
import { appLink, sendMail } from '../utils/mail'
import type { Role } from '../../shared/types/accounts'
import { accountMail } from './account-mail'
import { hashPasswordOutsideNitro } from './password'
import { assertStrongPassword } from './password-strength'
import { securityEvent } from './security-log'
import { endSessions } from './session-ends'
import { admitLinkUse, forgetSignInFailures, mayRequestReset } from './throttle'
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

/** Whose password a live reset link sets (410 otherwise; 429 past the address's limit). */
export async function resetLinkEmail(token: string, address: string): Promise<{ email: string }> {
  const user = await liveLinkUser(token, 'reset', address)
  return { email: user.email }
}

/**
 * The person a live link of this kind is for: 429 once the address has presented too many links, 410 (logged) when
 * the link is expired, used, unknown or its person is no longer who it was made for. Read-only.
 */
async function liveLinkUser(token: string, kind: 'reset' | 'invite', address: string): Promise<User> {
  await admitLinkUse(address)
  const row = await findLiveToken(token, kind)
  const user = row ? await User.findOne({ where: { id: row.userId, status: kind === 'reset' ? 'active' : 'invited' } }) : null
  if (!user) {
    securityEvent('link.invalid', { address, reason: kind })
    throw deadLink()
  }
  return user
}

/**
 * Uses the reset link (410 when expired, used or unknown: checked first, before anything is hashed; 422 for a
 * password that is too easy to guess) and sets the new password; the person signs in again, with no delay left from
 * failed attempts.
 */
export async function resetPassword(token: string, password: string, address: string): Promise<void> {
  const found = await liveLinkUser(token, 'reset', address)
  assertStrongPassword(password, 'password', [found.email, found.name])
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
  securityEvent('password.reset', { userId: user.id, organisationId: user.organisationId, address }, 'info')
  // the owner of the address has proved themselves: they may sign in at once
  await forgetSignInFailures(user.email)
}

/** Who a live invitation is for and where to (410 otherwise; 429 past the address's limit). */
export async function invitationOf(token: string, address: string): Promise<{ email: string; name: string; role: Role; organisation: string }> {
  const user = await liveLinkUser(token, 'invite', address)
  const org = await Organisation.findByPk(user.organisationId)
  if (!org) throw deadLink()
  return { email: user.email, name: user.name, role: user.role, organisation: org.name }
}

/**
 * Uses the invitation (410 when expired, used, unknown or the person was removed meanwhile: checked before anything
 * is hashed; 422 for a password that is too easy to guess), sets the password and activates the person, who then
 * signs in. Returns their e-mail.
 */
export async function acceptInvitation(token: string, password: string, name: string | undefined, address: string): Promise<string> {
  const found = await liveLinkUser(token, 'invite', address)
  assertStrongPassword(password, 'password', [found.email, found.name, name ?? ''])
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
