/**
 * In-process memory for the per-request session check, which every signed-in request pays before its route runs
 * (measured in bench/catalogue.ts: without it, the check costs more than the catalogue route itself).
 *
 * Two caches, both safe to drop at any moment:
 * - **opened cookies**: sealed cookie text -> its contents. The text is authenticated (iron seal), so the same text
 *   always opens to the same contents; only time can change the answer, so an entry ends with the seal's own expiry
 *   and never outlives {@link OPENED_TTL_MS}. Saves the key derivation + HMAC + AES of opening it (~0.2-0.4 ms).
 * - **session rows**: session id -> the session record, user and organisation as read from the database. Dropped
 *   whole whenever any of those three tables changes in this process ({@link authDataChanged}: model hooks in
 *   server/models/accounts.ts, and every committed write transaction in server/utils/db.ts), so a sign-out, a role
 *   change or a suspension counts from the very next request. {@link ROWS_TTL_MS} bounds how long a change made by
 *   another process (a CLI script) can go unseen. Requests that change something (POST, PUT, PATCH, DELETE) always
 *   read the rows afresh (session middleware). On PostgreSQL (several processes) the rows are always read: a
 *   sign-out, suspension or role change made through another process then counts from its very next request.
 *
 * `BORELINE_SESSION_CACHE=0` turns both off (the benchmark measures the uncached path with it).
 */
import { afterEveryWrite, isPostgres } from './db'
import type { Organisation, SessionRecord, User } from '../models/accounts'

export const OPENED_TTL_MS = 10 * 60_000
export const ROWS_TTL_MS = 2_000
const MAX_ENTRIES = 20_000

let on: boolean | undefined
/** Read once: looking up process.env on every request is measurable at this rate. */
export const sessionCacheOn = () => (on ??= process.env.BORELINE_SESSION_CACHE !== '0')

// ---- opened cookies ---------------------------------------------------------------------------------------------

export interface OpenedSession { id: string; createdAt: number; data: Record<string, unknown> }
const opened = new Map<string, { until: number; session: OpenedSession }>()

/**
 * When this sealed text stops being valid by itself: iron's format is
 * `Fe26.2*<password id>*<salt>*<iv>*<cipher>*<expiration ms or empty>*<hmac salt>*<hmac>`.
 */
function sealExpiry(sealed: string): number {
  const exp = sealed.split('*')[5]
  return exp ? Number(exp) || 0 : Number.POSITIVE_INFINITY
}

/** A private copy of what this sealed cookie opened to before, or undefined. */
export function openedSession(sealed: string, now = Date.now()): OpenedSession | undefined {
  if (!sessionCacheOn()) return undefined
  const hit = opened.get(sealed)
  if (!hit) return undefined
  if (hit.until <= now) { opened.delete(sealed); return undefined }
  return copyOf(hit.session)
}

/**
 * A private copy of opened contents (JSON values: h3 changes `data` in place when the session is updated).
 * Not `structuredClone`: 0.3 µs against 1.8 µs for a session (measured here), paid on every signed-in request.
 */
function copyOf<T>(v: T): T {
  if (Array.isArray(v)) return v.map(copyOf) as T
  if (v && typeof v === 'object') {
    const out: Record<string, unknown> = {}
    for (const k in v) out[k] = copyOf((v as Record<string, unknown>)[k])
    return out as T
  }
  return v
}

/** Remembers what a sealed cookie opened to (call right after opening it, before anything changes the session). */
export function rememberOpenedSession(sealed: string, session: OpenedSession, maxAgeSeconds?: number, now = Date.now()): void {
  if (!sessionCacheOn() || !session.id) return
  let until = Math.min(now + OPENED_TTL_MS, sealExpiry(sealed))
  if (maxAgeSeconds) until = Math.min(until, session.createdAt + maxAgeSeconds * 1000)
  if (until <= now) return
  opened.set(sealed, { until, session: copyOf({ id: session.id, createdAt: session.createdAt, data: session.data }) })
  trim(opened)
}

// ---- session rows -----------------------------------------------------------------------------------------------

/** The three rows as read (model instances with frozen values, shared by the session's requests). */
export interface SessionRows { record: SessionRecord; user: User; org: Organisation }
const rows = new Map<string, { at: number; rows: SessionRows }>()
let generation = 0

/** Forget every cached session row (any change to session records, users or organisations). */
export function authDataChanged(): void {
  generation++
  rows.clear()
}

// belt and braces: raw SQL inside a write transaction bypasses the model hooks, so every write counts as a change
afterEveryWrite(authDataChanged)

/** A marker taken before reading rows; {@link rememberSessionRows} refuses rows read across a change. */
export function rowsGeneration(): number { return generation }

export function cachedSessionRows(sid: string, now = Date.now()): SessionRows | undefined {
  if (!sessionCacheOn() || isPostgres()) return undefined
  const hit = rows.get(sid)
  if (!hit) return undefined
  if (now - hit.at >= ROWS_TTL_MS) { rows.delete(sid); return undefined }
  return hit.rows
}

/** Whether remembered rows are past half their time, so a read in the background should bring them up to date. */
export function sessionRowsRefreshDue(sid: string, now = Date.now()): boolean {
  const hit = rows.get(sid)
  return hit !== undefined && now - hit.at >= ROWS_TTL_MS / 2
}

export function rememberSessionRows(sid: string, value: SessionRows, readAtGeneration: number, now = Date.now()): void {
  if (!sessionCacheOn() || readAtGeneration !== generation) return
  rows.set(sid, { at: now, rows: value })
  trim(rows)
}

export function sessionCacheStats() { return { opened: opened.size, rows: rows.size, generation } }

function trim<K, V>(m: Map<K, V>) {
  while (m.size > MAX_ENTRIES) m.delete(m.keys().next().value as K)
}
