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
import { cachedSessionRows, rememberSessionRows, rowsGeneration, sessionRowsRefreshDue, type SessionRows } from './session-cache'
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
  if (lastSeenOf(record) + limits.idleMinutes * 60_000 <= now.getTime()) return { ok: false, reason: 'idle too long' }
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
  if (fresh) return readSessionRows(sid)
  const cached = cachedSessionRows(sid)
  if (cached) {
    // read again in the background once past half their time, so under steady use they never lapse and no request
    // waits for them (when they lapsed, every request of the session in flight waited for the one read: a stall
    // every ROWS_TTL_MS under load, bench/catalogue.ts); rows older than ROWS_TTL_MS are still never answered
    if (sessionRowsRefreshDue(sid)) void sharedRead(sid).catch(() => {})
    return cached
  }
  return sharedRead(sid)
}

/**
 * One read of a session's rows at a time: when the remembered rows lapse, every request of the session in flight
 * misses at once (50 parallel reads queued on the one connection stalled the session for ~100-400 ms,
 * bench/catalogue.ts). Shared only among requests that saw no write since it started, so a change still counts from
 * the next request.
 */
function sharedRead(sid: string): Promise<SessionRows | null> {
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

/**
 * When this process last moved each session's last-seen time. The remembered rows keep the time they were read
 * with (a touch does not drop them, see below), so the idle check and the next touch look here too.
 */
const touchedAt = new Map<string, number>()
const MAX_TOUCHED = 20_000
const lastSeenOf = (record: SessionRecord) => Math.max(record.lastSeenAt.getTime(), touchedAt.get(record.id) ?? 0)

/**
 * Keeps the idle clock running; written at most once a minute per session to spare the single writer. The first
 * request past the minute claims the write, so the session's other requests in flight do not queue one each
 * (under 50 connections that was ~50 write transactions at once). The write changes only the last-seen time, which
 * no cache relies on beyond {@link lastSeenOf}: it skips the model hooks and after-write listeners, so every
 * request in flight does not then wait for fresh session rows and pricing context.
 */
export async function touchSessionRecord(record: SessionRecord, now = new Date()): Promise<void> {
  if (now.getTime() - lastSeenOf(record) < 60_000) return
  touchedAt.delete(record.id)
  touchedAt.set(record.id, now.getTime())
  while (touchedAt.size > MAX_TOUCHED) touchedAt.delete(touchedAt.keys().next().value as string)
  try {
    await withWrite((t) => SessionRecord.update({ lastSeenAt: now }, { where: { id: record.id }, transaction: t, hooks: false }), { cachesUnaffected: true })
  } catch (err) {
    if (touchedAt.get(record.id) === now.getTime()) touchedAt.delete(record.id) // the next request tries again
    throw err
  }
}

export async function revokeSessionRecord(sid: string): Promise<void> {
  await withWrite((t) => SessionRecord.update({ revokedAt: new Date() }, { where: { id: sid, revokedAt: null }, transaction: t }))
}
