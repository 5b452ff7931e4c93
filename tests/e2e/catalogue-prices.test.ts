/**
 * Catalogue e2e: prices by role. A garage sees list price and its net price (list less its tier discount; core
 * deposits are not discounted), distributor staff see list price and trade cost, a technician sees prices only when
 * the garage allows it. Tiers from the demo seed (server/seed/accounts.ts): Millbrook Silver 12.5 %, Tannery Yard
 * Bronze 5 %; Tannery Yard lets its technicians see prices, Millbrook does not.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { as, type Client, env, people } from '../support/api'

await setup({ host: env().baseUrl })

/**
 * Reference net price: list × (10000 − discount bp) / 10000 in whole minor units, a result between two pennies
 * rounded half away from zero. The rounding rule is the product's stated money rule (DEVELOPERS.md "Money rule",
 * shared/utils/money.ts: commercial rounding, common practice for invoices). Worked in exact BigInt arithmetic (the
 * language's integer type, not our money helper). By hand, Silver 12.5 %:
 *   list £45.99: 4599 × 8750 = 40 241 250; / 10 000 = 4024.125 -> 4024 (£40.24)
 *   list £10.04: 1004 × 8750 = 8 785 000; / 10 000 = 878.5, a half -> 879 (£8.79)
 * and Bronze 5 %: list £12.35: 1235 × 9500 = 11 732 500; / 10 000 = 1173.25 -> 1173 (£11.73).
 */
function expectedNet(listMinor: number, bp: number): number {
  const num = BigInt(listMinor) * BigInt(10_000 - bp)
  const q = num / 10_000n, r = num % 10_000n
  return Number(2n * r >= 10_000n ? q + 1n : q)
}
const SILVER_BP = 1250
const BRONZE_BP = 500

it('the reference net price agrees with the examples worked by hand', () => {
  expect(expectedNet(4599, SILVER_BP)).toBe(4024)
  expect(expectedNet(1004, SILVER_BP)).toBe(879)
  expect(expectedNet(1235, BRONZE_BP)).toBe(1173)
})

let mgr: Client, other: Client, tech: Client, otherTech: Client, counter: Client
let vehicleId: number
beforeAll(async () => {
  ;[mgr, other, tech, otherTech, counter] = await Promise.all([people.manager, people.otherManager, people.technician, people.otherTechnician, people.counter].map((p) => as(p)))
  vehicleId = (await mgr.get('/api/vehicles/facets?make=Veltra&model=Pennon&year=2020')).body.variants[0].vehicleId
})

type Money = { sku: string; listPriceMinor?: number; netPriceMinor?: number; tradeCostMinor?: number; coreDepositMinor?: number }
const rowsOf = (body: { groups: { types: { parts: Money[] }[] }[] }) => body.groups.flatMap((g) => g.types.flatMap((t) => t.parts))
const moneyKeys = (o: unknown): string[] => JSON.stringify(o).match(/"[A-Za-z]*Minor"/g) ?? []

describe('net price = list price less the tier discount', () => {
  it('for a Silver garage (12.5 %) and a Bronze garage (5 %), on every part that fits a vehicle', async () => {
    const mine = rowsOf((await mgr.get(`/api/vehicles/${vehicleId}/parts`)).body)
    const theirs = rowsOf((await other.get(`/api/vehicles/${vehicleId}/parts`)).body)
    expect(mine.length).toBeGreaterThan(20)
    for (const [i, row] of mine.entries()) {
      expect(Number.isInteger(row.listPriceMinor)).toBe(true)
      expect(row.netPriceMinor).toBe(expectedNet(row.listPriceMinor!, SILVER_BP))
      expect(theirs[i]!.listPriceMinor).toBe(row.listPriceMinor)
      expect(theirs[i]!.netPriceMinor).toBe(expectedNet(row.listPriceMinor!, BRONZE_BP))
      expect(theirs[i]!.coreDepositMinor).toBe(row.coreDepositMinor) // not discounted
      expect(row).not.toHaveProperty('tradeCostMinor')
    }
    expect(mine.some((r) => (r.coreDepositMinor ?? 0) > 0)).toBe(true)
  })

  it('on the part page and in search too', async () => {
    const page = (await mgr.get('/api/parts/KC-1007R')).body
    expect(page.netPriceMinor).toBe(expectedNet(page.listPriceMinor, SILVER_BP))
    expect(page.coreDepositMinor).toBeGreaterThan(0)
    expect(page.priceVersion).toBeGreaterThanOrEqual(1)
    const hit = (await other.get('/api/parts?q=KC-1007R')).body.data[0]
    expect(hit).toMatchObject({ sku: 'KC-1007R', listPriceMinor: page.listPriceMinor, netPriceMinor: expectedNet(page.listPriceMinor, BRONZE_BP), coreDepositMinor: page.coreDepositMinor })
  })
})

describe('who sees which prices', () => {
  it('a technician of a garage without the setting sees no money fields at all', async () => {
    const parts = await tech.get(`/api/vehicles/${vehicleId}/parts`)
    expect(parts.status).toBe(200)
    expect(rowsOf(parts.body).length).toBeGreaterThan(20)
    expect(moneyKeys(parts.body)).toEqual([])
    expect(parts.body.priceVersion).toBeNull()
    const page = await tech.get('/api/parts/KC-1007R')
    expect(moneyKeys(page.body)).toEqual([])
    expect(page.body.stock.length).toBe(2) // stock is still shown
    expect(moneyKeys((await tech.get('/api/parts?q=caliper')).body)).toEqual([])
  })

  it('a technician of a garage that allows it sees the garage prices', async () => {
    const page = (await otherTech.get('/api/parts/KC-1007R')).body
    expect(page.netPriceMinor).toBe(expectedNet(page.listPriceMinor, BRONZE_BP))
  })

  it('distributor staff see list price and trade cost, no garage net price', async () => {
    const page = (await counter.get('/api/parts/KC-1007R')).body
    expect(page.listPriceMinor).toBeGreaterThan(page.tradeCostMinor)
    expect(page).not.toHaveProperty('netPriceMinor')
    expect(page.coreDepositMinor).toBeGreaterThan(0)
  })
})
