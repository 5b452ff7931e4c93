/**
 * Every trade-account API route (and the foundation's), called as anonymous and as each role, against the
 * status each must get. Bodies are chosen so that a caller who passes the role check gets a harmless answer
 * (422, 409, 410 or a read), so the table never changes the demo data. A last check makes sure no route file
 * of these domains is missing from the table.
 */
import { readdirSync, statSync } from 'node:fs'
import { join, relative } from 'node:path'
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { Client, as, env, people } from '../support/api'
import { applicationForm, dbValue, newApprovedGarage, postApplication, sqlText, uniqueEmail } from '../support/accounts'

await setup({ host: env().baseUrl })

type Who = 'anon' | 'admin' | 'counter' | 'manager' | 'technician' | 'pending' | 'rejected'
const WHO: Who[] = ['anon', 'admin', 'counter', 'manager', 'technician', 'pending', 'rejected']

interface Row {
  route: string // "METHOD /api/pattern", as the route files name it
  call: (c: Client) => Promise<{ status: number }>
  expect: Record<Who, number>
}

/** Same status for everyone but anonymous (401), approved people as given, pending/rejected garages 403. */
function signedIn(approved: Partial<Record<Who, number>>, unapproved = 403): Record<Who, number> {
  return { anon: 401, admin: 403, counter: 403, manager: 403, technician: 403, pending: unapproved, rejected: unapproved, ...approved }
}
const all = (status: number): Record<Who, number> => Object.fromEntries(WHO.map((w) => [w, status])) as Record<Who, number>

const BOGUS_TOKEN = 'x'.repeat(43)
const clients = {} as Record<Who, Client>
const ids = { pendingApp: 0, approvedGarage: 0, tier: 0, tierInUse: 0, foreignStaff: 0 }

beforeAll(async () => {
  clients.anon = new Client()
  const emails: Record<Exclude<Who, 'anon'>, string> = {
    admin: people.admin, counter: people.counter, manager: people.manager, technician: people.technician,
    pending: people.pendingManager, rejected: people.rejectedManager,
  }
  for (const [who, email] of Object.entries(emails)) clients[who as Who] = await as(email)

  ids.pendingApp = dbValue<number>(`SELECT id FROM organisations WHERE name = 'Ashcombe Car Care'`)
  ids.approvedGarage = dbValue<number>(`SELECT id FROM organisations WHERE name = 'Millbrook Motor Works'`)
  ids.tierInUse = dbValue<number>(`SELECT tier_id FROM organisations WHERE name = 'Millbrook Motor Works'`)
  ids.tier = dbValue<number>(`SELECT id FROM discount_tiers WHERE name = 'Gold'`)
  // someone in a garage of our own making: the target of the staff routes for callers from elsewhere
  const garage = await newApprovedGarage(clients.admin)
  const email = uniqueEmail('far-technician')
  const invited = await garage.manager.post('/api/staff', { email, name: 'Far Technician', role: 'garage_technician' })
  expect(invited.status).toBe(201)
  ids.foreignStaff = dbValue<number>(`SELECT id FROM users WHERE email = ${sqlText(email)}`)
})

