/**
 * The dashboards in Chromium: the admin opens the distributor's dashboard, reads the figures with their units and
 * narrows the range to one day (kept in the address); a garage manager opens their own. Each page is checked at
 * desk size and at 390 px wide (a phone), where nothing may scroll sideways.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { people } from '../support/api'
import { foreignRequests, launch, newContext, open, shot, signInThroughForm } from '../support/browser'
import { makeGarage } from '../support/orders'

let browser: Browser
beforeAll(async () => { browser = await launch() })
afterAll(async () => { await browser?.close() })

const sideways = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)

describe('the distributor dashboard', () => {
  it('the admin opens it and narrows the range', async () => {
    const { context, requests } = await newContext(browser, { viewport: { width: 1280, height: 900 } })
    const page = await context.newPage()
    await signInThroughForm(page, people.admin)
    await open(page, '/dashboard')
    await expect.poll(() => page.getByTestId('dash-sales').textContent()).toMatch(/^£[\d,]+\.\d{2}$/)
    expect(await page.getByTestId('dash-fill').textContent()).toMatch(/%|no lines sent/)
    expect(await page.getByTestId('dash-sales-day').textContent()).toMatch(/One row per day of the range \(30 days; at most 366\)/)
    expect(await page.getByTestId('dash-parts').textContent()).toMatch(/The 10 best sellers at most/)
    await shot(page, 'dashboard-distributor-desk')
    const today = new Date().toISOString().slice(0, 10)
    await page.getByLabel('First day').fill(today)
    await page.getByLabel('Last day').fill(today)
    await page.getByRole('button', { name: 'Show' }).click()
    await page.waitForURL((u) => u.searchParams.get('from') === today && u.searchParams.get('to') === today)
    await expect.poll(() => page.getByTestId('dash-range-text').textContent()).toMatch(/\(1 day\)/)
    expect(await page.getByTestId('dash-csv').getAttribute('href')).toBe(`/api/dashboard/distributor.csv?from=${today}&to=${today}`)
    await page.getByLabel('First day').fill('2031-03-05')
    await page.getByLabel('Last day').fill('2031-03-01')
    await page.getByRole('button', { name: 'Show' }).click()
    await expect.poll(() => page.getByText('The last day comes before the first.').count()).toBe(1)
    // the same range in a link typed by hand (a full load): the message beside "Last day", the days as typed, no
    // page-wide error naming the field by its parameter
    await open(page, '/dashboard?from=2031-03-05&to=2031-03-01')
    const last = page.getByLabel('Last day')
    await expect.poll(() => last.getAttribute('aria-invalid')).toBe('true')
    expect(await page.locator(`#${await last.getAttribute('aria-describedby')}`).textContent()).toBe('The last day comes before the first.')
    expect([await page.getByLabel('First day').inputValue(), await last.inputValue()]).toEqual(['2031-03-05', '2031-03-01'])
    expect(await page.getByRole('alert').count()).toBe(0)
    await page.setViewportSize({ width: 390, height: 844 })
    await open(page, '/dashboard')
    await expect.poll(() => page.getByTestId('dash-sales').count()).toBe(1)
    expect(await sideways(page)).toBeLessThanOrEqual(0)
    await shot(page, 'dashboard-distributor-390')
    expect(foreignRequests(requests)).toEqual([])
    await context.close()
  })
})

describe('the garage dashboard', () => {
  it('a manager opens their own, at desk size and on a phone', async () => {
    const g = await makeGarage({ terms: 'account', creditLimitMinor: 100_000, label: 'Dash Browser' })
    const { context } = await newContext(browser, { viewport: { width: 1280, height: 900 } })
    const page = await context.newPage()
    await signInThroughForm(page, g.email)
    await open(page, '/dashboard')
    await expect.poll(() => page.getByTestId('dash-quotes').textContent()).toBe('no quotes sent')
    expect(await page.getByTestId('dash-reminders').textContent()).toMatch(/0 e-mails/)
    await shot(page, 'dashboard-garage-desk')
    await page.setViewportSize({ width: 390, height: 844 })
    await open(page, '/dashboard')
    await expect.poll(() => page.getByTestId('dash-quotes').count()).toBe(1)
    expect(await sideways(page)).toBeLessThanOrEqual(0)
    await shot(page, 'dashboard-garage-390')
    await context.close()
  })
})
