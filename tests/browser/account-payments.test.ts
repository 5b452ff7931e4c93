/**
 * Settling a trade account in Chromium: the distributor admin books a bank transfer a garage made, sees the
 * balance fall on the account page, and the garage's manager sees "Payment received" on the statement with the
 * new balance. Uses its own garage with one order on account, so the demo data is left alone.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { as, people } from '../support/api'
import { foreignRequests, launch, newContext, open, shot, signInThroughForm } from '../support/browser'
import { makeGarage, makePart, type TestGarage } from '../support/orders'

let browser: Browser
let garage: TestGarage

beforeAll(async () => {
  browser = await launch()
  garage = await makeGarage({ terms: 'account', creditLimitMinor: 100_000, label: 'Settling Garage' })
  const part = await makePart({ listPriceMinor: 10_000, stock: { NGT: 5 } })
  // £100.00 net + VAT at 20 % (gov.uk "VAT rates") = £120.00 owed
  const placed = await (await as(garage.email)).post('/api/orders', { lines: [{ sku: part.sku, quantity: 1 }], payment: 'account' })
  expect(placed.status, placed.text).toBe(201)
})
afterAll(async () => { await browser?.close() })

describe('booking a payment received, in the browser', () => {
  it('the admin books a transfer and the garage sees it on its statement', async () => {
    const { context, requests } = await newContext(browser)
    const page = await context.newPage()
    await signInThroughForm(page, people.admin)
    await open(page, `/admin/trade-accounts/${garage.id}`)
    const form = page.getByTestId('account-payment')
    await expect.poll(() => form.getByTestId('account-balance').textContent()).toBe('£120.00')

    // too much first: refused next to the amount, nothing booked
    await form.getByLabel('Amount (£)').fill('150')
    await form.getByLabel('Bank or cheque reference').fill('BACS SETTLE-01')
    await form.getByRole('button', { name: 'Book the payment' }).click()
    await expect.poll(() => form.locator('#pay-amount-err').textContent()).toMatch(/owes £120\.00.*Book at most £120\.00/)

    await form.getByRole('button', { name: 'Use the amount owed' }).click()
    await form.getByRole('button', { name: 'Book the payment' }).click()
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'Booked' }).textContent()).toMatch(/Booked £120\.00 \(BACS SETTLE-01\)\..*now owes £0\.00/)
    await expect.poll(() => form.getByTestId('account-balance').textContent()).toBe('£0.00')
    await shot(page, 'account-payment-booked')
    expect(foreignRequests(requests)).toEqual([])
    await context.close()

    const garageSide = await newContext(browser)
    const g = await garageSide.context.newPage()
    await signInThroughForm(g, garage.email)
    await open(g, '/statement')
    await expect.poll(() => g.getByTestId('statement').textContent()).toContain('Payment received')
    expect(await g.getByTestId('statement-balance').textContent()).toBe('£0.00')

    // one month at a time, kept in the address across a reload; a month typed wrongly is named, not a dead end
    const thisMonth = new Date().toISOString().slice(0, 7)
    await g.getByTestId('statement-month').selectOption(thisMonth)
    await g.waitForURL((u) => u.searchParams.get('month') === thisMonth)
    await g.reload()
    await expect.poll(() => g.getByTestId('statement-period').textContent()).toMatch(/Brought forward into .*£0\.00.*Carried forward: £0\.00/)
    await open(g, '/statement?month=2026-13')
    await expect.poll(() => g.getByTestId('statement-month-error').textContent()).toMatch(/“2026-13” is not a month/)
    await expect.poll(() => g.getByTestId('statement').textContent()).toContain('Payment received')
    await garageSide.context.close()
  })
})
