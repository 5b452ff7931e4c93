import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { createHash } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'

const dir = mkdtempSync(join(tmpdir(), 'boreline-tokens-'))
process.env.DATABASE_URL = `sqlite:${join(dir, 'unit.sqlite')}`

const { getDb, closeDb, withWrite } = await import('../../../server/utils/db')
const { migrateUp } = await import('../../../server/utils/migrate')
const { initModels, Organisation, User, AccountToken } = await import('../../../server/models/index')
const { issueToken, findLiveToken, useToken, voidTokensOf, hashToken, TOKEN_LIFETIME_MS } = await import('../../../server/services/tokens')

let userId = 0
beforeAll(async () => {
  await migrateUp(getDb())
  initModels(getDb())
  userId = await withWrite(async (t) => {
    const org = await Organisation.create({ kind: 'garage', name: 'Token Test Garage', status: 'approved' }, { transaction: t })
    return (await User.create({ organisationId: org.id, email: 'token@test.test', name: 'Token Tester', role: 'garage_manager' }, { transaction: t })).id
  })
})
afterAll(async () => { await closeDb(); rmSync(dir, { recursive: true, force: true }) })

describe('single-use links', () => {
  it('stores only the SHA-256 of the token, with a lifetime of one hour for resets and 7 days for invitations', async () => {
    const token = await withWrite((t) => issueToken(t, userId, 'reset'))
    expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/) // 32 random bytes
    const row = (await AccountToken.findOne({ where: { tokenHash: hashToken(token) } }))!
    // SHA-256 of "abc" (FIPS 180-2, appendix B.1) checks the hash function itself
    expect(hashToken('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad')
    expect(row.tokenHash).toBe(createHash('sha256').update(token).digest('hex'))
    expect(row.expiresAt.getTime() - row.createdAt.getTime()).toBeGreaterThan(TOKEN_LIFETIME_MS.reset - 1000)
    expect(TOKEN_LIFETIME_MS.reset).toBe(3_600_000)
    expect(TOKEN_LIFETIME_MS.invite).toBe(7 * 24 * 3_600_000)
  })

  it('works once', async () => {
    const token = await withWrite((t) => issueToken(t, userId, 'reset'))
    expect(await findLiveToken(token, 'reset')).not.toBeNull()
    expect(await findLiveToken(token, 'invite')).toBeNull() // kinds do not mix
    expect(await withWrite((t) => useToken(t, token, 'reset'))).not.toBeNull()
    expect(await withWrite((t) => useToken(t, token, 'reset'))).toBeNull()
    expect(await findLiveToken(token, 'reset')).toBeNull()
  })

  it('stops working once it has expired', async () => {
    const token = await withWrite((t) => issueToken(t, userId, 'reset'))
    await withWrite((t) => AccountToken.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { tokenHash: hashToken(token) }, transaction: t }))
    expect(await findLiveToken(token, 'reset')).toBeNull()
    expect(await withWrite((t) => useToken(t, token, 'reset'))).toBeNull()
  })

  it('voids the earlier link when a new one is issued, and all links of a removed person', async () => {
    const first = await withWrite((t) => issueToken(t, userId, 'invite'))
    const second = await withWrite((t) => issueToken(t, userId, 'invite'))
    expect(await findLiveToken(first, 'invite')).toBeNull()
    expect(await findLiveToken(second, 'invite')).not.toBeNull()
    await withWrite((t) => voidTokensOf(t, [userId]))
    expect(await findLiveToken(second, 'invite')).toBeNull()
  })

  it('lets only one of many parallel uses succeed', async () => {
    const token = await withWrite((t) => issueToken(t, userId, 'reset'))
    const uses = await Promise.all(Array.from({ length: 10 }, () => withWrite((t) => useToken(t, token, 'reset'))))
    expect(uses.filter(Boolean)).toHaveLength(1)
  })
})
