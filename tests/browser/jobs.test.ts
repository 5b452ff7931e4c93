/**
 * From an approved quote to the owner's invoice, in Chromium: the technician opens the job card on a phone,
 * ticks the checks, enters the odometer and signs off; the manager issues the invoice from the quote; the owner's
 * e-mail with the invoice arrives in the SMTP fake.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { foreignRequests, hydrated, launch, newContext, shot, signInThroughForm } from '../support/browser'
import { as, people, waitForMail } from '../support/api'
import { decidedQuote } from '../support/jobs'

describe('from the job card to the owner\'s invoice', () => {
  let browser: Browser
  let quoteId = 0
  let ownerEmail = ''

  beforeAll(async () => {
    browser = await launch()
    const manager = await as(people.manager)
    ;({ quoteId, ownerEmail } = await decidedQuote(manager, 1, ['KD-1001', 'KP-1004'], ['KP-1004'], { odometer: '58 100 mi' }))
  })
  afterAll(async () => { await browser?.close() })

  async function signedIn(email: string, phone: boolean): Promise<{ page: Page; requests: string[] }> {
    const { context, requests } = await newContext(browser, phone
      ? { viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true, deviceScaleFactor: 2 }
      : { viewport: { width: 1280, height: 900 } })
    const page = await context.newPage()
    await signInThroughForm(page, email)
    return { page, requests }
  }

  it('the technician ticks the checks and signs off on a phone', async () => {
    const { page, requests } = await signedIn(people.technician, true)
    await page.goto(`/jobs/${quoteId}`)
    await hydrated(page)
    await page.getByRole('heading', { name: 'Job card' }).waitFor()
    await expect(page.getByRole('list', { name: 'Bleeding order' }).textContent()).resolves.toMatch(/Left rear.*Right front.*Right rear.*Left front/s)
    await expect(page.getByText('declined by the owner').count()).resolves.toBeGreaterThan(0)
    await shot(page, 'job-card-390')
    // signing off with a check missing says so beside the checks
    const boxes = page.getByRole('checkbox')
    const n = await boxes.count()
    for (let i = 1; i < n; i++) await boxes.nth(i).check()
    await page.getByLabel('Odometer now (mi)').fill('58130')
    await page.getByRole('button', { name: 'Sign the job off' }).click()
    await page.getByText(/Tick every check/).waitFor()
    await boxes.nth(0).check()
    await page.getByRole('button', { name: 'Sign the job off' }).click()
    await page.locator('[data-signed-off]').waitFor()
    await expect(page.locator('[data-signed-off]').textContent()).resolves.toMatch(/58,130 mi on the odometer/)
    await shot(page, 'job-card-signed-390')
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)
    expect(overflow).toBeLessThanOrEqual(0)
    expect(foreignRequests(requests)).toEqual([])
  })

  it('the manager issues the invoice and the owner receives it', async () => {
    const { page } = await signedIn(people.manager, false)
    await page.goto(`/quotes/${quoteId}`)
    await hydrated(page)
    await page.getByRole('button', { name: 'Issue the invoice to the owner' }).click()
    await page.locator('[data-invoice]').waitFor()
    await expect(page.locator('[data-invoice]').textContent()).resolves.toMatch(/INV \d{5}/)
    await shot(page, 'quote-invoiced-1280')
    const mail = await waitForMail(ownerEmail, /^Invoice INV \d{5} from Millbrook Motor Works/)
    expect(mail.attachments[0]!.filename).toMatch(/^invoice-\d{5}\.pdf$/)
  })
})
