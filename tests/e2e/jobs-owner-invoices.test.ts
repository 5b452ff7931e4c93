/**
 * The garage's invoice to the owner: only after sign-off, only by a manager, what the owner approved (tax per
 * rate), e-mailed with its PDF, numbered per garage with no gaps even when issued at the same moment, one per job,
 * and payments taken at the desk.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { type Client, as, env, people, waitForMail } from '../support/api'
import { ALL_CHECKS, decidedQuote } from '../support/jobs'

await setup({ host: env().baseUrl })

let manager: Client, tech: Client, other: Client
beforeAll(async () => {
  ;[manager, tech, other] = await Promise.all([as(people.manager), as(people.technician), as(people.otherManager)])
})

async function signedOff(c: Client, decline: string[] = ['KP-1004']) {
  const q = await decidedQuote(c, 1, ['KD-1001', 'KP-1004'], decline, { odometer: '30 000 mi' })
  const r = await c.post(`/api/quotes/${q.quoteId}/job-card/complete`, { odometer: 30_050, checks: ALL_CHECKS })
  if (r.status !== 200) throw new Error(r.text)
  return q
}

describe('owner invoices', () => {
  it('waits for the sign-off, is a manager\'s, holds the approved work and reaches the owner', async () => {
    const q = await decidedQuote(manager, 1, ['KD-1001', 'KP-1004'], ['KP-1004'], { odometer: '30 000 mi' })
    expect((await manager.post(`/api/quotes/${q.quoteId}/invoice`)).status).toBe(409)
    await tech.post(`/api/quotes/${q.quoteId}/job-card/complete`, { odometer: 30_050, checks: ALL_CHECKS })
    expect((await tech.post(`/api/quotes/${q.quoteId}/invoice`)).status).toBe(403)
    const r = await manager.post(`/api/quotes/${q.quoteId}/invoice`)
    expect(r.status, r.text).toBe(201)
    const quote = (await manager.get(`/api/quotes/${q.quoteId}`)).body
    expect(r.body.grossMinor).toBe(quote.approvedTotals.grossMinor)
    expect(r.body.taxMinor).toBe(quote.approvedTotals.taxMinor)
    expect(r.body.lines.map((l: { description: string }) => l.description).join(' ')).not.toMatch(/KP-1004/)
    expect(r.body.taxByRate.reduce((s: number, x: { taxMinor: number }) => s + x.taxMinor, 0)).toBe(r.body.taxMinor)
    expect(r.body.mailed).toBe(true)
    const mail = await waitForMail(q.ownerEmail, /^Invoice INV \d{5} from Millbrook/)
    expect(mail.attachments[0]!.filename).toMatch(/^invoice-\d{5}\.pdf$/)
    const pdf = await manager.get(`/api/garage/invoices/${r.body.id}.pdf`)
    expect(pdf.status).toBe(200)
    expect(pdf.headers.get('content-type')).toBe('application/pdf')
    expect((await manager.post(`/api/quotes/${q.quoteId}/invoice`)).body.data.invoiceId).toBe(r.body.id)
    expect((await tech.get(`/api/quotes/${q.quoteId}/job-card`)).body.invoiceId).toBe(r.body.id)
  })

  it('numbers without gaps when issued concurrently, per garage', async () => {
    const quotes = await Promise.all([signedOff(manager), signedOff(manager), signedOff(manager), signedOff(manager), signedOff(manager)])
    const issued = await Promise.all(quotes.map((q) => manager.post(`/api/quotes/${q.quoteId}/invoice`)))
    expect(issued.map((r) => r.status)).toEqual([201, 201, 201, 201, 201])
    const numbers = issued.map((r) => r.body.number as number).sort((a, b) => a - b)
    for (let i = 1; i < numbers.length; i++) expect(numbers[i]).toBe(numbers[i - 1]! + 1)
    // another garage's series starts on its own
    const theirs = await signedOff(other, [])
    const first = await other.post(`/api/quotes/${theirs.quoteId}/invoice`)
    expect(first.status, first.text).toBe(201)
    expect(first.body.number).toBe(1)
  })

  it('records payments at the desk up to what is due', async () => {
    const q = await signedOff(manager)
    const inv = (await manager.post(`/api/quotes/${q.quoteId}/invoice`)).body
    const part = await manager.post(`/api/garage/invoices/${inv.id}/payments`, { method: 'card', amountMinor: 1000 })
    expect(part.status, part.text).toBe(201)
    expect(part.body).toMatchObject({ paidMinor: 1000, dueMinor: inv.grossMinor - 1000 })
    const over = await manager.post(`/api/garage/invoices/${inv.id}/payments`, { method: 'cash', amountMinor: inv.grossMinor })
    expect(over.status).toBe(422)
    expect(over.body.data.fields.amountMinor).toMatch(/more than is still due/)
    const rest = await manager.post(`/api/garage/invoices/${inv.id}/payments`, { method: 'transfer', amountMinor: inv.grossMinor - 1000, reference: 'Bank ref 881' })
    expect(rest.body.dueMinor).toBe(0)
    expect((await manager.post(`/api/garage/invoices/${inv.id}/payments`, { method: 'cheque', amountMinor: 1 })).status).toBe(422)
  })
})
