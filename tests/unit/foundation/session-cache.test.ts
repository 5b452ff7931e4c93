// The per-request session check keeps what it read in memory (server/utils/session-cache.ts). These checks pin
// down when that memory must be forgotten: a revocation, a role or status change, any committed write. The rules
// themselves (sign-out ends a session at once, a suspended account stops on its next request) are the
// trade-accounts issue's. Where a sealed cookie's expiry sits is checked against cookies sealed by iron-webcrypto,
// the library h3 seals sessions with.
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { defaults as ironDefaults, seal } from 'iron-webcrypto'

const dir = mkdtempSync(join(tmpdir(), 'boreline-session-cache-'))
process.env.DATABASE_URL = `sqlite:${join(dir, 'unit.sqlite')}`

const { getDb, closeDb, withWrite } = await import('../../../server/utils/db')
const { migrateUp } = await import('../../../server/utils/migrate')
const { initModels, Organisation, User, SessionRecord } = await import('../../../server/models/index')
const { checkSessionRecord, revokeSessionRecord, touchSessionRecord } = await import('../../../server/utils/sessions')
const cache = await import('../../../server/utils/session-cache')

const limits = { idleMinutes: 60, absoluteHours: 12 }
let userId = 0, orgId = 0

async function newSession(id: string) {
  const now = new Date()
  await withWrite((t) => SessionRecord.create({ id, userId, sessionVersion: 1, ip: '', userAgent: '', lastSeenAt: now, expiresAt: new Date(now.getTime() + 3600_000) }, { transaction: t }))
}
/** A change made behind the process's back (as another process would): no model hook, no write transaction here. */
async function behindTheBack(sql: string) {
  const sqlite3 = (await import('sqlite3')).default
  const db = new sqlite3.Database(join(dir, 'unit.sqlite'))
  await new Promise<void>((res, rej) => db.run(sql, (e) => (e ? rej(e) : res())))
  await new Promise<void>((res) => db.close(() => res()))
}

