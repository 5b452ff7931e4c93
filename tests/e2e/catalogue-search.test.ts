/** Catalogue e2e: part search ranking, OE numbers and typos, supersession, spec-range filters, paging, bad input. */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { dbAll } from '../support/db'
import { as, type Client, env, people } from '../support/api'

await setup({ host: env().baseUrl })

let mgr: Client
beforeAll(async () => { mgr = await as(people.manager) })

interface Row { sku: string; type: string; description: string; productLine: string; status: string; axle: string | null; specs: Record<string, number & string & boolean>; match: { by: string; oeNumber?: string; replaces?: { sku: string; note: string } } }
const search = async (query: Record<string, string>) => {
  const r = await mgr.get(`/api/parts?${new URLSearchParams(query)}`)
  expect(r.status, r.text).toBe(200)
  return r.body as { data: Row[]; meta: { page: number; pageSize: number; total: number; pages: number } }
}
const dbRows = <T>(sql: string): Promise<T[]> => dbAll<T>(sql)

describe('search ranking', () => {
  it('puts the exact SKU first, then SKUs that start with it', async () => {
    const r = await search({ q: 'KM-1002' })
    expect(r.data[0]).toMatchObject({ sku: 'KM-1002', match: { by: 'sku' } })
    expect(r.data.slice(1).every((x) => x.match.by !== 'sku')).toBe(true)
    expect((await search({ q: 'km1002' })).data[0]!.sku).toBe('KM-1002')
  })

  it('finds an OE number as printed, without spaces, and with a slip', async () => {
    const detail = (await mgr.get('/api/parts/KM-1002')).body as { oeNumbers: { oeNumber: string }[] }
    const oe = detail.oeNumbers[0]!.oeNumber // e.g. "VLT 838 606 L"
    const exact = await search({ q: oe })
    expect(exact.data[0]).toMatchObject({ match: { by: 'oe', oeNumber: oe } })
    expect(exact.data.filter((x) => x.match.by === 'oe').map((x) => x.sku)).toContain('KM-1002')
    expect((await search({ q: oe.replace(/\s/g, '').toLowerCase() })).data[0]!.match.by).toBe('oe')
    // swap two neighbouring digits
    const digits = oe.replace(/(\d)(\d)/, (_m, a: string, b: string) => (a === b ? `${a}${(Number(b) + 1) % 10}` : `${b}${a}`))
    expect(digits).not.toBe(oe)
    const typo = await search({ q: digits })
    expect(typo.data.slice(0, 3).map((x) => x.sku)).toContain('KM-1002')
  })

  it('finds the replacement when an old superseded SKU is searched, and says so', async () => {
    const [s] = await dbRows<{ oldSku: string; newSku: string }>(
      'SELECT s.old_sku AS oldSku, p.sku AS newSku FROM supersessions s JOIN parts p ON p.id = s.new_part_id WHERE s.old_sku NOT IN (SELECT sku FROM parts) ORDER BY s.id LIMIT 1')
    const r = await search({ q: s!.oldSku })
    expect(r.data[0]).toMatchObject({ sku: s!.newSku, match: { by: 'superseded', replaces: { sku: s!.oldSku } } })
    expect(r.data[0]!.match.replaces!.note).toContain(s!.newSku)
    const page = await mgr.get(`/api/parts/${s!.oldSku}`)
    expect(page.status).toBe(200)
    expect(page.body).toMatchObject({ sku: s!.newSku, resolvedFrom: { sku: s!.oldSku } })
  })

  it('lists a discontinued SKU after its replacement', async () => {
    const [s] = await dbRows<{ oldSku: string; newSku: string }>(
      "SELECT s.old_sku AS oldSku, p.sku AS newSku FROM supersessions s JOIN parts p ON p.id = s.new_part_id JOIN parts o ON o.sku = s.old_sku AND o.status = 'discontinued' ORDER BY s.id LIMIT 1")
    const r = await search({ q: s!.oldSku })
    expect(r.data.slice(0, 2).map((x) => x.sku)).toEqual([s!.newSku, s!.oldSku])
    expect((await mgr.get(`/api/parts/${s!.oldSku}`)).body).toMatchObject({ status: 'discontinued', replacedBy: { sku: s!.newSku } })
  })

  it('ranks words, with typo tolerance, and reads type, axle and size words as filters', async () => {
    const words = await search({ q: 'pennon ceramic' })
    expect(words.data.length).toBeGreaterThan(0)
    expect(words.data.every((x) => /pennon/i.test(x.description) && /ceramic/i.test(`${x.description} ${x.productLine}`))).toBe(true)
    const typos = await search({ q: 'penon ceramik' })
    expect(typos.data.map((x) => x.sku).sort()).toEqual(words.data.map((x) => x.sku).sort())
    const sized = await search({ q: 'front disc 300' })
    expect(sized.meta.total).toBeGreaterThan(0)
    expect(sized.data.every((x) => x.type === 'disc' && x.axle === 'front' && x.specs.diameterMm === 300)).toBe(true)
  })
})

