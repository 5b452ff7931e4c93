/**
 * A person's own two-step sign-in, from their account page: turning it on (a garage manager's choice; distributor
 * staff enrol at sign-in), moving it to a new phone, new recovery codes, and turning it off (not for distributor
 * staff). Each change to an existing factor needs a current code first, so a borrowed session cannot take the
 * factor over; each is audited and e-mailed to the person. Plain Node.
 */
import type { User } from '../models/accounts'
import { withWrite } from '../utils/db'
import { audit } from '../utils/audit'
import { sendMail } from '../utils/mail'
import type { EnrolmentView, SecondFactorStatus } from '../../shared/types/second-factor'
import { accountMail } from './account-mail'
import { conflict, forbidden, invalidInput } from './errors'
import {
  beginEnrolment, checkSecondFactor, confirmEnrolment, enrolledFactor, removeFactor, replaceRecoveryCodes,
  secondFactorAllowed, secondFactorRequired, secondFactorStatus,
} from './second-factor'
import { securityEvent, type SecurityEvent } from './security-log'
import { admitCode, countWrongCode } from './throttle'

/** 422 on `code` unless it is a current code of the person's factor (counted like any wrong code: 429 past the limit). */
async function requireCurrentCode(user: User, code: string | undefined, address: string): Promise<void> {
  await admitCode(user.id)
  const check = code ? await checkSecondFactor(user.id, code) : { ok: false as const, reason: 'wrong' as const }
  if (check.ok) return
  securityEvent('mfa.failed', { userId: user.id, organisationId: user.organisationId, address, reason: check.reason })
  await countWrongCode(user.id)
  throw invalidInput({ code: code ? 'That code is not right, or has been used already.' : 'Enter a current code from your authenticator app, or a recovery code.' })
}

/** Logs a change of the person's own factor (audited in its transaction) and e-mails them. */
async function recordChange(user: User, event: SecurityEvent, what: string, address: string): Promise<void> {
  securityEvent(event, { userId: user.id, organisationId: user.organisationId, address }, 'info')
  await sendMail({ to: user.email, ...accountMail.secondFactorChanged({ name: user.name, what }) })
}

/** Starts setting up an app (or moving to a new one, which needs a current code). 403 for roles without two steps. */
export async function startAccountEnrolment(user: User, code: string | undefined, address: string): Promise<EnrolmentView> {
  if (!secondFactorAllowed(user.role)) throw forbidden('Two-step sign-in is for managers and distributor staff.')
  if (await enrolledFactor(user.id)) await requireCurrentCode(user, code, address)
  return beginEnrolment(user)
}

/** Confirms the app with its first code: it becomes the factor, with ten new recovery codes (shown once). */
export async function confirmAccountEnrolment(user: User, code: string, address: string): Promise<{ recoveryCodes: string[]; status: SecondFactorStatus }> {
  if (!secondFactorAllowed(user.role)) throw forbidden('Two-step sign-in is for managers and distributor staff.')
  await admitCode(user.id)
  const recoveryCodes = await withWrite(async (t) => {
    const codes = await confirmEnrolment(t, user.id, code)
    if (codes) await audit(t, { actorUserId: user.id, organisationId: user.organisationId, action: 'user.mfa_enrolled', entity: 'user', entityId: user.id })
    return codes
  })
  if (!recoveryCodes) {
    await countWrongCode(user.id)
    throw invalidInput({ code: 'That code is not right. Enter the code your app shows now for Boreline.' })
  }
  await recordChange(user, 'mfa.enrolled', 'Two-step sign-in was set up with a new authenticator app.', address)
  return { recoveryCodes, status: await secondFactorStatus(user) }
}

/** Ten new recovery codes; the old ones stop working. */
export async function renewRecoveryCodes(user: User, code: string, address: string): Promise<{ recoveryCodes: string[] }> {
  if (!(await enrolledFactor(user.id))) throw conflict('Two-step sign-in is not on for your account.')
  await requireCurrentCode(user, code, address)
  const recoveryCodes = await withWrite(async (t) => {
    await audit(t, { actorUserId: user.id, organisationId: user.organisationId, action: 'user.mfa_recovery_codes_renewed', entity: 'user', entityId: user.id })
    return replaceRecoveryCodes(t, user.id)
  })
  await recordChange(user, 'mfa.recovery_codes_renewed', 'New recovery codes were made; the earlier ones no longer work.', address)
  return { recoveryCodes }
}

/** Turns two-step sign-in off (409 for distributor staff, who must keep it). */
export async function turnOffSecondFactor(user: User, code: string, address: string): Promise<SecondFactorStatus> {
  if (secondFactorRequired(user.role)) throw conflict('Distributor staff always sign in with two steps. To move to a new phone, set up the new app instead.')
  if (!(await enrolledFactor(user.id))) throw conflict('Two-step sign-in is not on for your account.')
  await requireCurrentCode(user, code, address)
  await withWrite(async (t) => {
    await removeFactor(t, user.id)
    await audit(t, { actorUserId: user.id, organisationId: user.organisationId, action: 'user.mfa_turned_off', entity: 'user', entityId: user.id })
  })
  await recordChange(user, 'mfa.turned_off', 'Two-step sign-in was turned off; you now sign in with your password alone.', address)
  return secondFactorStatus(user)
}
