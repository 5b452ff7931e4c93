/**
 * A car identified from what is in front of you, in Chromium: the technician types a demo registration in the
 * header's box (phone-sized and desktop screens), lands on the car with its remembered answers, opens the parts
 * that fit with them applied, starts an inspection from it (registration and answers carried over) and records
 * it; the manager then finds the car by its owner's name and sees the inspection in its history.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { foreignRequests, hydrated, launch, newContext, shot, signInThroughForm } from '../support/browser'
import { people } from '../support/api'

describe('the car in front of you', () => {
  let browser: Browser
  let vehicleUrl = ''

  beforeAll(async () => { browser = await launch() })
  afterAll(async () => { await browser?.close() })

  async function signedIn(email: string, phone = false): Promise<{ page: Page; requests: string[] }> {
    const { context, requests } = await newContext(browser, phone
      ? { viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true, deviceScaleFactor: 2 }
      : { viewport: { width: 1280, height: 900 } })
    const page = await context.newPage()
    await signInThroughForm(page, email)
    await hydrated(page)
    return { page, requests }
  }

  async function findInHeader(page: Page, text: string): Promise<void> {
    await page.getByLabel('Find a vehicle by registration, VIN or owner').fill(text)
    await page.getByRole('button', { name: 'Find', exact: true }).click()
    await page.waitForURL(/\/garage\/vehicles\/\d+$/)
    await hydrated(page)
  }

  it('a technician types a registration on a phone and lands on the car with its answers remembered', async () => {
    const { page, requests } = await signedIn(people.technician, true)
    await shot(page, 'vehicles-header-390')
    await findInHeader(page, 'lm65 wrd')
    await page.getByRole('heading', { name: 'LM65 WRD' }).waitFor()
    const answers = page.locator('[data-answers]')
    await expect(answers.textContent()).resolves.toMatch(/Drum/)
    await expect(answers.textContent()).resolves.toMatch(/Cable/)
    await expect(page.locator('[data-vehicle-label]').textContent()).resolves.toMatch(/Kaskel Vell V3/)
    await expect(page.locator('[data-consent]').textContent()).resolves.toMatch(/Agreed/)
    await shot(page, 'vehicle-390')
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)
    expect(overflow).toBeLessThanOrEqual(0)
    expect(foreignRequests(requests)).toEqual([])
  })

  it('on a desktop screen: the parts that fit, then an inspection started from the car', async () => {
    const { page, requests } = await signedIn(people.technician)
    await findInHeader(page, 'LM65WRD')
    vehicleUrl = new URL(page.url()).pathname
    await shot(page, 'vehicle-1280')

    await page.getByRole('link', { name: 'Parts that fit' }).click()
    await page.waitForURL(/\/catalogue\?/)
    await hydrated(page)
    const url = new URL(page.url())
    expect(url.searchParams.get('opt.rear_brake')).toBe('drum')
    expect(url.searchParams.get('opt.parking_brake')).toBe('cable')
    expect(url.searchParams.get('opt.vin')).toBe('WK3VB2D18FT104472')
    await page.getByText(/parts? fit/).first().waitFor()
    await shot(page, 'vehicle-parts-1280')

    await page.goto(vehicleUrl)
    await hydrated(page)
    await page.getByRole('link', { name: 'Start an inspection' }).click()
    await page.waitForURL(/\/inspections\/new\?/)
    await hydrated(page)
    await expect(page.locator('#registration').inputValue()).resolves.toBe('LM65 WRD')
    await expect(page.locator('#odometer').inputValue()).resolves.toMatch(/72904 mi/)
    await expect(page.locator('#opt-rear_brake').inputValue()).resolves.toBe('drum')
    await page.locator('#front-left-pad-in').fill('2.5')
    await page.locator('#front-left-pad-out').fill('3.5')
    await page.locator('#odometer').fill('73 410 mi')
    await page.getByRole('button', { name: 'Record inspection' }).click()
    await page.waitForURL(/\/inspections\/\d+$/)
    await shot(page, 'vehicle-inspection-1280')
    expect(foreignRequests(requests)).toEqual([])
  })

  it('the manager finds the car by its owner and sees the inspection and the reading in its history', async () => {
    const { page } = await signedIn(people.manager)
    await findInHeader(page, 'Tallis')
    expect(new URL(page.url()).pathname).toBe(vehicleUrl)
    const history = page.locator('[data-history]')
    await history.waitFor()
    await expect(history.textContent()).resolves.toMatch(/Inspection \d+/)
    await expect(history.textContent()).resolves.toMatch(/73,410 mi/)
    await shot(page, 'vehicle-history-1280')
  })

  it('a registration the garage does not have yet is looked up when adding it; an unknown one leaves the finder', async () => {
    const { page } = await signedIn(people.manager, true)
    await page.getByLabel('Find a vehicle by registration, VIN or owner').fill('YT68 KDM')
    await page.getByRole('button', { name: 'Find', exact: true }).click()
    await page.waitForURL(/\/garage\/vehicles\?q=/)
    await hydrated(page)
    await page.getByRole('link', { name: /Add YT68KDM/ }).click()
    await page.waitForURL(/\/garage\/vehicles\/new/)
    await hydrated(page)
    await page.getByRole('button', { name: 'Look up' }).click()
    await page.locator('[data-lookup="found"]').waitFor()
    await expect(page.locator('[data-lookup="found"]').textContent()).resolves.toMatch(/Durmond Caddow/)
    await expect(page.locator('#vin').inputValue()).resolves.toBe('VD7CA3P11JC551028')
    await shot(page, 'vehicle-new-390')

    await page.locator('#registration').fill('EV16 XKD')
    await page.getByRole('button', { name: 'Look up' }).click()
    await page.locator('[data-lookup="missed"]').waitFor()
    await expect(page.locator('[data-lookup="missed"]').textContent()).resolves.toMatch(/March 2016 and August 2016/)
    await page.getByLabel('Make').waitFor()
    await shot(page, 'vehicle-new-unknown-390')
  })
})
