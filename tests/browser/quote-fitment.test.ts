/**
 * The fitment guard in the quote's add-line form, as a manager meets it: a disc for another car is refused beside
 * the SKU and a reason field appears to add it anyway; a part whose fit depends on the car asks the question in the
 * form, and the answer puts it on. Catalogue facts as in tests/e2e/jobs-fitment-guard.test.ts: vehicle 1 takes
 * front discs KD-1001/KD-1002 only; vehicle 2 asks the front disc diameter (288 or 312 mm) and KD-1005 fits 312 mm.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { hydrated, launch, newContext, shot, signInThroughForm } from '../support/browser'
import { as, people } from '../support/api'
import { startQuote } from '../support/quotes'

describe('the fitment guard in the quote form', () => {
  let browser: Browser
  let page: Page
  beforeAll(async () => {
    browser = await launch()
    const { context } = await newContext(browser, { viewport: { width: 1280, height: 900 } })
    page = await context.newPage()
    await signInThroughForm(page, people.manager)
  })
  afterAll(async () => { await browser?.close() })

  async function addSku(sku: string) {
    await page.getByRole('textbox', { name: 'SKU' }).fill(sku)
    await page.getByRole('button', { name: 'Add line' }).click()
  }

  it('refuses a disc for another car beside the SKU, and adds it with a reason kept for the garage', async () => {
    const { quote } = await startQuote(await as(people.manager), { vehicleId: 1 })
    await page.goto(`/quotes/${quote.id}`)
    await hydrated(page)
    await addSku('KD-1005')
    const override = page.locator('[data-override]')
    await override.waitFor()
    await expect(page.getByText(/KD-1005 does not fit/).first().isVisible()).resolves.toBe(true)
    // no internal field name reaches the page: the summary points at the fields instead
    await expect(page.locator('main').textContent()).resolves.not.toMatch(/\(sku\)/)
    await shot(page, 'quote-fit-refused')
    await override.locator('input').fill('Car has the larger brakes fitted')
    await page.getByRole('button', { name: 'Add line' }).click()
    await page.locator('tr, li, div').filter({ hasText: 'KD-1005' }).filter({ hasText: /larger brakes/ }).first().waitFor()
    await shot(page, 'quote-fit-override')
  })

  it('asks the open question about the car, and the answer puts the part on', async () => {
    const { quote } = await startQuote(await as(people.manager), { vehicleId: 2 })
    await page.goto(`/quotes/${quote.id}`)
    await hydrated(page)
    await addSku('KD-1005')
    const question = page.locator('[data-question="front_disc_diameter_mm"] select')
    await question.waitFor()
    await question.selectOption('312')
    await page.getByRole('button', { name: 'Add line' }).click()
    await page.locator('[data-question]').waitFor({ state: 'detached' })
    const lines = (await (await as(people.manager)).get(`/api/quotes/${quote.id}`)).body.lines as { sku: string; quantity: number }[]
    expect(lines.find((l) => l.sku === 'KD-1005')).toMatchObject({ quantity: 2 })
    await shot(page, 'quote-fit-answered')
  })
})
