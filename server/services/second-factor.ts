/**
 * A person's second factor: a TOTP authenticator app (totp.ts) and ten single-use recovery codes. Distributor staff
 * must have one; garage managers may turn one on; technicians do without. Enrolling shows a secret (as a QR code made
 * here, nothing fetched) that is kept pending until the person proves it with a first code. A code is accepted once:
 * its time step must be later than the last one used (one guarded UPDATE), and a recovery code is marked used the
 * same way. Plain Node.
 */
import { createHash, randomBytes, randomInt, timingSafeEqual } from 'node:crypto'
import { Op, type Transaction } from 'sequelize'
import QRCode from 'qrcode'
import type { User } from '../models/accounts'
import { RecoveryCode, SecondFactor } from '../models/second-factor'
import { withWrite } from '../utils/db'
import { DISTRIBUTOR_ROLES, type Role } from '../../shared/types/accounts'
import type { EnrolmentView, SecondFactorStatus } from '../../shared/types/second-factor'
import { openSecret, sealSecret } from './mfa-secrets'
import { matchingStep, newTotpSecret, otpauthUri } from './totp'

export const RECOVERY_CODE_COUNT = 10
const ENROLMENT_MINUTES = 30
// 32 letters and digits without 0/o, 1/l/i: 16 of them carry 80 bits
const ALPHABET = 'abcdefghjkmnpqrstuvwxyz23456789'
const RECOVERY_LENGTH = 16

export function secondFactorRequired(role: Role): boolean {
  return (DISTRIBUTOR_ROLES as readonly Role[]).includes(role)
}

export function secondFactorAllowed(role: Role): boolean {
  return secondFactorRequired(role) || role === 'garage_manager'
}

/** The person's confirmed factor, or null. */
export async function enrolledFactor(userId: number, t?: Transaction): Promise<SecondFactor | null> {
  const f = await SecondFactor.findByPk(userId, { transaction: t })
  return f?.secret ? f : null
}

export async function secondFactorStatus(user: User): Promise<SecondFactorStatus> {
  const f = await enrolledFactor(user.id)
  const left = f ? await RecoveryCode.count({ where: { userId: user.id, usedAt: null } }) : 0
  return {
    allowed: secondFactorAllowed(user.role), required: secondFactorRequired(user.role), enrolled: !!f,
    enrolledAt: f?.enrolledAt ? new Date(f.enrolledAt).toISOString() : null, recoveryCodesLeft: left,
  }
}

/**
 * Starts an enrolment, or resumes the one under way (the same secret until it lapses, so a reload shows the same
 * QR code): the secret is kept sealed and pending until `confirmEnrolment`.
 */
export async function beginEnrolment(user: Pick<User, 'id' | 'email'>): Promise<EnrolmentView> {
  const now = new Date()
  const existing = await SecondFactor.findByPk(user.id)
  if (existing?.pendingSecret && existing.pendingExpiresAt && existing.pendingExpiresAt > now) {
    return enrolmentView(openSecret(existing.pendingSecret), user.email)
  }
  const secret = newTotpSecret()
  const pending = { pendingSecret: sealSecret(secret), pendingExpiresAt: new Date(now.getTime() + ENROLMENT_MINUTES * 60_000) }
  await withWrite(async (t) => {
    const [row, created] = await SecondFactor.findOrCreate({ where: { userId: user.id }, defaults: { userId: user.id, ...pending }, transaction: t })
    if (!created) await row.update(pending, { transaction: t })
  })
  return enrolmentView(secret, user.email)
}

async function enrolmentView(secret: string, account: string): Promise<EnrolmentView> {
  const uri = otpauthUri(secret, account)
  const qrCode = await QRCode.toDataURL(uri, { errorCorrectionLevel: 'M', margin: 2, width: 240 })
  return { secret, otpauthUri: uri, qrCode, account }
}

/**
 * Confirms the pending secret with a first code from the app: it becomes the person's factor (replacing any earlier
 * one) with ten new recovery codes, returned once in the clear. null when the code does not match (or nothing is
 * pending). Runs inside the caller's write transaction.
 */
