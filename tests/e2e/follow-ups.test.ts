/**
 * Follow-up of declined work: an owner declines an advised line; the reminder falls due after the garage's weeks;
 * the job (run as `npm run reminders:run` with a moved clock) e-mails one reminder with a fresh quote link and an
 * unsubscribe link that works without signing in, and never twice; none without consent; none after unsubscribing.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { Client, as, env, mailFor, people } from '../support/api'
import { sendAndReadLink, uid } from '../support/quotes'
import { addVehicle, newRegistration, runReminderJob } from '../support/garage-vehicles'
import { makePart } from '../support/orders'

await setup({ host: env().baseUrl })

let manager: Client, tech: Client, other: Client
const anon = new Client()
const WEEK = 7 * 86_400_000
let sku: string

beforeAll(async () => {
  ;[manager, tech, other] = await Promise.all([as(people.manager), as(people.technician), as(people.otherManager)])
  sku = (await makePart({ listPriceMinor: 3_250, stock: { NGT: 5, RVS: 5 }, prefix: 'FU' })).sku
})

/** A car whose owner declines an advised part and approves the required labour; returns the owner's address. */
async function declinedWork(consent: boolean) {
  const email = `owner-${uid()}@owners.test`
  const v = await addVehicle(tech, {
    registration: newRegistration(), vehicleId: 1,
    customer: { name: 'Marlo Quist', email, reminderConsent: consent, consentSource: consent ? 'asked at the counter' : '' },
  })
  const q = await tech.post('/api/quotes', { vehicleId: 1, registration: v.registration, ownerName: 'Marlo Quist', ownerEmail: email, garageVehicleId: v.id })
  await tech.post(`/api/quotes/${q.body.id}/lines`, { kind: 'part', sku, quantity: 1, recommendation: 'advised' })
  const last = await tech.post(`/api/quotes/${q.body.id}/lines`, { kind: 'labour', description: 'Bleed the brakes', hours: 0.5 })
  const [part, labour] = last.body.lines
  const { token } = await sendAndReadLink(manager, q.body.id, email)
  const decided = await anon.post(`/api/quote-links/${token}/decision`, { lines: [{ id: part.id, approved: false }, { id: labour.id, approved: true }], signedName: 'Marlo Quist' })
  expect(decided.status, decided.text).toBe(200)
  return { email, vehicleId: v.id as number }
}

const reminders = async (to: string) => (await mailFor(to)).filter((m) => /A reminder from/.test(m.subject))

