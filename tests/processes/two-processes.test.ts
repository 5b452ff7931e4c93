/**
 * Two server processes on one PostgreSQL database (runs with the e2e project on PostgreSQL: BORELINE_TEST_PG_URL).
 * The first is the run's e2e server (tests/support/global-setup.ts); this file starts a second from the same build
 * with the same settings, and checks that the two agree: stock, sign-outs, throttles, scheduled jobs and prices.
 */
import { describe, expect, it } from 'vitest'
import { Client, as, people } from '../support/api'
import { dbAll } from '../support/db'
import { makeGarage, makePart, linesOf, stockOf } from '../support/orders'
import { through, useTwoProcesses } from '../support/second-process'
import { SIGN_IN_LIMIT } from '../../server/services/throttle'

const bases = useTwoProcesses()

describe('two server processes on one PostgreSQL database', () => {
  it('20 concurrent orders split across both for the last 5 units: exactly 5 come off the shelf', async () => {
    const garages = await Promise.all([makeGarage({ terms: 'account', creditLimitMinor: 1_000_000, label: 'Two A' }), makeGarage({ terms: 'account', creditLimitMinor: 1_000_000, label: 'Two B' })])
    const signedIn = await Promise.all(garages.map((g) => as(g.email)))
    const clients = [through(bases.a, signedIn[0]!), through(bases.b, signedIn[1]!)]
    const part = await makePart({ listPriceMinor: 1_000, stock: { NGT: 5 } })
    const results = await Promise.all(Array.from({ length: 20 }, (_, i) =>
      clients[i % 2]!.post('/api/orders', { lines: [{ sku: part.sku, quantity: 1 }], payment: 'account' })))
    expect(results.map((r) => r.status)).toEqual(Array(20).fill(201))
    const lines = (await Promise.all(results.map((r) => linesOf(r.body.id as number)))).flat()
    const units = (source: string) => lines.filter((l) => l.source === source).reduce((s, l) => s + l.quantity, 0)
    expect({ home: units('home'), backOrder: units('back_order') }).toEqual({ home: 5, backOrder: 15 })
    expect(await stockOf(part.id)).toBe(0)
  })

  it('a cookie signed out through one process is refused by the other on the next request', async () => {
    const garage = await makeGarage({ terms: 'card', label: 'Two sign-out' })
    const a = through(bases.a, await as(garage.email))
    const b = through(bases.b, a)
    expect((await b.get('/api/me')).status).toBe(200)
    const cookie = new Map(a.cookies)
    expect((await a.post('/api/auth/sign-out')).status).toBeLessThan(300)
    const stale = new Client(bases.b)
    stale.cookies = cookie
    expect((await stale.get('/api/me')).status).toBe(401)
  })

  it('the sign-in throttle counts the attempts made through both processes', async () => {
    const garage = await makeGarage({ terms: 'card', label: 'Two throttle' })
    const statuses: number[] = []
    // wrong passwords, alternating between the processes, one at a time so the order is known
    for (let i = 0; i < SIGN_IN_LIMIT.pointsPerPair + 1; i++) {
      const r = await new Client(i % 2 ? bases.b : bases.a).post('/api/auth/sign-in', { email: garage.email, password: `not-it-${i}` })
      statuses.push(r.status)
    }
    // 10 failures per e-mail and address in 15 minutes, then 429 (server/services/throttle.ts), wherever they came in
    expect(statuses.slice(0, SIGN_IN_LIMIT.pointsPerPair).every((s) => s === 401)).toBe(true)
    expect(statuses.at(-1)).toBe(429)
  }, 120_000)

  it('a scheduled job runs once across the processes: one job per period, taken by one of them', async () => {
    // the back-order fill is offered every 2 s by both processes (server/plugins/31.back-orders.ts)
    await new Promise((r) => setTimeout(r, 5_000))
    const rows = await dbAll<{ slot: string; jobs: number; done: number }>(
      `SELECT CAST(singleton_on AS TEXT) AS slot, COUNT(*) AS jobs, SUM(CASE WHEN state = 'completed' THEN 1 ELSE 0 END) AS done
         FROM pgboss.job WHERE name = 'boreline-back-order-fill' GROUP BY singleton_on`)
    expect(rows.length).toBeGreaterThan(1)
    expect(rows.every((r) => Number(r.jobs) === 1)).toBe(true)
    expect(rows.filter((r) => Number(r.done) === 1).length).toBeGreaterThan(0)
  })

  it('a price change made through one process shows through the other within a second', async () => {
    const admin = await as(people.admin)
    const tier = await admin.post('/api/admin/tiers', { name: `Two tier ${Date.now()}`, percent: 10 })
    expect(tier.status, tier.text).toBe(201)
    const garage = await makeGarage({ terms: 'card', tier: tier.body.name, label: 'Two price' })
    const part = await makePart({ listPriceMinor: 10_000, stock: { NGT: 1 } })
    const b = through(bases.b, await as(garage.email))
    // list 100.00, 10 % off: 90.00
    expect((await b.get(`/api/parts/${part.sku}`)).body.netPriceMinor).toBe(9_000)
    const changed = await through(bases.a, admin).patch(`/api/admin/tiers/${tier.body.id}`, { percent: 20 })
    expect(changed.status, changed.text).toBe(200)
    const until = Date.now() + 1_000
    let net = 0
    do {
      net = (await b.get(`/api/parts/${part.sku}`)).body.netPriceMinor
      if (net === 8_000) break // 20 % off 100.00
      await new Promise((r) => setTimeout(r, 50))
    } while (Date.now() < until)
    expect(net).toBe(8_000)
  })
})