export async function confirmEnrolment(t: Transaction, userId: number, code: string): Promise<string[] | null> {
  const f = await SecondFactor.findByPk(userId, { transaction: t })
  if (!f?.pendingSecret || !f.pendingExpiresAt || f.pendingExpiresAt <= new Date()) return null
  const step = await matchingStep(openSecret(f.pendingSecret), normaliseCode(code), null)
  if (step === null) return null
  await f.update({ secret: f.pendingSecret, enrolledAt: new Date(), lastTimeStep: step, pendingSecret: null, pendingExpiresAt: null }, { transaction: t })
  return replaceRecoveryCodes(t, userId)
}

/** Ten fresh recovery codes (the old ones stop working); only a salted SHA-256 of each is kept. */
export async function replaceRecoveryCodes(t: Transaction, userId: number): Promise<string[]> {
  await RecoveryCode.destroy({ where: { userId }, transaction: t })
  const codes = Array.from({ length: RECOVERY_CODE_COUNT }, () => Array.from({ length: RECOVERY_LENGTH }, () => ALPHABET[randomInt(ALPHABET.length)]).join(''))
  await RecoveryCode.bulkCreate(codes.map((code) => {
    const salt = randomBytes(16).toString('hex')
    return { userId, salt, codeHash: recoveryHash(salt, code) }
  }), { transaction: t })
  return codes.map((c) => c.match(/.{4}/g)!.join('-'))
}

function recoveryHash(salt: string, code: string): string {
  return createHash('sha256').update(`${salt}:${code}`, 'utf8').digest('hex')
}

/** What a person typed, without spaces and dashes, lower case. */
export function normaliseCode(code: string): string {
  return code.replace(/[\s-]+/g, '').toLowerCase()
}

export type CodeCheck = { ok: true; via: 'app' | 'recovery' } | { ok: false; reason: 'wrong' | 'used' }

/**
 * Checks a code for a person with a confirmed factor: six digits from the app (one step either side of now, later
 * than the last step used) or one of their unused recovery codes. A match is taken by one guarded UPDATE, so two
 * requests with the same code cannot both pass.
 */
export async function checkSecondFactor(userId: number, code: string): Promise<CodeCheck> {
  const clean = normaliseCode(code)
  if (/^\d{6}$/.test(clean)) {
    const f = await enrolledFactor(userId)
    if (!f) return { ok: false, reason: 'wrong' }
    const secret = openSecret(f.secret!)
    const step = await matchingStep(secret, clean, f.lastTimeStep ?? null)
    if (step === null) return { ok: false, reason: (await matchingStep(secret, clean, null)) !== null ? 'used' : 'wrong' }
    const [taken] = await withWrite((t) => SecondFactor.update({ lastTimeStep: step }, {
      where: { userId, secret: f.secret!, [Op.or]: [{ lastTimeStep: null }, { lastTimeStep: { [Op.lt]: step } }] }, transaction: t,
    }))
    return taken === 1 ? { ok: true, via: 'app' } : { ok: false, reason: 'used' }
  }
  if (clean.length !== RECOVERY_LENGTH || !/^[a-z0-9]+$/.test(clean)) return { ok: false, reason: 'wrong' }
  const unused = await RecoveryCode.findAll({ where: { userId, usedAt: null } })
  const hit = unused.find((r) => timingSafeEqual(Buffer.from(recoveryHash(r.salt, clean), 'hex'), Buffer.from(r.codeHash, 'hex')))
  if (!hit) return { ok: false, reason: 'wrong' }
  const [taken] = await withWrite((t) => RecoveryCode.update({ usedAt: new Date() }, { where: { id: hit.id, usedAt: null }, transaction: t }))
  return taken === 1 ? { ok: true, via: 'recovery' } : { ok: false, reason: 'used' }
}

/** Removes the person's factor and recovery codes (inside the caller's write). */
export async function removeFactor(t: Transaction, userId: number): Promise<void> {
  await RecoveryCode.destroy({ where: { userId }, transaction: t })
  await SecondFactor.destroy({ where: { userId }, transaction: t })
}

/** Which of these people have a confirmed factor (for staff lists). */
export async function enrolledAmong(userIds: number[]): Promise<Set<number>> {
  if (!userIds.length) return new Set()
  const rows = await SecondFactor.findAll({ where: { userId: { [Op.in]: userIds }, secret: { [Op.ne]: null } }, attributes: ['userId'] })
  return new Set(rows.map((r) => r.userId))
}
