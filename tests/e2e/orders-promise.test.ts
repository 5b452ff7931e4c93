/**
 * When the part arrives: a garage approved through its application (home branch chosen on approval) orders without
 * naming a branch, and the preview promises each line by the branch's delivery runs and cut-offs, with the clock
 * moved a minute either side of a cut-off. Expected times are worked by hand from the demo schedule
 * (server/seed/branches.ts: Northgate runs 08:30, 11:00, 14:30, 16:30 on weekdays, cut-off 30 minutes before,
 * 45 minutes' transit; counter 07:30-17:30, parts out 15 minutes after they are asked for), in the configured
 * zone Europe/London: GMT (UTC+0) in December, BST (UTC+1) in July (the UK's clock change, gov.uk "When the clocks
 * change").
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { as, env, people, type Client } from '../support/api'
import { newApprovedGarage, applyAsNewGarage } from '../support/accounts'
import { makeGarage, makePart, sendAt, type TestPart } from '../support/orders'

await setup({ host: env().baseUrl })

let admin: Client
let part: TestPart
let branches: { id: number; code: string; name: string }[]

beforeAll(async () => {
  admin = await as(people.admin)
  part = await makePart({ listPriceMinor: 4_000, stock: { NGT: 50, RVS: 50 } })
  branches = (await admin.get('/api/branches')).body
})

const branch = (code: string) => branches.find((b) => b.code === code)!

describe('a garage approved through its application', () => {
  it('must be given a home branch when it is approved', async () => {
    const { id } = await applyAsNewGarage()
    const tierId = (await admin.get('/api/admin/tiers')).body.data[0].id
    const missing = await admin.post(`/api/admin/trade-applications/${id}/decision`, { decision: 'approve', terms: 'card', tierId })
    expect(missing.status).toBe(422)
    expect(missing.body.data.fields.homeBranchId).toMatch(/home branch/)
    const unknown = await admin.post(`/api/admin/trade-applications/${id}/decision`, { decision: 'approve', terms: 'card', tierId, homeBranchId: 999_999 })
    expect(unknown.status).toBe(422)
    expect(unknown.body.data.fields.homeBranchId).toBeTruthy()
    expect((await admin.get(`/api/admin/trade-applications/${id}`)).body.status).toBe('pending')
  })

  it('orders without naming a branch: its home branch supplies, and the admin can change it', async () => {
    const { id, manager } = await newApprovedGarage(admin, { homeBranchId: branch('RVS').id })
    expect((await admin.get(`/api/admin/trade-accounts/${id}`)).body.homeBranch).toMatchObject({ code: 'RVS' })
    const preview = await manager.post('/api/orders/preview', { lines: [{ sku: part.sku, quantity: 2 }] })
    expect(preview.status, preview.text).toBe(200)
    expect(preview.body.branch.code).toBe('RVS')
    expect(preview.body.lines).toEqual([expect.objectContaining({ sku: part.sku, quantity: 2, source: 'home', branch: expect.objectContaining({ code: 'RVS' }) })])
    expect(typeof preview.body.lines[0].arrivesAt).toBe('string')
    const placed = await manager.post('/api/orders', { lines: [{ sku: part.sku, quantity: 2 }], payment: 'card' })
    expect(placed.status, placed.text).toBe(201)
    expect(placed.body.branch.code).toBe('RVS')

    const moved = await admin.patch(`/api/admin/trade-accounts/${id}/home-branch`, { homeBranchId: branch('NGT').id })
    expect(moved.status, moved.text).toBe(200)
    expect(moved.body.homeBranch.code).toBe('NGT')
    expect((await manager.post('/api/orders/preview', { lines: [{ sku: part.sku, quantity: 1 }] })).body.branch.code).toBe('NGT')
    expect((await admin.patch(`/api/admin/trade-accounts/${id}/home-branch`, { homeBranchId: 0 })).status).toBe(422)
    expect((await manager.patch(`/api/admin/trade-accounts/${id}/home-branch`, { homeBranchId: branch('RVS').id })).status).toBe(403)
  })
})

describe('the delivery promise, by the clock', () => {
  let c: Client
  beforeAll(async () => {
    c = await as((await makeGarage({ terms: 'account', creditLimitMinor: 1_000_000, label: 'Promise Garage' })).email)
  })
  const promiseAt = async (iso: string, extra: Record<string, unknown> = {}) => {
    const r = await sendAt(c, 'POST', '/api/orders/preview', iso, { lines: [{ sku: part.sku, quantity: 1 }], ...extra })
    expect(r.status, r.text).toBe(200)
    return r.body.lines[0] as { source: string; arrivesAt: string; promise: string; branch: { code: string } }
  }

  it('makes the 14:30 run one minute before its 14:00 cut-off, and not one minute after', async () => {
    // Wednesday 9 December 2026, GMT: 13:59 is before 14:30 - 30 min = 14:00; the van arrives 14:30 + 45 min = 15:15
    expect(await promiseAt('2026-12-09T13:59:00Z')).toMatchObject({ source: 'home', promise: 'next run 14:30, about 15:15', arrivesAt: '2026-12-09T15:15:00.000Z' })
    // 14:01 misses it: the 16:30 run (cut-off 16:00), arriving 17:15
    expect(await promiseAt('2026-12-09T14:01:00Z')).toMatchObject({ source: 'home', promise: 'next run 16:30, about 17:15', arrivesAt: '2026-12-09T17:15:00.000Z' })
  })

  it('rolls over to the next working day after the last cut-off, and over the weekend', async () => {
    // Wednesday 16:01: past the last cut-off (16:00), so Thursday's 08:30 run, arriving 09:15
    expect(await promiseAt('2026-12-09T16:01:00Z')).toMatchObject({ promise: "tomorrow's 08:30 run, about 09:15", arrivesAt: '2026-12-10T09:15:00.000Z' })
    // Friday 11 December 16:01: no runs at the weekend, so Monday 14 December 08:30
    expect(await promiseAt('2026-12-11T16:01:00Z')).toMatchObject({ promise: "Monday's 08:30 run, about 09:15", arrivesAt: '2026-12-14T09:15:00.000Z' })
  })

  it('reads the runs in local time through British Summer Time', async () => {
    // Wednesday 15 July 2026, BST (UTC+1): 13:59 local = 12:59Z; the 14:30 run arrives 15:15 local = 14:15Z
    expect(await promiseAt('2026-07-15T12:59:00Z')).toMatchObject({ promise: 'next run 14:30, about 15:15', arrivesAt: '2026-07-15T14:15:00.000Z' })
    expect(await promiseAt('2026-07-15T13:01:00Z')).toMatchObject({ promise: 'next run 16:30, about 17:15', arrivesAt: '2026-07-15T16:15:00.000Z' })
  })

  it('offers collection from the counter now while it is open, and from its opening when it is not', async () => {
    // 10:00 on a weekday: out on the counter 15 minutes later
    expect(await promiseAt('2026-12-09T10:00:00Z', { collect: true })).toMatchObject({ source: 'collect', promise: 'collect from the counter now', arrivesAt: '2026-12-09T10:15:00.000Z' })
    // 18:00, after closing (17:30): from 07:30 + 15 minutes the next morning
    expect(await promiseAt('2026-12-09T18:00:00Z', { collect: true })).toMatchObject({ source: 'collect', promise: 'collect from the counter tomorrow from 07:45', arrivesAt: '2026-12-10T07:45:00.000Z' })
  })

  it('stores the promise with the order placed at that moment', async () => {
    const r = await sendAt(c, 'POST', '/api/orders', '2026-12-09T13:59:00Z', { lines: [{ sku: part.sku, quantity: 1 }], payment: 'account' })
    expect(r.status, r.text).toBe(201)
    expect(r.body.lines[0]).toMatchObject({ source: 'home', state: 'reserved', promise: 'next run 14:30, about 15:15' })
  })
})
