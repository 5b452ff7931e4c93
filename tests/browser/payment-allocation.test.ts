/**
 * The admin allocates a payment to the item the remittance names, in Chromium: two open items, the newer one chosen
 * and paid in part; the garage's statement then shows that item part paid and the older one untouched.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { as, people } from '../support/api'
import { launch, newContext, open, shot, signInThroughForm } from '../support/browser'
import type { TestGarage } from '../support/orders'
import { owingGarage } from '../support/money-owed'

let browser: Browser
let garage: TestGarage

beforeAll(async () => {
  browser = await launch()
  garage = await owingGarage('Allocating Garage', [{ amountMinor: 10_000, reference: 'ALLOC-OLD', daysAgo: 20 }, { amountMinor: 20_000, reference: 'ALLOC-NEW', daysAgo: 5 }])
})
afterAll(async () => { await browser?.close() })

describe('allocating a payment', () => {
  it('pays the item chosen rather than the oldest', async () => {
    const { context } = await newContext(browser)
    const page = await context.newPage()
    await signInThroughForm(page, people.admin)
    await open(page, `/admin/trade-accounts/${garage.id}`)
    const form = page.getByTestId('account-payment')
    await expect.poll(() => form.getByTestId('account-balance').textContent()).toBe('£300.00')
    await form.getByLabel('Amount (£)').fill('50.00')
    await form.getByLabel('Bank or cheque reference').fill('REMIT 77')
    await form.getByTestId('allocation-choose').check()
    const picker = form.getByTestId('allocation-picker')
    await expect.poll(() => picker.textContent()).toMatch(/ALLOC-OLD.*ALLOC-NEW/)
    await picker.getByRole('checkbox').nth(1).check()
    await picker.getByLabel('Amount for ALLOC-NEW').fill('50.00')
    await shot(page, 'payment-allocation-chosen')
    await form.getByRole('button', { name: 'Book the payment' }).click()
    await expect.poll(() => form.getByTestId('account-balance').textContent()).toBe('£250.00')
    await context.close()

    const items = (await (await as(garage.email)).get('/api/statement')).body.openItems
    // 50.00 set against ALLOC-NEW (200.00): 150.00 left on it; ALLOC-OLD untouched at 100.00
    expect(items.map((i: any) => [i.reference, i.paidMinor, i.openMinor])).toEqual([['ALLOC-OLD', 0, 10_000], ['ALLOC-NEW', 5_000, 15_000]])
  })
})