describe('with consent', () => {
  let owner: { email: string; vehicleId: number }
  let stopToken: string
  let quoteToken: string

  beforeAll(async () => { owner = await declinedWork(true) })

  it('schedules the declined advised line for the garage\'s weeks later (default 8), shown to the manager', async () => {
    const due = await manager.get('/api/garage/follow-ups?status=due&pageSize=100')
    expect(due.status).toBe(200)
    const mine = due.body.data.filter((f: { garageVehicleId: number }) => f.garageVehicleId === owner.vehicleId)
    expect(mine).toHaveLength(1)
    expect(mine[0]).toMatchObject({ recommendation: 'advised', status: 'scheduled', ownerName: 'Marlo Quist' })
    const weeks = (Date.parse(mine[0].dueAt) - Date.now()) / WEEK
    expect(weeks).toBeGreaterThan(7.99)
    expect(weeks).toBeLessThan(8.01)
    expect((await tech.get('/api/garage/follow-ups')).status).toBe(403)
    expect((await other.get('/api/garage/follow-ups?status=all&pageSize=100')).body.data.some((f: { garageVehicleId: number }) => f.garageVehicleId === owner.vehicleId)).toBe(false)
  })

  it('sends nothing before it is due', async () => {
    await runReminderJob(new Date(Date.now() + 7 * WEEK))
    expect(await reminders(owner.email)).toHaveLength(0)
  })

  it('sends one e-mail once due, with a fresh quote and a link that stops reminders; never twice', async () => {
    const at = new Date(Date.now() + 9 * WEEK)
    await runReminderJob(at)
    await runReminderJob(at)
    const sent = await reminders(owner.email)
    expect(sent).toHaveLength(1)
    const text = sent[0]!.text
    expect(text).toMatch(/Hello Marlo Quist/)
    const q = /\/q\/([A-Za-z0-9_-]{43})/.exec(text)
    const stop = /\/reminders\/stop\/([A-Za-z0-9_-]{43})/.exec(text)
    expect(q && stop).toBeTruthy()
    quoteToken = q![1]!
    stopToken = stop![1]!
    // the fresh quote offers the declined part again, at today's price, and its link works
    const view = await anon.get(`/api/quote-links/${quoteToken}`)
    expect(view.status).toBe(200)
    expect(view.body.lines.filter((l: { decidable: boolean }) => l.decidable).map((l: { description: string }) => l.description)).toHaveLength(1)
    const detail = await manager.get(`/api/garage/vehicles/${owner.vehicleId}`)
    expect(detail.body.followUps[0]).toMatchObject({ status: 'sent', newQuoteId: expect.any(Number) })
  })

  it('the unsubscribe link works without signing in, and no reminder follows', async () => {
    expect((await anon.get(`/api/reminder-links/${stopToken}`)).body).toMatchObject({ garage: 'Millbrook Motor Works', subscribed: true })
    const page = await anon.get(`/reminders/stop/${stopToken}`)
    expect(page.status).toBe(200)
    expect(page.text).toMatch(/Stop reminders from Millbrook Motor Works/)
    const r = await anon.post(`/api/reminder-links/${stopToken}/unsubscribe`)
    expect(r.status).toBe(200)
    expect(r.body).toEqual({ garage: 'Millbrook Motor Works', subscribed: false })
    expect((await anon.post(`/api/reminder-links/${stopToken}/unsubscribe`)).status).toBe(200)
    const customer = (await manager.get(`/api/garage/vehicles/${owner.vehicleId}`)).body.customer
    expect(customer).toMatchObject({ reminderConsent: false, consentSource: 'unsubscribe link in a reminder' })
    // the owner declines the fresh quote too: the new follow-up is held, no e-mail goes out
    const view = await anon.get(`/api/quote-links/${quoteToken}`)
    const lines = view.body.lines.filter((l: { decidable: boolean }) => l.decidable).map((l: { id: number }) => ({ id: l.id, approved: false }))
    expect((await anon.post(`/api/quote-links/${quoteToken}/decision`, { lines, signedName: 'Marlo Quist' })).status).toBe(200)
    await runReminderJob(new Date(Date.now() + 20 * WEEK))
    expect(await reminders(owner.email)).toHaveLength(1)
    const held = await manager.get('/api/garage/follow-ups?status=held&pageSize=100')
    expect(held.body.data.some((f: { garageVehicleId: number }) => f.garageVehicleId === owner.vehicleId)).toBe(true)
  })

  it('a wrong unsubscribe link is a plain 404', async () => {
    expect((await anon.post(`/api/reminder-links/${'x'.repeat(43)}/unsubscribe`)).status).toBe(404)
  })
})

describe('without consent', () => {
  it('sends nothing and holds the follow-up for the garage to call', async () => {
    const owner = await declinedWork(false)
    await runReminderJob(new Date(Date.now() + 9 * WEEK))
    expect(await reminders(owner.email)).toHaveLength(0)
    const held = await manager.get('/api/garage/follow-ups?status=held&pageSize=100')
    const mine = held.body.data.find((f: { garageVehicleId: number }) => f.garageVehicleId === owner.vehicleId)
    expect(mine).toMatchObject({ status: 'held', statusNote: expect.stringMatching(/not agreed to reminders/) })
  })
})

describe('the garage\'s weeks', () => {
  it('are the manager\'s to change, checked beside each field', async () => {
    expect((await manager.get('/api/garage/follow-ups/settings')).body).toEqual({ advisedWeeks: 8, requiredWeeks: 2 })
    const bad = await manager.patch('/api/garage/follow-ups/settings', { advisedWeeks: 0 })
    expect(bad.status).toBe(422)
    expect(bad.body.data.fields.advisedWeeks).toMatch(/At least 1 week/)
    expect((await tech.patch('/api/garage/follow-ups/settings', { advisedWeeks: 6 })).status).toBe(403)
    const other2 = await other.patch('/api/garage/follow-ups/settings', { advisedWeeks: 6 })
    expect(other2.body).toEqual({ advisedWeeks: 6, requiredWeeks: 2 })
    expect((await manager.get('/api/garage/follow-ups/settings')).body.advisedWeeks).toBe(8)
  })
})
