/**
 * Server-side session records. The sealed cookie holds only our random session id and a small user summary;
 * a replayed cookie is worth nothing once its record is revoked, idle or past its absolute lifetime, or once
 * the user's session version moved on (password change, removal).
 */
import { randomBytes } from 'node:crypto'
import type { H3Event } from 'h3'
import { getRequestIP, getRequestHeader } from 'h3'
import { Op } from 'sequelize'
import { Organisation, SessionRecord, User } from '../models/accounts'
import { withWrite } from './db'
import type { SessionUser } from '../../shared/types/accounts'

export interface SessionLimits { idleMinutes: number; absoluteHours: number }

export function sessionUserOf(user: User, org: Organisation): SessionUser {
  return { id: user.id, name: user.name, role: user.role, organisationId: org.id, organisationKind: org.kind }
}

/** Creates a fresh record (a new id at every sign-in) and returns its id. */
export async function createSessionRecord(event: H3Event, user: User, limits: SessionLimits): Promise<string> {
  const id = randomBytes(32).toString('base64url')
  const now = new Date()
  await withWrite((t) => SessionRecord.create({
    id,
    userId: user.id,
    sessionVersion: user.sessionVersion,
    ip: (getRequestIP(event) ?? '').slice(0, 64),
    userAgent: (getRequestHeader(event, 'user-agent') ?? '').slice(0, 300),
    lastSeenAt: now,
    expiresAt: new Date(now.getTime() + limits.absoluteHours * 3600_000),
  }, { transaction: t }))
  return id
}

export type SessionCheck =
  | { ok: true; record: SessionRecord; user: User; org: Organisation }
  | { ok: false; reason: string }

/**
 * Is the record behind this id still alive? One query loads the record with its user and organisation, so
 * role and account status come fresh from the database on every request at the cost of a single lookup.
 */
export async function checkSessionRecord(sid: string, userId: number, limits: SessionLimits, now = new Date()): Promise<SessionCheck> {
  const record = await SessionRecord.findByPk(sid, {
    include: [{ model: User, as: 'user', required: true, include: [{ model: Organisation, as: 'organisation', required: true }] }],
  })
  const user = (record as (SessionRecord & { user?: User & { organisation?: Organisation } }) | null)?.user
  const org = user?.organisation
  if (!record || !user || !org || record.userId !== userId) return { ok: false, reason: 'unknown session' }
  if (record.revokedAt) return { ok: false, reason: 'signed out' }
  if (record.expiresAt.getTime() <= now.getTime()) return { ok: false, reason: 'session lifetime over' }
  if (record.lastSeenAt.getTime() + limits.idleMinutes * 60_000 <= now.getTime()) return { ok: false, reason: 'idle too long' }
  if (user.status !== 'active') return { ok: false, reason: 'user not active' }
  if (record.sessionVersion !== user.sessionVersion) return { ok: false, reason: 'session ended' }
  return { ok: true, record, user, org }
}

/** Keeps the idle clock running; written at most once a minute per session to spare the single writer. */
export async function touchSessionRecord(record: SessionRecord, now = new Date()): Promise<void> {
  if (now.getTime() - record.lastSeenAt.getTime() < 60_000) return
  await withWrite((t) => SessionRecord.update({ lastSeenAt: now }, { where: { id: record.id }, transaction: t }))
}

export async function revokeSessionRecord(sid: string): Promise<void> {
  await withWrite((t) => SessionRecord.update({ revokedAt: new Date() }, { where: { id: sid, revokedAt: null }, transaction: t }))
}

/** Ends every session of these users (optionally keeping one), e.g. after a password reset or a suspension. */
export async function revokeSessionsOfUsers(userIds: number[], exceptSid?: string): Promise<void> {
  if (!userIds.length) return
  await withWrite((t) => SessionRecord.update({ revokedAt: new Date() }, {
    where: { userId: { [Op.in]: userIds }, revokedAt: null, ...(exceptSid ? { id: { [Op.ne]: exceptSid } } : {}) },
    transaction: t,
  }))
}
