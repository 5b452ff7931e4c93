/**
 * Server-side session records. The sealed cookie holds only our random session id and a small user summary;
 * a replayed cookie is worth nothing once its record is revoked, idle or past its absolute lifetime, or once
 * the user's session version moved on (password change, removal).
 */
import { randomBytes } from 'node:crypto'
import type { H3Event } from 'h3'
import { getRequestIP, getRequestHeader } from 'h3'
import type { Model } from 'sequelize'
import { Organisation, SessionRecord, User } from '../models/accounts'
import { withWrite } from './db'
import { cachedSessionRows, rememberSessionRows, rowsGeneration, type SessionRows } from './session-cache'
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
 * role and account status come from the database; the rows are kept in memory (server/utils/session-cache.ts)
 * until anything in those tables changes, and `fresh: true` (every state-changing request) reads them anyway.
 */
export async function checkSessionRecord(sid: string, userId: number, limits: SessionLimits, now = new Date(), options: { fresh?: boolean } = {}): Promise<SessionCheck> {
  const loaded = await sessionRows(sid, options.fresh === true)
  if (!loaded) return { ok: false, reason: 'unknown session' }
  const { record, user, org } = loaded
  if (record.userId !== userId) return { ok: false, reason: 'unknown session' }
  if (record.revokedAt) return { ok: false, reason: 'signed out' }
  if (record.expiresAt.getTime() <= now.getTime()) return { ok: false, reason: 'session lifetime over' }
  if (record.lastSeenAt.getTime() + limits.idleMinutes * 60_000 <= now.getTime()) return { ok: false, reason: 'idle too long' }
  if (user.status !== 'active') return { ok: false, reason: 'user not active' }
  if (record.sessionVersion !== user.sessionVersion) return { ok: false, reason: 'session ended' }
  return { ok: true, record, user, org }
}

/**
 * The three rows, from the cache when it holds them, else from one joined query. They are read-only snapshots
 * shared by every request of the session (their values are frozen, so a change attempted through them throws
 * instead of quietly altering what later requests see): to change a user or an organisation, load its row.
 */
async function sessionRows(sid: string, fresh: boolean): Promise<SessionRows | null> {
  const cached = fresh ? undefined : cachedSessionRows(sid)
  if (cached) return cached
  if (fresh) return readSessionRows(sid)
  // when the remembered rows lapse, every request of the session in flight misses at once: they share one read
  // (50 parallel reads queued on the one connection stalled the session for ~100-400 ms, bench/catalogue.ts),
  // but only requests that saw no write since it started, so a change still counts from the next request
  const generation = rowsGeneration()
  const shared = reading.get(sid)
  if (shared && shared.generation === generation) return shared.rows
  const rows = readSessionRows(sid).finally(() => { if (reading.get(sid)?.rows === rows) reading.delete(sid) })
  reading.set(sid, { generation, rows })
  return rows
}
const reading = new Map<string, { generation: number; rows: Promise<SessionRows | null> }>()

async function readSessionRows(sid: string): Promise<SessionRows | null> {
  const readAt = rowsGeneration()
  const found = await SessionRecord.findByPk(sid, {
    include: [{ model: User, as: 'user', required: true, include: [{ model: Organisation, as: 'organisation', required: true }] }],
  })
  const user = (found as (SessionRecord & { user?: User & { organisation?: Organisation } }) | null)?.user
  const org = user?.organisation
  if (!found || !user || !org) return null
  for (const row of [found, user, org] as Model[]) Object.freeze(row.dataValues)
  const rows = { record: found, user, org }
  rememberSessionRows(sid, rows, readAt)
  return rows
}

/** Keeps the idle clock running; written at most once a minute per session to spare the single writer. */
export async function touchSessionRecord(record: SessionRecord, now = new Date()): Promise<void> {
  if (now.getTime() - record.lastSeenAt.getTime() < 60_000) return
  await withWrite((t) => SessionRecord.update({ lastSeenAt: now }, { where: { id: record.id }, transaction: t }))
}

export async function revokeSessionRecord(sid: string): Promise<void> {
  await withWrite((t) => SessionRecord.update({ revokedAt: new Date() }, { where: { id: sid, revokedAt: null }, transaction: t }))
}
