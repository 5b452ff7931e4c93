/**
 * Catalogue journeys in Chromium: the vehicle finder from make to parts for a vehicle with an option
 * question, the choice surviving a reload, and a search for an OE number typed with a slip.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { foreignRequests, hydrated, launch, newContext, open, shot, signInThroughForm } from '../support/browser'
import { people } from '../support/api'

describe('catalogue in Chromium', () => {
  let browser: Browser
  let context: BrowserContext
  let requests: string[]
  let page: Page

  beforeAll(async () => {
    browser = await launch()
    ;({ context, requests } = await newContext(browser, { viewport: { width: 1280, height: 900 } }))
    page = await context.newPage()
    await signInThroughForm(page, people.manager)
  })
  afterAll(async () => { await browser?.close() })

  const frontDiscDiameters = () => page.locator('section[aria-labelledby="axle-front"] [data-type="disc"] tr[data-sku] td:nth-child(3)').allTextContents()
    .then((cells) => [...new Set(cells.map((c) => c.trim().split(' ')[0]))].sort())

  it('finds the parts for a vehicle from make to engine, asks the disc question and narrows the list', async () => {
    await open(page, '/catalogue')
    await page.getByRole('button', { name: /^Veltra/ }).click()
    await page.getByRole('button', { name: /^Pennon/ }).click()
    await page.getByRole('button', { name: /^2020/ }).click()
    await page.getByRole('group', { name: 'Engine / variant' }).or(page.getByText('Engine / variant')).first().waitFor()
    await page.getByRole('button', { name: /1\.4 petrol/ }).click()
    await page.getByRole('heading', { name: 'Check at the car' }).waitFor()
    expect(page.url()).toMatch(/make=Veltra&model=Pennon&year=2020&vehicle=\d+/)
    expect(await frontDiscDiameters()).toEqual(['280', '300'])
    await expect(page.getByText(/Front disc diameter: 280 mm or 300 mm\?/).textContent()).resolves.toMatch(/Measure/)
    await shot(page, 'catalogue-finder-question')

    await page.locator('[data-option="front_disc_diameter_mm=300"]').click()
    await page.getByRole('heading', { name: 'Your answers' }).waitFor()
    await page.waitForURL(/opt\.front_disc_diameter_mm=300/)
    expect(await frontDiscDiameters()).toEqual(['300'])
    await expect(page.getByRole('status').filter({ hasText: 'parts fit' }).textContent()).resolves.toMatch(/left out by your answers/)
  })

  it('keeps the choice and the answer after a reload', async () => {
    const url = page.url()
    await page.reload()
    await hydrated(page)
    await page.getByRole('heading', { name: 'Your answers' }).waitFor()
    expect(page.url()).toBe(url)
    await expect(page.locator('#vehicle-h').textContent()).resolves.toMatch(/Veltra Pennon Mk2.*1\.4 petrol/)
    await expect(page.getByRole('button', { name: 'Change Front disc diameter' }).isVisible()).resolves.toBe(true)
    expect(await frontDiscDiameters()).toEqual(['300'])
    // and the store keeps it when coming back without the query
    await page.getByRole('link', { name: 'Part search' }).first().click()
    await page.waitForURL(/\/catalogue\/search/)
    await page.getByRole('link', { name: 'Find by vehicle' }).first().click()
    await page.getByRole('heading', { name: 'Your answers' }).waitFor()
    await page.waitForURL(/vehicle=\d+.*opt\.front_disc_diameter_mm=300/)
    await shot(page, 'catalogue-finder-answered')
  })

  it('finds a part by its OE number typed with a slip', async () => {
    const detail = await (await context.request.get('/api/parts/KM-1002')).json() as { oeNumbers: { oeNumber: string }[] }
    const oe = detail.oeNumbers[0]!.oeNumber
    // one wrong character: the last digit off by one
    const slip = oe.replace(/(\d)(?!.*\d)/, (d) => String((Number(d) + 1) % 10))
    expect(slip).not.toBe(oe)
    await open(page, '/catalogue/search')
    await page.getByLabel('Search').fill(slip)
    const row = page.locator('tr[data-sku="KM-1002"]')
    await row.waitFor()
    await expect(row.locator('[data-match]').textContent()).resolves.toContain(oe)
    expect(page.url()).toContain(`q=${encodeURIComponent(slip).replace(/%20/g, '+')}`)
    await shot(page, 'catalogue-search-typo')
    await row.getByRole('link', { name: 'KM-1002' }).click()
    await page.getByRole('heading', { name: 'Specifications' }).waitFor()
    await expect(page.locator('[data-spec="boreMm"]').textContent()).resolves.toMatch(/22\.22\s*mm/)
    await expect(page.getByRole('note', { name: 'Safety caution' }).isVisible()).resolves.toBe(true)
    expect(foreignRequests(requests)).toEqual([])
  })
})
