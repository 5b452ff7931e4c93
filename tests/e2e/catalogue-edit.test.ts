/**
 * Catalogue e2e: upkeep by counter staff. Every test creates its own parts (SKUs TST-<run>-…) so the demo catalogue
 * other e2e files read stays as seeded; the one fitment added to a demo vehicle is removed again.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { dbAll } from '../support/db'
import { as, Client, env, people } from '../support/api'

await setup({ host: env().baseUrl })

const run = Date.now().toString(36).toUpperCase().slice(-6)
// a word of letters only (digits would make it read as a part number)
const word = `qz${run.replace(/\d/g, (d) => 'abcdefghij'[Number(d)]!)}`.toLowerCase()
const disc = (over: Record<string, unknown> = {}) => ({ axle: 'front', diameterMm: 300, thicknessMm: 25, minThicknessMm: 23, heightMm: 40.5, centreBoreMm: 57.1, boltHoles: 5, pcdMm: 112, vented: true, ...over })

let counter: Client, mgr: Client, tech: Client
let pennon: number
beforeAll(async () => {
  ;[counter, mgr, tech] = await Promise.all([as(people.counter), as(people.manager), as(people.technician)])
  pennon = (await mgr.get('/api/vehicles/facets?make=Veltra&model=Pennon&year=2020')).body.variants[0].vehicleId
})
function audits(entityId: string): Promise<{ action: string; actor: number; changes: string }[]> {
  return dbAll('SELECT action, actor_user_id AS "actor", changes FROM audit_log WHERE entity_id = ? ORDER BY id', [entityId])
}
const skus = (body: { data: { sku: string }[] }) => body.data.map((r) => r.sku)

describe('catalogue upkeep', () => {
  const sku = `TST-${run}-A`

  it('only distributor staff may change the catalogue', async () => {
    const body = { sku: `TST-${run}-X`, type: 'disc', description: 'x', specs: disc() }
    expect((await new Client().post('/api/parts', body)).status).toBe(401)
    expect((await mgr.post('/api/parts', body)).status).toBe(403)
    expect((await tech.patch('/api/parts/KP-1001', { description: 'mine now' })).status).toBe(403)
    expect((await mgr.get('/api/parts/KP-1001')).body.description).not.toBe('mine now')
  })

  it('creates a part that search finds at once, by SKU, OE number and words', async () => {
    const r = await counter.post('/api/parts', {
      sku, type: 'disc', productLine: 'Test Line', description: `Front brake disc 300 × 25 mm vented, ${word} trial`, specs: disc(),
      oeNumbers: [{ oeNumber: `ZQ ${run} 01`, maker: 'Veltra' }],
    })
    expect(r.status, r.text).toBe(201)
    expect((await mgr.get(`/api/parts?q=${sku}`)).body.data[0]).toMatchObject({ sku, match: { by: 'sku' } })
    expect((await mgr.get(`/api/parts?q=${encodeURIComponent(`ZQ ${run} 01`)}`)).body.data[0]).toMatchObject({ sku, match: { by: 'oe' } })
    expect(skus((await mgr.get(`/api/parts?q=${word}`)).body)).toEqual([sku])
    const dup = await counter.post('/api/parts', { sku, type: 'disc', description: 'again', specs: disc() })
    expect(dup.status).toBe(409)
  })

  it('refuses bad specifications with the field named and keeps the part as it was', async () => {
    const bad = await counter.patch(`/api/parts/${sku}`, { specs: disc({ minThicknessMm: 26, colour: 'red' }) })
    expect(bad.status).toBe(422)
    expect(bad.body.data.fields).toHaveProperty('specs.minThicknessMm')
    expect(bad.body.data.fields).toHaveProperty('specs.colour')
    expect((await mgr.get(`/api/parts/${sku}`)).body.specs.minThicknessMm).toBe(23)
    const unknownField = await counter.patch(`/api/parts/${sku}`, { type: 'pad_set' })
    expect(unknownField.status).toBe(422)
    expect(unknownField.body.data.fields).toHaveProperty('type')
  })

  it('edits a part: search and the part page follow, and the change is audited', async () => {
    const r = await counter.patch(`/api/parts/${sku}`, { description: `Front brake disc 300 mm, ${word}renamed`, specs: disc({ heightMm: 41 }) })
    expect(r.status, r.text).toBe(200)
    expect(skus((await mgr.get(`/api/parts?q=${word}renamed`)).body)).toEqual([sku])
    expect((await mgr.get(`/api/parts/${sku}`)).body.specs.heightMm).toBe(41)
    const log = await audits(sku)
    expect(log.map((a) => a.action)).toEqual(['catalogue.part.create', 'catalogue.part.update'])
    const changes = JSON.parse(log[1]!.changes)
    expect(changes.description.to).toContain('renamed')
    expect(changes.specs.from.heightMm).toBe(40.5)
  })

  it('adds fitment with qualifiers checked against the vehicle, shows it on the vehicle, and removes it', async () => {
    const base = `/api/parts/${sku}/fitments`
    const wrongAxle = await counter.post(base, { vehicleId: pennon, axle: 'rear', qualifiers: {} })
    expect(wrongAxle.status).toBe(422)
    expect(wrongAxle.body.data.fields).toHaveProperty('axle')
    const wrongValue = await counter.post(base, { vehicleId: pennon, axle: 'front', qualifiers: { front_disc_diameter_mm: '310' } })
    expect(wrongValue.status).toBe(422)
    expect(wrongValue.body.data.fields).toHaveProperty('qualifiers.front_disc_diameter_mm')
    const noVehicle = await counter.post(base, { vehicleId: 999999, axle: 'front' })
    expect(noVehicle.body.data.fields).toHaveProperty('vehicleId')
    // a 300 mm disc on the 280 mm brake differs from original equipment: only with a note saying so
    const differs = await counter.post(base, { vehicleId: pennon, axle: 'front', qualifiers: { front_disc_diameter_mm: '280' } })
    expect(differs.status).toBe(422)
    expect(differs.body.data.fields.note).toMatch(/differs/)

    const ok = await counter.post(base, { vehicleId: pennon, axle: 'front', side: 'pair', quantity: 2, qualifiers: { front_disc_diameter_mm: '300' } })
    expect(ok.status, ok.text).toBe(201)
    expect((await counter.post(base, { vehicleId: pennon, axle: 'front', side: 'pair', quantity: 2, qualifiers: { front_disc_diameter_mm: '300' } })).status).toBe(409)
    const listed = (a: string) => mgr.get(`/api/vehicles/${pennon}/parts?opt.front_disc_diameter_mm=${a}`).then((r) => JSON.stringify(r.body).includes(`"${sku}"`))
    expect(await listed('300')).toBe(true)
    expect(await listed('280')).toBe(false)
    expect((await mgr.get(`/api/parts/${sku}`)).body.vehicles).toEqual([expect.objectContaining({ vehicleId: pennon, axle: 'front', quantity: 2, qualifiers: { front_disc_diameter_mm: '300' } })])

    const changed = await counter.patch(`/api/fitments/${ok.body.id}`, { quantity: 1, note: 'sold singly' })
    expect(changed.status).toBe(200)
    expect((await counter.del(`/api/fitments/${ok.body.id}`)).status).toBe(204)
    expect(await listed('300')).toBe(false)
    expect((await counter.del(`/api/fitments/${ok.body.id}`)).status).toBe(404)
    const log = await audits(String(ok.body.id))
    expect(log.map((a) => a.action)).toEqual(['catalogue.fitment.create', 'catalogue.fitment.update', 'catalogue.fitment.delete'])
  })

  it('supersedes a part: its SKU then finds the replacement and says so', async () => {
    const newSku = `TST-${run}-B`
    expect((await counter.post('/api/parts', { sku: newSku, type: 'disc', productLine: 'Test Line', description: 'Front brake disc 300 mm revised', specs: disc() })).status).toBe(201)
    expect((await counter.post(`/api/parts/${sku}/supersede`, { newSku: 'KP-1001' })).body.data.fields).toHaveProperty('newSku') // another type
    const r = await counter.post(`/api/parts/${sku}/supersede`, { newSku, note: `${sku} was replaced by ${newSku}: revised casting.` })
    expect(r.status, r.text).toBe(200)
    const found = (await mgr.get(`/api/parts?q=${sku}`)).body.data
    expect(found[0]).toMatchObject({ sku: newSku, match: { by: 'superseded', replaces: { sku, note: expect.stringContaining('revised casting') } } })
    expect((await mgr.get(`/api/parts/${sku}`)).body).toMatchObject({ status: 'discontinued', replacedBy: { sku: newSku } })
    expect((await mgr.get(`/api/parts/${newSku}`)).body.supersedes).toEqual([expect.objectContaining({ sku })])
    expect((await counter.post(`/api/parts/${sku}/supersede`, { newSku })).status).toBe(409)
  })

  it('404 for edits of an unknown part', async () => {
    expect((await counter.patch('/api/parts/TST-NOPE-0', { description: 'x' })).status).toBe(404)
    expect((await counter.post('/api/parts/TST-NOPE-0/fitments', { vehicleId: pennon, axle: 'front' })).status).toBe(404)
  })
})
