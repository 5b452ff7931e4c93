/**
 * The quote journey in Chromium: the technician drafts a quote for a vehicle chosen in the finder steps and one
 * of its inspections, and adds labour; the manager prices it and sends it; the owner opens the e-mailed link on
 * a phone-sized screen (390 px), declines a line marked required (reading what that means, ticking and signing
 * under it) and an advised line, approves the rest, watching the total change, and signs; the total on the page
 * is the one the server stores; the garage then sees the decision and the signed acknowledgement.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { foreignRequests, hydrated, launch, newContext, shot, signInThroughForm } from '../support/browser'
import { as, people, waitForMail } from '../support/api'
import { formatMinor } from '#shared/utils/money'
import { VEHICLE_ID, ownerEmail, uid } from '../support/quotes'

const registration = `BR${uid().slice(0, 2).toUpperCase()} QTE`
const owner = ownerEmail()

describe('a quote from the workshop to the owner\'s phone', () => {
  let browser: Browser
  let quoteUrl = ''
  let link = ''
  let pageTotal = ''

  beforeAll(async () => {
    browser = await launch()
    // the inspection the technician recorded at the car (front discs under their minimum, fluid with water)
    const tech = await as(people.technician)
    const r = await tech.post('/api/inspections', {
      vehicleId: VEHICLE_ID, registration, odometer: '61 250 mi',
      wear: { discs: [{ position: 'front-left', thicknessReadingsMm: [22.4, 22.5], minThicknessMm: 23 }], fluid: { gradeInSystem: 'DOT 4', waterPercent: 2.5 } },
    })
    expect(r.status, r.text).toBe(201)
  })
  afterAll(async () => { await browser?.close() })

  async function signedIn(email: string): Promise<{ page: Page; requests: string[] }> {
    const { context, requests } = await newContext(browser, { viewport: { width: 1280, height: 900 } })
    const page = await context.newPage()
    await signInThroughForm(page, email)
    return { page, requests }
  }

  it('the technician drafts from the vehicle and its inspection, then adds labour', async () => {
    const { page, requests } = await signedIn(people.technician)
    await page.goto('/quotes')
    await page.getByRole('link', { name: 'New quote' }).click()
    await page.waitForURL(/\/quotes\/new/)
    await page.getByLabel('Make').selectOption('Veltra')
    await page.getByLabel('Model').selectOption('Pennon')
    await page.getByLabel('Year').selectOption('2016')
    await page.getByRole('button', { name: /1\.4 petrol .*VE-P14T/ }).click()
    await page.getByRole('radio', { name: new RegExp(registration) }).check()
    expect(await page.locator('input[name=registration]').inputValue()).toBe(registration)
    await page.getByLabel('Owner\'s name').fill('Morwen Teague')
    await page.getByLabel('Owner\'s e-mail').fill(owner)
    await page.getByLabel('Owner\'s phone').fill('07700 900 777')
    await shot(page, 'quote-new')
    await page.getByRole('button', { name: 'Start the quote' }).click()
    await page.waitForURL(/\/quotes\/\d+$/)
    quoteUrl = new URL(page.url()).pathname
    const table = page.locator('table')
    await table.waitFor()
    expect(await table.getByText('Fix now').count()).toBeGreaterThanOrEqual(2) // discs and pads
    expect(await table.getByText('Fix soon').count()).toBeGreaterThanOrEqual(1) // the fluid
    // technicians do not see the garage's trade prices (Millbrook's setting)
    expect(await page.getByRole('columnheader', { name: 'Markup' }).count()).toBe(0)

    await page.getByRole('radio', { name: 'Labour' }).click()
    await page.getByLabel('Description').fill('Replace front discs and pads, change the fluid')
    await page.getByLabel('Hours').fill('2.2')
    await page.getByRole('button', { name: 'Add line' }).click()
    await table.getByText('Replace front discs and pads, change the fluid').waitFor()
    expect(await page.getByRole('button', { name: 'Send to owner' }).count()).toBe(0)
    await shot(page, 'quote-technician')
    expect(foreignRequests(requests)).toEqual([])
  })

  it('the manager prices it (markup visible) and sends it', async () => {
    const { page } = await signedIn(people.manager)
    await page.goto(quoteUrl)
    await page.getByRole('columnheader', { name: 'Markup' }).waitFor()
    const total = async () => page.locator('[data-total="gross"]').textContent()
    const before = await total()
    const pads = page.locator('tr[data-kind="part"]').filter({ hasText: 'pad' }).first()
    await pads.getByRole('button', { name: /^Edit/ }).click()
    await page.getByLabel('Markup %').fill('45')
    await page.getByRole('button', { name: 'Save line' }).click()
    await page.locator('tr[data-kind="part"]').filter({ hasText: '45 %' }).first().waitFor()
    expect(await total()).not.toBe(before)
    await page.getByLabel('Note to the owner (optional)').fill('We can start first thing tomorrow.')
    await page.getByRole('button', { name: 'Send to owner' }).click()
    await page.locator('[data-sent-note]').waitFor()
    expect(await page.locator('[data-status]').first().getAttribute('data-status')).toBe('sent')
    await shot(page, 'quote-manager-sent')
    // a full reload shows the quote as the server has it
    await page.reload()
    await page.locator('[data-status="sent"]').first().waitFor()
    expect(await page.locator('tr[data-kind="part"]').filter({ hasText: '45 %' }).count()).toBeGreaterThanOrEqual(1)
    const mail = await waitForMail(owner, /Your quote from Millbrook Motor Works/)
    link = /https?:\/\/\S+\/q\/[A-Za-z0-9_-]{43}/.exec(mail.text)![0]
    expect(mail.attachments).toHaveLength(1)
  })

  it('the owner opens the e-mailed link on a phone, declines a required line and signs for it, declines the advised line and approves the rest', async () => {
    const { context, requests } = await newContext(browser, { viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true, deviceScaleFactor: 2 })
    const page = await context.newPage()
    await page.goto(new URL(link).pathname)
    await page.getByRole('heading', { name: 'Hello Morwen Teague' }).waitFor()
    await hydrated(page)
    // no app chrome: no Boreline navigation or sign-in on the owner's page
    expect(await page.getByRole('navigation', { name: 'Main' }).count()).toBe(0)
    expect(await page.getByText('Millbrook Motor Works').first().isVisible()).toBe(true)
    await page.getByRole('heading', { name: 'What we found' }).waitFor()
    // the page fits the phone's width
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390)
    await shot(page, 'quote-owner-phone')

    const lines = page.locator('[data-owner-line]')
    const count = await lines.count()
    expect(count).toBeGreaterThanOrEqual(4)
    const live = async () => page.locator('[data-owner-live-total]').textContent()
    // required lines start approved; declining one opens what that means, to tick and sign
    const required = lines.filter({ hasText: 'Fix now' }).first()
    expect(await required.getByRole('radio', { name: 'Approve' }).getAttribute('aria-checked')).toBe('true')
    const withRequired = await live()
    await required.getByRole('radio', { name: 'Decline' }).tap()
    const ack = required.locator('[data-decline-ack]')
    await ack.waitFor()
    expect(await ack.textContent()).toContain('We advise you not to drive the vehicle until the work is done.')
    expect(await live()).not.toBe(withRequired)
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390)
    // the total follows the choices
    const advised = lines.filter({ hasText: 'Fix soon' }).first()
    await advised.getByRole('radio', { name: 'Approve' }).tap()
    const withAdvised = await live()
    await advised.getByRole('radio', { name: 'Decline' }).tap()
    expect(await live()).not.toBe(withAdvised)
    // everything else: approve
    const skip = [await required.getAttribute('data-owner-line'), await advised.getAttribute('data-owner-line')]
    for (let i = 0; i < count; i++) {
      const line = lines.nth(i)
      if (skip.includes(await line.getAttribute('data-owner-line'))) continue
      if (await line.locator('[role="radio"][aria-checked="true"]').count() === 0) await line.getByRole('radio', { name: 'Approve' }).tap()
    }
    await page.getByLabel('Type your full name to sign', { exact: true }).fill('Morwen Teague')
    // not signed for the declined safety work yet: refused beside that line, nothing sent
    await page.getByRole('button', { name: 'Send my decision' }).tap()
    await required.locator('.field-error').waitFor()
    expect(await page.locator('[data-decided]').count()).toBe(0)
    await ack.getByRole('checkbox').check()
    await ack.getByLabel('Type your full name to sign this').fill('Morwen Teague')
    pageTotal = (await live()) ?? ''
    await shot(page, 'quote-owner-chosen')
    await page.getByRole('button', { name: 'Send my decision' }).tap()
    await page.locator('[data-decided]').waitFor()
    expect(await page.locator('[data-decided]').textContent()).toMatch(/Thank you, Morwen Teague/)
    expect(await page.getByRole('button', { name: 'Send my decision' }).count()).toBe(0)
    expect(await page.getByText('You declined this').count()).toBe(2)
    expect(await page.locator('[data-declined-signed]').textContent()).toContain('signed by Morwen Teague')
    // the page's total is the server's approved total
    expect(await page.locator('[data-owner-total]').textContent()).toBe(pageTotal)
    await shot(page, 'quote-owner-decided')
    // read-only after reloading too
    await page.reload()
    await page.locator('[data-decided]').waitFor()
    expect(await page.getByRole('radio', { name: 'Approve' }).count()).toBe(0)
    expect(foreignRequests(requests)).toEqual([])
  })

  it('the garage sees the decision and the signed acknowledgement, and is told at once', async () => {
    const { page } = await signedIn(people.manager)
    await page.goto(quoteUrl)
    await page.locator('[data-status="partly_approved"]').first().waitFor()
    expect(await page.getByText('Owner declined').count()).toBe(2)
    expect(await page.getByText(/Approved by Morwen Teague/).count()).toBe(1)
    const record = page.locator('[data-decline-record]')
    expect(await record.count()).toBe(1)
    expect(await record.textContent()).toContain('signed by Morwen Teague')
    await page.locator('[data-declined-required]').waitFor()
    expect(await page.locator('[data-total="approved"]').textContent()).toBe(pageTotal)
    await shot(page, 'quote-garage-decided')
    const api = await as(people.manager)
    const detail = (await api.get(quoteUrl.replace('/quotes/', '/api/quotes/'))).body
    expect(formatMinor(detail.approvedTotals.grossMinor, 'GBP', 'en-GB')).toBe(pageTotal)
    await waitForMail(people.manager, /Safety work declined: quote .* partly approved by the owner/)
    await page.goto('/quotes')
    await page.locator(`[data-quote="${detail.id}"] [data-declined-required]`).waitFor()
    // where the manager chooses prices with tax, a price ending and who carries core deposits (looked at, not saved)
    await page.goto('/garage/settings')
    await page.getByLabel(/Show and enter prices with tax included/).waitFor()
    await page.getByLabel('Part prices after markup end in').selectOption('99')
    expect(await page.getByLabel(/Pass core deposits on to the owner/).isChecked()).toBe(false)
    await shot(page, 'quote-garage-settings')
  })
})
