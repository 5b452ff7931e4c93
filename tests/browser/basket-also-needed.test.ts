/**
 * The basket offers what its parts need beside them (a part's `alsoNeeded`: here the fitting kit of a pad set),
 * with one action that adds it in the quantity fitted with it; once in the basket it is no longer offered.
 * A garage of its own (tests/support/orders.ts), so no other test's basket is touched.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { as } from '../support/api'
import { launch, shot } from '../support/browser'
import { makeGarage, type TestGarage } from '../support/orders'
import { contextAs, PHONE, sidewaysScroll, visit } from '../support/screens'

describe('also needed in the basket', () => {
  let browser: Browser
  let garage: TestGarage
  let kit: { sku: string; quantity: number }
  beforeAll(async () => {
    browser = await launch()
    garage = await makeGarage({ terms: 'account', creditLimitMinor: 500_000, tier: 'Silver', label: 'Basket Garage' })
    const manager = await as(garage.email)
    kit = (await manager.get('/api/parts/KP-1001')).body.alsoNeeded.find((a: { relation: string }) => a.relation === 'fitting_kit')
    const put = await manager.request('/api/basket', { method: 'PUT', json: { items: [{ sku: 'KP-1001', description: 'Front pad set', quantity: 1 }] } })
    expect(put.status, put.text).toBe(200)
  })
  afterAll(async () => { await browser?.close() })

  it('lists the pad set\'s fitting kit and adds it in its fitted quantity with one action', async () => {
    const context = await contextAs(browser, garage.email, PHONE)
    const page = await context.newPage()
    await visit(page, '/orders/new')
    const offer = page.locator('#also-needed-h').locator('..')
    await offer.getByText(kit.sku).waitFor()
    await shot(page, 'basket-also-needed-390')
    expect((await sidewaysScroll(page)).overflow).toBeLessThanOrEqual(0)
    await offer.getByRole('button', { name: `Add ${kit.quantity} to the basket` }).click()
    await offer.getByText(kit.sku).waitFor({ state: 'detached' })
    const basket = (await (await as(garage.email)).get('/api/basket')).body.items as { sku: string; quantity: number }[]
    expect(basket.find((i) => i.sku === kit.sku)).toMatchObject({ quantity: kit.quantity })
    await context.close()
  })
})
