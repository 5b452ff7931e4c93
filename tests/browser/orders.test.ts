/**
 * The ordering journey in Chromium: a garage manager orders the approved lines of a quote, pays on the payment
 * fake's hosted page with 4242 4242 4242 4242 and lands back on the order marked paid; counter staff pick and
 * dispatch it; the garage books the old unit back, the counter accepts it, and the garage sees the credit.
 * Uses its own garage, part and quote so the demo data is left alone.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { env, people } from '../support/api'
import { foreignRequests, launch, newContext, open, shot, signInThroughForm } from '../support/browser'
import { makeGarage, makePart, makeQuote, type TestGarage, type TestPart } from '../support/orders'

let browser: Browser
let garage: TestGarage
let part: TestPart
let quoteId: number

beforeAll(async () => {
  browser = await launch()
  garage = await makeGarage({ terms: 'card', tier: 'Bronze', label: 'Browser Garage' })
  // Bronze: 5 % off £80.00 = £76.00 net now; the quote captured £74.10 when it was written
  part = await makePart({ listPriceMinor: 8_000, coreDepositMinor: 2_000, stock: { NGT: 6 } })
  quoteId = (await makeQuote(garage, 'partly_approved', [
    { sku: part.sku, partId: part.id, quantity: 2, unitNetMinor: 7_410, decision: 'approved' },
    { kind: 'labour', decision: 'approved' },
  ])).id
})
afterAll(async () => { await browser?.close() })

async function status(page: Page): Promise<string> {
  return (await page.getByTestId('order-status').first().textContent())?.trim() ?? ''
}

describe('ordering and paying in the browser', () => {
  it('orders a quote\'s approved lines, pays by card, is dispatched and gets the core credit back', async () => {
    const { context, requests } = await newContext(browser)
    const page = await context.newPage()
    await signInThroughForm(page, garage.email)

    // from the quote to the order, with the price change shown before confirming
    await page.goto(`/quotes/${quoteId}`, { waitUntil: 'networkidle' })
    await page.getByRole('link', { name: 'Order the approved parts' }).click()
    await page.waitForURL(new RegExp(`/orders/new\\?quote=${quoteId}`))
    const changes = page.getByTestId('price-changes')
    await changes.waitFor()
    expect(await changes.textContent()).toContain('quoted at £74.10, now £76.00')
    // parts 2 x £76.00 = £152.00, deposits 2 x £20.00 = £40.00; a deposit carries its part's VAT (20 %, gov.uk
    // "VAT rates"): VAT 20 % of £192.00 = £38.40; total £192.00 + £38.40 = £230.40
    expect(await page.getByTestId('order-total').textContent()).toBe('£230.40')
    await shot(page, 'orders-01-from-quote')
    await page.getByLabel('Pay by card now').check()
    await page.getByRole('button', { name: 'Place order and pay £230.40' }).click()

    // the payment fake's hosted page
    await page.waitForURL((u) => u.href.startsWith(`${env().paymentsUrl}/pay/`))
    await shot(page, 'orders-02-payment-page')
    await page.getByLabel('Test card number').fill('4242 4242 4242 4242')
    await page.getByRole('button', { name: /^Pay/ }).click()

    // back on the order, which shows as paid once the signed webhook has landed
    await page.waitForURL(/\/orders\/\d+\?checkout=done/)
    const orderId = Number(new URL(page.url()).pathname.split('/').pop())
    await page.getByTestId('paid-banner').waitFor()
    expect(await page.getByTestId('payment-state').first().textContent()).toBe('Paid by card')
    expect(await status(page)).toBe('Confirmed, waiting to be picked')
    await shot(page, 'orders-03-paid')

    // counter staff pick and dispatch it
    const counterCtx = await newContext(browser)
    const counter = await counterCtx.context.newPage()
    await signInThroughForm(counter, people.counter)
    // from the order's own page: after other tests the queue may hold it on a later page
    await open(counter, `/counter/orders/${orderId}`)
    await counter.getByRole('button', { name: 'Start picking' }).click()
    await counter.getByTestId('pick-list').waitFor()
    await shot(counter, 'orders-04-picking')
    await counter.getByRole('button', { name: 'Send what is picked' }).click()
    await counter.getByRole('button', { name: 'Mark delivered' }).waitFor()
    expect(await status(counter)).toBe('On its way')

    // the garage sees the same state and books the old units back
    await page.goto(`/orders/${orderId}`, { waitUntil: 'networkidle' })
    expect(await status(page)).toBe('On its way')
    await page.getByRole('button', { name: 'Book the old unit back' }).click()
    await page.getByRole('button', { name: 'Book return' }).click()
    await page.getByText('Booked to come back').waitFor()

    // the counter accepts them: the deposits and their VAT (2 x £20.00 + 20 % = £48.00) go back to the card
    await counter.goto('/counter/core-returns', { waitUntil: 'networkidle' })
    const booked = counter.locator('[data-core]', { hasText: part.sku })
    await booked.getByRole('button', { name: 'Accept: return £48.00' }).click()
    await booked.waitFor({ state: 'detached' })

    await page.reload({ waitUntil: 'networkidle' })
    const credit = page.getByTestId('core-credit')
    await credit.waitFor()
    expect(await credit.textContent()).toContain('£48.00 returned')
    await shot(page, 'orders-05-core-credit')
    await page.goto('/statement', { waitUntil: 'networkidle' })
    const statement = page.getByTestId('statement')
    await statement.getByText('Core credit').waitFor()
    expect(await statement.textContent()).toContain('-£48.00')
    await shot(page, 'orders-06-statement')

    expect(foreignRequests(requests)).toEqual([])
    await counterCtx.context.close()
    await context.close()
  })

  it('shows the reason when the card is declined and lets the garage try again', async () => {
    const { context } = await newContext(browser)
    const page = await context.newPage()
    await signInThroughForm(page, garage.email)
    // a basket order this time, from the part's page in the catalogue
    await page.goto(`/catalogue/parts/${part.sku}`, { waitUntil: 'networkidle' })
    await page.getByRole('button', { name: 'Add to order' }).click()
    await page.getByRole('link', { name: 'Review the order' }).click()
    await page.waitForURL(/\/orders\/new$/)
    await page.getByLabel('Pay by card now').check()
    await page.getByRole('button', { name: /Place order and pay/ }).click()
    await page.waitForURL((u) => u.href.startsWith(`${env().paymentsUrl}/pay/`))
    await page.getByLabel('Test card number').fill('4000 0000 0000 9995')
    await page.getByRole('button', { name: /^Pay/ }).click()
    await page.getByRole('alert').getByText('Your card has insufficient funds.').waitFor()
    await page.getByRole('link', { name: 'Cancel and go back' }).click()
    await page.waitForURL(/\/orders\/\d+\?checkout=left/)
    const decline = page.getByTestId('decline')
    await decline.waitFor()
    expect(await decline.textContent()).toContain('Your card has insufficient funds.')
    await shot(page, 'orders-07-declined')
    await page.getByRole('button', { name: 'Try the payment again' }).click()
    await page.waitForURL((u) => u.href.startsWith(`${env().paymentsUrl}/pay/`))
    await page.getByLabel('Test card number').fill('4242 4242 4242 4242')
    await page.getByRole('button', { name: /^Pay/ }).click()
    await page.getByTestId('paid-banner').waitFor()
    await context.close()
  })
})