const rows: Row[] = [
  // foundation
  { route: 'GET /api/health', call: (c) => c.get('/api/health'), expect: all(200) },
  { route: 'GET /api/me', call: (c) => c.get('/api/me'), expect: { ...all(200), anon: 401 } },
  { route: 'GET /api/_auth/session', call: (c) => c.get('/api/_auth/session'), expect: all(200) },
  { route: 'POST /api/auth/sign-in', call: (c) => c.post('/api/auth/sign-in', {}), expect: all(422) },
  // links and applying: public
  { route: 'POST /api/auth/forgot-password', call: (c) => c.post('/api/auth/forgot-password', {}), expect: all(422) },
  { route: 'GET /api/auth/reset-password/:token', call: (c) => c.get(`/api/auth/reset-password/${BOGUS_TOKEN}`), expect: all(410) },
  { route: 'POST /api/auth/reset-password', call: (c) => c.post('/api/auth/reset-password', { token: BOGUS_TOKEN, password: 'long-enough-password' }), expect: all(410) },
  { route: 'GET /api/auth/invitations/:token', call: (c) => c.get(`/api/auth/invitations/${BOGUS_TOKEN}`), expect: all(410) },
  { route: 'POST /api/auth/invitations/accept', call: (c) => c.post('/api/auth/invitations/accept', { token: BOGUS_TOKEN, password: 'long-enough-password' }), expect: all(410) },
  { route: 'POST /api/trade-applications', call: (c) => postApplication(c, applicationForm({ businessName: 'Only a name' })), expect: all(422) },
  // the signed-in person
  { route: 'GET /api/account', call: (c) => c.get('/api/account'), expect: signedIn({ admin: 200, counter: 200, manager: 200, technician: 200 }) },
  { route: 'GET /api/trade-applications/mine', call: (c) => c.get('/api/trade-applications/mine'), expect: signedIn({ admin: 404, counter: 404, manager: 200, technician: 200 }, 200) },
  { route: 'PATCH /api/account/profile', call: (c) => c.patch('/api/account/profile', {}), expect: signedIn({ admin: 422, counter: 422, manager: 422, technician: 422 }) },
  { route: 'POST /api/account/password', call: (c) => c.post('/api/account/password', {}), expect: signedIn({ admin: 422, counter: 422, manager: 422, technician: 422 }) },
  // two-step sign-in: bodies that fail validation, so nobody's factor changes (the code step checks its body first)
  { route: 'POST /api/auth/mfa', call: (c) => c.post('/api/auth/mfa', {}), expect: all(422) },
  { route: 'GET /api/account/mfa', call: (c) => c.get('/api/account/mfa'), expect: signedIn({ admin: 200, counter: 200, manager: 200, technician: 200 }) },
  { route: 'POST /api/account/mfa/enrolment', call: (c) => c.post('/api/account/mfa/enrolment', { code: '1' }), expect: signedIn({ admin: 422, counter: 422, manager: 422, technician: 422 }) },
  { route: 'POST /api/account/mfa/enrolment/confirm', call: (c) => c.post('/api/account/mfa/enrolment/confirm', {}), expect: signedIn({ admin: 422, counter: 422, manager: 422, technician: 422 }) },
  { route: 'POST /api/account/mfa/off', call: (c) => c.post('/api/account/mfa/off', {}), expect: signedIn({ admin: 422, counter: 422, manager: 422, technician: 422 }) },
  { route: 'POST /api/account/mfa/recovery-codes', call: (c) => c.post('/api/account/mfa/recovery-codes', {}), expect: signedIn({ admin: 422, counter: 422, manager: 422, technician: 422 }) },
  // staff: managers of a garage, the distributor admin; someone of another organisation is 404
  { route: 'GET /api/staff', call: (c) => c.get('/api/staff'), expect: signedIn({ admin: 200, manager: 200 }) },
  { route: 'POST /api/staff', call: (c) => c.post('/api/staff', {}), expect: signedIn({ admin: 422, manager: 422 }) },
  { route: 'PATCH /api/staff/:id', call: (c) => c.patch(`/api/staff/${ids.foreignStaff}`, { role: 'garage_manager' }), expect: signedIn({ admin: 404, manager: 404 }) },
  { route: 'DELETE /api/staff/:id', call: (c) => c.del(`/api/staff/${ids.foreignStaff}`), expect: signedIn({ admin: 404, manager: 404 }) },
  { route: 'POST /api/staff/:id/mfa-reset', call: (c) => c.post(`/api/staff/${ids.foreignStaff}/mfa-reset`), expect: signedIn({ admin: 404, manager: 404 }) },
  // distributor admin
  { route: 'GET /api/admin/trade-applications', call: (c) => c.get('/api/admin/trade-applications?status=pending'), expect: signedIn({ admin: 200 }) },
  { route: 'GET /api/admin/trade-applications/:id', call: (c) => c.get(`/api/admin/trade-applications/${ids.pendingApp}`), expect: signedIn({ admin: 200 }) },
  { route: 'GET /api/admin/trade-applications/:id/document', call: (c) => c.get(`/api/admin/trade-applications/${ids.pendingApp}/document`), expect: signedIn({ admin: 200, counter: 200 }) },
  { route: 'POST /api/admin/trade-applications/:id/decision', call: (c) => c.post(`/api/admin/trade-applications/${ids.pendingApp}/decision`, {}), expect: signedIn({ admin: 422 }) },
  { route: 'GET /api/admin/trade-accounts', call: (c) => c.get('/api/admin/trade-accounts'), expect: signedIn({ admin: 200, counter: 200 }) },
  { route: 'GET /api/admin/trade-accounts/:id', call: (c) => c.get(`/api/admin/trade-accounts/${ids.approvedGarage}`), expect: signedIn({ admin: 200, counter: 200 }) },
  { route: 'PATCH /api/admin/trade-accounts/:id', call: (c) => c.patch(`/api/admin/trade-accounts/${ids.approvedGarage}`, {}), expect: signedIn({ admin: 422 }) },
  { route: 'PATCH /api/admin/trade-accounts/:id/home-branch', call: (c) => c.patch(`/api/admin/trade-accounts/${ids.approvedGarage}/home-branch`, {}), expect: signedIn({ admin: 422 }) },
  { route: 'GET /api/admin/trade-accounts/:id/open-items', call: (c) => c.get(`/api/admin/trade-accounts/${ids.approvedGarage}/open-items`), expect: signedIn({ admin: 200, counter: 200 }) },
  { route: 'GET /api/admin/trade-accounts/:id/stop', call: (c) => c.get(`/api/admin/trade-accounts/${ids.approvedGarage}/stop`), expect: signedIn({ admin: 200, counter: 200 }) },
  { route: 'POST /api/admin/trade-accounts/:id/stop-lift', call: (c) => c.post(`/api/admin/trade-accounts/${ids.approvedGarage}/stop-lift`, {}), expect: signedIn({ admin: 422 }) },
  { route: 'POST /api/admin/trade-accounts/:id/suspend', call: (c) => c.post(`/api/admin/trade-accounts/${ids.approvedGarage}/suspend`, {}), expect: signedIn({ admin: 422 }) },
  { route: 'POST /api/admin/trade-accounts/:id/payments', call: (c) => c.post(`/api/admin/trade-accounts/${ids.approvedGarage}/payments`, {}), expect: signedIn({ admin: 422 }) },
  { route: 'POST /api/admin/trade-accounts/:id/reactivate', call: (c) => c.post(`/api/admin/trade-accounts/${ids.approvedGarage}/reactivate`, {}), expect: signedIn({ admin: 409 }) },
  { route: 'GET /api/admin/tiers', call: (c) => c.get('/api/admin/tiers'), expect: signedIn({ admin: 200 }) },
  { route: 'POST /api/admin/tiers', call: (c) => c.post('/api/admin/tiers', {}), expect: signedIn({ admin: 422 }) },
  { route: 'PATCH /api/admin/tiers/:id', call: (c) => c.patch(`/api/admin/tiers/${ids.tier}`, {}), expect: signedIn({ admin: 422 }) },
  { route: 'DELETE /api/admin/tiers/:id', call: (c) => c.del(`/api/admin/tiers/${ids.tierInUse}`), expect: signedIn({ admin: 409 }) },
]
// these end the caller's session, so they run last
const closing: Row[] = [
  { route: 'POST /api/auth/sign-out', call: (c) => c.post('/api/auth/sign-out'), expect: all(200) },
  { route: 'DELETE /api/_auth/session', call: (c) => c.del('/api/_auth/session'), expect: all(200) },
]