describe('specification range filters', () => {
  it('boreMm=22.22 finds master and wheel cylinders of that bore only', async () => {
    const r = await search({ boreMm: '22.22', pageSize: '100' })
    expect(r.meta.total).toBeGreaterThan(0)
    expect(r.data.every((x) => ['master_cylinder', 'wheel_cylinder'].includes(x.type) && Math.abs(x.specs.boreMm - 22.22) < 0.011)).toBe(true)
    const mc = await search({ q: 'master cylinder 22.22', pageSize: '100' })
    expect(mc.data.every((x) => x.type === 'master_cylinder' && x.specs.boreMm === 22.22)).toBe(true)
  })

  it('diameterMin/diameterMax keep discs within the range, with type and axle filters', async () => {
    const r = await search({ type: 'disc', axle: 'front', diameterMin: '280', diameterMax: '300', pageSize: '100' })
    expect(r.meta.total).toBeGreaterThan(0)
    expect(r.data.every((x) => x.type === 'disc' && x.axle === 'front' && x.specs.diameterMm >= 280 && x.specs.diameterMm <= 300)).toBe(true)
    const wider = await search({ type: 'disc', axle: 'front', diameterMin: '250', diameterMax: '350', pageSize: '1' })
    expect(wider.meta.total).toBeGreaterThan(r.meta.total)
  })
})

describe('paging', () => {
  it('pages on the server with a stable order and consistent meta', async () => {
    const p1 = await search({ type: 'pad_set', pageSize: '10', page: '1' })
    const p2 = await search({ type: 'pad_set', pageSize: '10', page: '2' })
    expect(p1.meta).toMatchObject({ page: 1, pageSize: 10, pages: Math.ceil(p1.meta.total / 10) })
    expect(p2.meta.total).toBe(p1.meta.total)
    expect(p1.data).toHaveLength(10)
    expect(p2.data.some((x) => p1.data.some((y) => y.sku === x.sku))).toBe(false)
    const last = await search({ type: 'pad_set', pageSize: '10', page: String(p1.meta.pages) })
    expect(last.data.length).toBe(p1.meta.total - (p1.meta.pages - 1) * 10)
    expect((await search({ type: 'pad_set', pageSize: '10', page: String(p1.meta.pages + 1) })).data).toEqual([])
  })
})

describe('bad input', () => {
  it.each([
    ['diameterMin=abc', 'diameterMin'], ['pageSize=0', 'pageSize'], ['pageSize=101', 'pageSize'], ['type=rotor', 'type'],
    ['diameterMin=300&diameterMax=280', 'diameterMax'], ['axle=middle', 'axle'], ['page=-1', 'page'],
  ])('%s -> 422 naming %s', async (query, field) => {
    const r = await mgr.get(`/api/parts?${query}`)
    expect(r.status).toBe(422)
    expect(Object.keys(r.body.data.fields)).toContain(field)
  })

  it('unknown SKU -> 404 with a message; malformed SKU -> 422', async () => {
    const r = await mgr.get('/api/parts/KX-0000')
    expect(r.status).toBe(404)
    expect(r.body.message).toBe('Part KX-0000 not found.')
    const bad = await mgr.get('/api/parts/has%20space')
    expect(bad.status).toBe(422)
    expect(bad.body.data.fields).toHaveProperty('sku')
  })
})
