/**
 * A suspended garage in Chromium: its manager signs in, is shown why the account is suspended, and can still open
 * the statement with what is still to pay, its ageing and the stop, while ordering pages send it back to its status
 * page. Uses its own garage with an overdue charge, so the demo data is left alone.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { as, people } from '../support/api'
import { foreignRequests, launch, newContext, open, shot, signInThroughForm } from '../support/browser'
import type { TestGarage } from '../support/orders'
import { owingGarage } from '../support/money-owed'

let browser: Browser
let garage: TestGarage

beforeAll(async () => {
  browser = await launch()
  // booked 70 days ago with 30 payment days: due 40 days ago, so in the 31-60 bucket and over the 30-day stop
  garage = await owingGarage('Suspended Garage', [{ amountMinor: 12_000, reference: 'OWE-OLD', daysAgo: 70 }])
  const suspended = await (await as(people.admin)).post(`/api/admin/trade-accounts/${garage.id}/suspend`, { reason: 'Statement unpaid for two months.' })
  expect(suspended.status, suspended.text).toBe(200)
})
afterAll(async () => { await browser?.close() })

describe('a suspended manager reads the statement', () => {
  it('sees what is owed and why ordering is closed', async () => {
    const { context, requests } = await newContext(browser)
    const page = await context.newPage()
    await signInThroughForm(page, garage.email)
    await open(page, '/orders')
    await page.waitForURL((u) => u.pathname === '/trade-application')
    await expect.poll(() => page.getByText('Statement unpaid for two months.').count()).toBe(1)
    await page.getByRole('link', { name: 'statement' }).click()
    await page.waitForURL((u) => u.pathname === '/statement')
    await expect.poll(() => page.getByTestId('statement-balance').textContent()).toBe('£120.00')
    expect(await page.getByTestId('account-stop').textContent()).toMatch(/£120\.00 is overdue by more than 30 days \(OWE-OLD\).*Pay £120\.00/)
    expect(await page.getByTestId('ageing').textContent()).toMatch(/31-60 days overdue£120\.00/)
    expect(await page.getByTestId('open-items').textContent()).toMatch(/OWE-OLD.*40 days/)
    // on stop: nothing offered on account, with what to pay; paying by card stays open
    expect(await page.getByTestId('statement-available').textContent()).toMatch(/£0\.00On stop: pay £120\.00/)
    expect(await page.getByTestId('pay-owed').textContent()).toMatch(/You owe £120\.00/)
    await shot(page, 'suspended-statement')
    await page.setViewportSize({ width: 390, height: 844 })
    await page.reload()
    await expect.poll(() => page.getByTestId('statement-balance').textContent()).toBe('£120.00')
    expect(await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)).toBeLessThanOrEqual(0)
    await shot(page, 'suspended-statement-390')
    expect(foreignRequests(requests)).toEqual([])
    await context.close()
  })
})