describe('every route, as anonymous and as each role', () => {
  for (const row of rows) {
    it(`${row.route}`, async () => {
      const got = Object.fromEntries(await Promise.all(WHO.map(async (w) => [w, (await row.call(clients[w])).status] as const)))
      expect(got).toEqual(row.expect)
    })
  }

  for (const row of closing) {
    it(`${row.route} (fresh sessions)`, async () => {
      const got: Record<string, number> = {}
      for (const w of WHO) {
        const c = w === 'anon' ? new Client() : await as(({ admin: people.admin, counter: people.counter, manager: people.manager, technician: people.technician, pending: people.pendingManager, rejected: people.rejectedManager } as Record<string, string>)[w]!)
        got[w] = (await row.call(c)).status
        if (w !== 'anon') expect((await c.get('/api/me')).status, `${w} is signed out afterwards`).toBe(401)
      }
      expect(got).toEqual(row.expect)
    })
  }

  it('leaves out no route file of these domains', () => {
    const apiDir = join(import.meta.dirname, '../../server/api')
    const owned = [/^\/api\/auth\//, /^\/api\/account(\/|$)/, /^\/api\/staff(\/|$)/, /^\/api\/trade-applications(\/|$)/, /^\/api\/admin\/(trade-applications|trade-accounts|tiers)(\/|$)/, /^\/api\/(me|health)$/]
    const found: string[] = []
    const walk = (dir: string) => {
      for (const name of readdirSync(dir)) {
        const p = join(dir, name)
        if (statSync(p).isDirectory()) { walk(p); continue }
        const m = /^(.*)\.(get|post|patch|put|delete)\.ts$/.exec(relative(apiDir, p))
        if (!m) continue
        const path = `/api/${m[1]}`.replace(/\/index$/, '').replace(/\[([^\]]+)\]/g, ':$1')
        if (owned.some((r) => r.test(path))) found.push(`${m[2]!.toUpperCase()} ${path}`)
      }
    }
    walk(apiDir)
    const inTable = new Set([...rows, ...closing].map((r) => r.route))
    expect(found.filter((r) => !inTable.has(r))).toEqual([])
  })
})
