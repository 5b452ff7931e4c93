/**
 * The half-signed state between a right password and the second factor. No session exists yet: the browser holds a
 * random value in a short-lived cookie, the database its SHA-256 (`sign_in_challenges`), good for one completion,
 * five tries and a few minutes, and only while the person's session version is the one the password was checked
 * against. Completing it checks the code (or, for a first enrolment, confirms the new secret) and hands back the
 * person for the route to start the session. Plain Node.
 */
import { randomBytes } from 'node:crypto'
import type { Transaction } from 'sequelize'
import { Organisation, User } from '../models/accounts'
import { SignInChallenge, type ChallengePurpose } from '../models/second-factor'
import { withWrite } from '../utils/db'
import { audit } from '../utils/audit'
import type { EnrolmentView } from '../../shared/types/second-factor'
import { DomainError, unauthenticated } from './errors'
import { beginEnrolment, checkSecondFactor, confirmEnrolment, enrolledFactor, secondFactorRequired } from './second-factor'
import { securityEvent } from './security-log'
import { admitCode, countWrongCode } from './throttle'
import { hashToken } from './tokens'

export const CHALLENGE_MINUTES: Record<ChallengePurpose, number> = { verify: 5, enrol: 15 }
export const MAX_TRIES = 5
const EXPIRED = 'This sign-in has expired. Please sign in again with your password.'

export interface SecondStep {
  /** the value for the browser's cookie */
  token: string
  maxAgeSeconds: number
  enrolment?: EnrolmentView
}

/**
 * What a person whose password was right needs next: null when they sign in at once, else a challenge (with the
 * secret to add to their app when they must enrol first).
 */
export async function secondStepFor(user: User): Promise<SecondStep | null> {
  const enrolled = await enrolledFactor(user.id)
  if (!enrolled && !secondFactorRequired(user.role)) return null
  const purpose: ChallengePurpose = enrolled ? 'verify' : 'enrol'
  const enrolment = enrolled ? undefined : await beginEnrolment(user)
  const token = randomBytes(32).toString('base64url')
  const minutes = CHALLENGE_MINUTES[purpose]
  await withWrite((t) => SignInChallenge.create({
    id: hashToken(token), userId: user.id, purpose, sessionVersion: user.sessionVersion,
    expiresAt: new Date(Date.now() + minutes * 60_000),
  }, { transaction: t }))
  return { token, maxAgeSeconds: minutes * 60, ...(enrolment ? { enrolment } : {}) }
}

export interface Completed { user: User; org: Organisation; recoveryCodes?: string[] }

/**
 * Completes a challenge with a code: 401 when it is unknown, used, expired, out of tries or the person changed
 * meanwhile; 429 after too many wrong codes for the person; 401 naming `code` for a wrong or already used code.
 */
export async function completeChallenge(token: string, code: string, address: string): Promise<Completed> {
  const row = await SignInChallenge.findByPk(hashToken(token))
  if (!row || row.usedAt || row.expiresAt <= new Date()) throw unauthenticated(EXPIRED)
  await admitCode(row.userId)
  const user = await User.findOne({ where: { id: row.userId, status: 'active' } })
  const org = user ? await Organisation.findByPk(user.organisationId) : null
  if (!user || !org || user.sessionVersion !== row.sessionVersion) throw unauthenticated(EXPIRED)
  const [tried] = await withWrite((t) => SignInChallenge.update({ attempts: row.attempts + 1 }, {
    where: { id: row.id, attempts: row.attempts, usedAt: null }, transaction: t,
  }))
  if (tried !== 1 || row.attempts + 1 > MAX_TRIES) throw unauthenticated('Too many tries for this sign-in. Please sign in again with your password.')

  if (row.purpose === 'enrol') {
    const recoveryCodes = await withWrite(async (t) => {
      const codes = await confirmEnrolment(t, user.id, code)
      if (codes) await markUsed(row, t, user, 'user.mfa_enrolled')
      return codes
    })
    if (!recoveryCodes) throw await wrongCode(user, address, 'wrong')
    securityEvent('mfa.enrolled', { userId: user.id, organisationId: org.id, address }, 'info')
    return { user, org, recoveryCodes }
  }
  const check = await checkSecondFactor(user.id, code)
  if (!check.ok) throw await wrongCode(user, address, check.reason)
  if (check.via === 'recovery') securityEvent('mfa.recovery_code_used', { userId: user.id, organisationId: org.id, address }, 'info')
  await withWrite((t) => markUsed(row, t))
  return { user, org }
}

async function markUsed(row: SignInChallenge, t: Transaction, user?: User, auditAction?: string): Promise<void> {
  await SignInChallenge.update({ usedAt: new Date() }, { where: { id: row.id }, transaction: t })
  if (user && auditAction) {
    await audit(t, { actorUserId: user.id, organisationId: user.organisationId, action: auditAction, entity: 'user', entityId: user.id })
  }
}

/** Counts the wrong code for the person (429 past the limit) and says what was wrong, on the field. */
async function wrongCode(user: User, address: string, reason: 'wrong' | 'used'): Promise<DomainError> {
  securityEvent('mfa.failed', { userId: user.id, organisationId: user.organisationId, address, reason })
  await countWrongCode(user.id)
  const message = reason === 'used'
    ? 'That code has already been used. Wait for the next code in your app.'
    : 'That code is not right. Check the time on your phone, or use a recovery code.'
  return new DomainError('unauthenticated', message, { fields: { code: message } })
}
