/**
 * Another garage's job card, invoice and quote suggestions answer 404 (never saying they exist); a distributor
 * person reaches none of them.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { type Client, Client as Anonymous, as, env, people } from '../support/api'
import { ALL_CHECKS, decidedQuote } from '../support/jobs'

await setup({ host: env().baseUrl })

let manager: Client, other: Client, otherTech: Client, counter: Client
let quoteId: number, invoiceId: number
beforeAll(async () => {
  ;[manager, other, otherTech, counter] = await Promise.all([as(people.manager), as(people.otherManager), as(people.otherTechnician), as(people.counter)])
  const q = await decidedQuote(manager, 1, ['KD-1001'], [], { odometer: '12 000 mi' })
  quoteId = q.quoteId
  await manager.post(`/api/quotes/${quoteId}/job-card/complete`, { odometer: 12_010, checks: ALL_CHECKS })
  invoiceId = (await manager.post(`/api/quotes/${quoteId}/invoice`)).body.id
})

describe('isolation', () => {
  it('another garage gets 404 for the job card, its PDF, sign-off, invoice, invoice PDF and payments', async () => {
    for (const c of [other, otherTech]) {
      expect((await c.get(`/api/quotes/${quoteId}/job-card`)).status).toBe(404)
      expect((await c.get(`/api/quotes/${quoteId}/job-card.pdf`)).status).toBe(404)
      expect((await c.get(`/api/quotes/${quoteId}/also-needed`)).status).toBe(404)
      expect((await c.post(`/api/quotes/${quoteId}/job-card/complete`, { odometer: 12_020, checks: ALL_CHECKS })).status).toBe(404)
      expect((await c.post(`/api/quotes/${quoteId}/invoice`)).status).toBe(404)
      expect((await c.get(`/api/garage/invoices/${invoiceId}`)).status).toBe(404)
      expect((await c.get(`/api/garage/invoices/${invoiceId}.pdf`)).status).toBe(404)
      expect((await c.post(`/api/garage/invoices/${invoiceId}/payments`, { method: 'cash', amountMinor: 1 })).status).toBe(404)
    }
  })

  it('the distributor\'s people and anonymous callers reach none of it', async () => {
    expect((await counter.get(`/api/quotes/${quoteId}/job-card`)).status).toBe(404)
    expect((await counter.get(`/api/garage/invoices/${invoiceId}`)).status).toBe(404)
    const anon = new Anonymous()
    expect((await anon.get(`/api/quotes/${quoteId}/job-card`)).status).toBe(401)
    expect((await anon.get(`/api/garage/invoices/${invoiceId}.pdf`)).status).toBe(401)
    expect((await anon.get('/api/labour-times?vehicleId=1')).status).toBe(401)
  })

  it('the garage\'s own people reach theirs', async () => {
    expect((await manager.get(`/api/garage/invoices/${invoiceId}`)).status).toBe(200)
  })
})