describe('session check memory', () => {
  beforeAll(async () => {
    await migrateUp(getDb())
    initModels()
    const org = await Organisation.create({ kind: 'garage', name: 'Test Garage', status: 'approved' })
    const user = await User.create({ organisationId: org.id, email: 'a@test.test', name: 'A', role: 'garage_manager', passwordHash: 'x', status: 'active', sessionVersion: 1 })
    orgId = org.id; userId = user.id
  })
  afterAll(async () => { await closeDb(); rmSync(dir, { recursive: true, force: true }) })

  it('answers a repeated check from memory until something changes, and never hands out writable rows', async () => {
    await newSession('s-memory')
    const first = await checkSessionRecord('s-memory', userId, limits)
    expect(first.ok).toBe(true)
    await behindTheBack(`UPDATE users SET role = 'garage_technician' WHERE id = ${userId}`)
    const second = await checkSessionRecord('s-memory', userId, limits)
    // within ROWS_TTL_MS another process's change is not seen yet (the documented bound)...
    expect(second.ok && second.user.role).toBe('garage_manager')
    // ...but a state-changing request reads afresh
    const fresh = await checkSessionRecord('s-memory', userId, limits, new Date(), { fresh: true })
    expect(fresh.ok && fresh.user.role).toBe('garage_technician')
    if (!second.ok) throw new Error('expected ok')
    expect(() => { (second.org as { name: string }).name = 'changed' }).toThrow(TypeError)
  })

  it('forgets at once after a revocation, a model update or any committed write', async () => {
    await newSession('s-forget')
    expect((await checkSessionRecord('s-forget', userId, limits)).ok).toBe(true)
    await revokeSessionRecord('s-forget')
    expect(await checkSessionRecord('s-forget', userId, limits)).toEqual({ ok: false, reason: 'signed out' })

    await newSession('s-suspend')
    expect((await checkSessionRecord('s-suspend', userId, limits)).ok).toBe(true)
    await Organisation.update({ status: 'suspended' }, { where: { id: orgId } }) // a model update outside withWrite
    const suspended = await checkSessionRecord('s-suspend', userId, limits)
    expect(suspended.ok && suspended.org.status).toBe('suspended')

    const gen = cache.sessionCacheStats().generation
    await withWrite((t) => getDb().query(`UPDATE users SET status = 'removed' WHERE id = ${userId}`, { transaction: t })) // raw SQL
    expect(cache.sessionCacheStats().generation).toBeGreaterThan(gen)
    expect(await checkSessionRecord('s-suspend', userId, limits)).toEqual({ ok: false, reason: 'user not active' })
    await withWrite((t) => getDb().query(`UPDATE users SET status = 'active' WHERE id = ${userId}`, { transaction: t }))
    await Organisation.update({ status: 'approved' }, { where: { id: orgId } })
  })

  it('reads the rows again in the background once past half their time, answering the remembered ones meanwhile', async () => {
    await newSession('s-ahead')
    expect((await checkSessionRecord('s-ahead', userId, limits)).ok).toBe(true)
    // remembered 1.1 s ago: past half of ROWS_TTL_MS (2 s), not past it
    cache.rememberSessionRows('s-ahead', cache.cachedSessionRows('s-ahead')!, cache.rowsGeneration(), Date.now() - 1100)
    await behindTheBack(`UPDATE organisations SET name = 'Renamed Garage' WHERE id = ${orgId}`)
    const first = await checkSessionRecord('s-ahead', userId, limits)
    expect(first.ok && first.org.name).toBe('Test Garage') // answered at once from memory...
    let seen = ''
    for (let i = 0; i < 40 && seen !== 'Renamed Garage'; i++) { // ...while one read brings it up to date
      await new Promise((r) => setTimeout(r, 10))
      const again = await checkSessionRecord('s-ahead', userId, limits)
      seen = again.ok ? again.org.name : ''
    }
    expect(seen).toBe('Renamed Garage')
    await behindTheBack(`UPDATE organisations SET name = 'Test Garage' WHERE id = ${orgId}`)
  })

  it('moves the last-seen time with one write per minute, and keeps the remembered rows', async () => {
    const t0 = Date.now()
    await withWrite((t) => SessionRecord.create({ id: 's-touch', userId, sessionVersion: 1, ip: '', userAgent: '', lastSeenAt: new Date(t0 - 61_000), expiresAt: new Date(t0 + 3600_000) }, { transaction: t }))
    const check = await checkSessionRecord('s-touch', userId, limits)
    if (!check.ok) throw new Error('expected ok')
    const generation = cache.sessionCacheStats().generation
    // five requests of the session in flight at once, each a millisecond later: the first one writes, the rest skip
    await Promise.all([0, 1, 2, 3, 4].map((i) => touchSessionRecord(check.record, new Date(t0 + i))))
    const stored = await SessionRecord.findByPk('s-touch')
    expect(stored!.lastSeenAt.getTime()).toBe(t0)
    expect(cache.sessionCacheStats().generation).toBe(generation) // nothing dropped...
    expect(cache.cachedSessionRows('s-touch')).toBeDefined()
    // ...and the idle clock counts from the touch, not from the time in the remembered row: with a one-minute idle
    // limit, 30 s after the touch (91 s after the row's own time) the session is alive
    const oneMinute = { idleMinutes: 1, absoluteHours: 12 }
    expect((await checkSessionRecord('s-touch', userId, oneMinute, new Date(t0 + 30_000))).ok).toBe(true)
    expect(await checkSessionRecord('s-touch', userId, oneMinute, new Date(t0 + 61_000))).toEqual({ ok: false, reason: 'idle too long' })
  })

  it('refuses to remember rows read across a change', () => {
    const readAt = cache.rowsGeneration()
    cache.authDataChanged()
    cache.rememberSessionRows('s-stale', {} as never, readAt)
    expect(cache.cachedSessionRows('s-stale')).toBeUndefined()
  })

  it('remembers an opened cookie no longer than its seal is valid, and hands out private copies', async () => {
    const now = Date.now()
    const session = { id: 'h3-id', createdAt: now, data: { user: { id: 1, role: 'garage_manager' }, sid: 'abc' } }
    const password = 'unit-test-session-password-0123456789-abcdef'
    // sealed as h3 seals a session, once with a lifetime of 1 s and once without one
    const short = await seal(globalThis.crypto, session, password, { ...ironDefaults, ttl: 1000 })
    const open = await seal(globalThis.crypto, session, password, ironDefaults)
    const sealedAt = Date.now()
    cache.rememberOpenedSession(short, session, undefined, sealedAt)
    const copy = cache.openedSession(short, sealedAt + 100)!
    expect(copy).toEqual(session)
    ;(copy.data.user as { role: string }).role = 'distributor_admin'
    expect((cache.openedSession(short, sealedAt + 200)!.data.user as { role: string }).role).toBe('garage_manager')
    expect(cache.openedSession(short, sealedAt + 1500)).toBeUndefined() // past the seal's own expiry
    cache.rememberOpenedSession(open, session, 60, now) // no seal expiry: the session's maxAge bounds it
    expect(cache.openedSession(open, now + 59_000)).toBeDefined()
    expect(cache.openedSession(open, now + 60_000)).toBeUndefined()
  })
})
