/**
 * What was e-mailed about money owed, as the admin reads it in Chromium: after one run of the reminder job, the
 * overdue reminder to a garage with an item 10 days past due is listed with its recipient and outcome; one kind at a
 * time; and the page fits a phone's width.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { people } from '../support/api'
import { launch, newContext, open, shot, signInThroughForm } from '../support/browser'
import type { TestGarage } from '../support/orders'
import { owingGarage, runAccountsRemind } from '../support/money-owed'

let browser: Browser
let garage: TestGarage

beforeAll(async () => {
  browser = await launch()
  // booked 40 days ago with 30 payment days: 10 days overdue, past the 7-day reminder
  garage = await owingGarage('Reminded Browser', [{ amountMinor: 7_700, reference: 'REM-BR', daysAgo: 40 }])
  await runAccountsRemind(new Date())
})
afterAll(async () => { await browser?.close() })

describe('reminders sent', () => {
  it('the admin reads what went to whom', async () => {
    const { context } = await newContext(browser, { viewport: { width: 1280, height: 900 } })
    const page = await context.newPage()
    await signInThroughForm(page, people.admin)
    await open(page, '/admin/account-reminders')
    const row = page.getByTestId('account-reminders').locator('tr', { hasText: garage.name }).filter({ hasText: 'Overdue reminder' })
    await expect.poll(() => row.textContent()).toMatch(/7 days overdue.*£77\.00.*Sent/)
    await page.locator('select[name="kind"]').selectOption('overdue')
    await expect.poll(() => page.getByTestId('account-reminders').textContent()).not.toMatch(/Monthly statement/)
    await shot(page, 'account-reminders-desk')
    await page.setViewportSize({ width: 390, height: 844 })
    await open(page, '/admin/account-reminders')
    expect(await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)).toBeLessThanOrEqual(0)
    await shot(page, 'account-reminders-390')
    await context.close()
  })
})
