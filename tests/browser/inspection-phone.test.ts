/**
 * The inspection at the car, on a phone-sized screen: the technician records every wheel, the parking brake, the
 * fluid and the roller brake tester, takes a photo of the worn front left disc (resized and re-encoded in the
 * browser, so no location data leaves the phone), and the owner sees that photo beside the line it explains on the
 * quote's link. Verdicts worked by hand in the comments; limits as named in tests/e2e/inspections.test.ts.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { foreignRequests, launch, newContext, open, shot, signInThroughForm } from '../support/browser'
import { as, people } from '../support/api'
import { VEHICLE_ID, ownerEmail, sendAndReadLink, uid } from '../support/quotes'
import { pngPhoto } from '../support/images'

const PHONE = { viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true, deviceScaleFactor: 2 }
const registration = `PH${uid().slice(0, 2).toUpperCase()} INS`

describe('a full inspection on a phone, with a photo the owner sees', () => {
  let browser: Browser
  let context: BrowserContext
  let requests: string[]
  let page: Page
  let inspectionId = 0

  beforeAll(async () => {
    browser = await launch()
    ;({ context, requests } = await newContext(browser, PHONE))
    page = await context.newPage()
    await signInThroughForm(page, people.technician)
  })
  afterAll(async () => { await browser?.close() })

  const fill = (id: string, value: string | number) => page.locator(`#${id}`).fill(String(value))

  it('records every wheel, the parking brake, the fluid and the brake tester', async () => {
    await open(page, `/inspections/new?vehicleId=${VEHICLE_ID}`)
    await page.locator('#front-left-t0').waitFor()
    const min = Number(await page.locator('#front-min').inputValue())
    expect(min).toBeGreaterThan(0) // the discard thickness comes from the vehicle data
    await fill('registration', registration)
    await fill('odometer', '58 400 mi')
    // front left: 0.6 mm under the discard thickness (fail), inner pad 1.2 mm under 1.5 mm (fail)
    await fill('front-left-t0', (min - 0.6).toFixed(2))
    await fill('front-left-t1', (min - 0.5).toFixed(2))
    await fill('front-left-pad-in', 1.2)
    await fill('front-left-pad-out', 4.5)
    await page.locator('#front-left-hose').selectOption('advise')
    await fill('front-left-hose-note', 'perished at the crimp')
    // front right: 1.4 mm above it, pads 6 / 6.5 mm
    await fill('front-right-t0', (min + 1.4).toFixed(2))
    await fill('front-right-t1', (min + 1.42).toFixed(2))
    await fill('front-right-pad-in', 6)
    await fill('front-right-pad-out', 6.5)
    // the rear, disc or drum as the vehicle has it
    for (const w of ['rear-left', 'rear-right']) {
      if (await page.locator(`#${w}-drum`).count()) {
        const max = Number(await page.locator('#rear-drum-max').inputValue())
        await fill(`${w}-drum`, (max - 1.5).toFixed(2))
        await fill(`${w}-lining`, 3.5)
      } else {
        const rearMin = Number(await page.locator('#rear-min').inputValue())
        await fill(`${w}-t0`, (rearMin + 1.5).toFixed(2))
        await fill(`${w}-t1`, (rearMin + 1.5).toFixed(2))
        await fill(`${w}-pad-in`, 5)
        await fill(`${w}-pad-out`, 5)
      }
    }
    await page.locator('#parking-brake').selectOption('ok')
    // DOT 4 boiling at 150 °C, at or under its 155 °C wet minimum (FMVSS No. 116): fail
    await page.locator('#fluid-in').selectOption('DOT 4')
    await fill('fluid-boiling', 150)
    await fill('fluid-age', 40)
    // brake tester, 1300 kg: front (3100 − 2100) / 3100 = 32.3 % imbalance, over 30 % (MOT Inspection Manual §3.8)
    await fill('bt-mass', 1300)
    for (const [w, n] of [['front-left', 2100], ['front-right', 3100], ['rear-left', 1300], ['rear-right', 1250]] as const) await fill(`bt-${w}-service`, n)
    await fill('bt-rear-left-parking', 1050)
    await fill('bt-rear-right-parking', 1000)
    // the form fits the phone's width
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390)
    await shot(page, 'inspection-phone-form')

    await page.getByRole('button', { name: 'Check readings' }).tap()
    const verdicts = page.getByTestId('wear-verdicts')
    await verdicts.waitFor()
    const fl = verdicts.locator('[data-group="front-left"]')
    await expect(fl.locator('[data-item="disc:front-left:thickness"]').textContent()).resolves.toMatch(/Front left disc/)
    expect(await fl.locator('[data-item="disc:front-left:thickness"] [data-verdict="fail"]').count()).toBe(1)
    expect(await verdicts.locator('[data-item="brake-test:imbalance-front"] [data-verdict="fail"]').count()).toBe(1)
    await page.getByRole('button', { name: 'Record inspection' }).tap()
    await page.waitForURL(/\/inspections\/\d+$/)
    await page.getByRole('heading', { level: 1, name: new RegExp(registration) }).waitFor()
    inspectionId = Number(new URL(page.url()).pathname.split('/').pop())
  })

  it('takes a photo of the front left disc: resized and re-encoded on the phone before it is sent', async () => {
    const at = page.locator('[data-photos="front-left"]')
    await at.getByLabel('Photo of').selectOption('disc')
    await at.getByLabel(/Caption/).fill('Lip at the edge')
    // a 2400 × 1200 camera picture (PNG) carrying a place name in its metadata
    await at.locator('input[type=file]').setInputFiles({ name: 'IMG_2041.PNG', mimeType: 'image/png', buffer: pngPhoto(2400, 1200) })
    const img = at.locator('img').first()
    await img.waitFor()
    await page.waitForFunction(() => {
      const i = document.querySelector<HTMLImageElement>('[data-photos="front-left"] img')
      return !!i && i.complete && i.naturalWidth > 0
    })
    // scaled to the 1600 px longest edge, in proportion: 1600 × 800
    expect(await img.evaluate((i: HTMLImageElement) => [i.naturalWidth, i.naturalHeight])).toEqual([1600, 800])
    // what the server keeps is the phone's JPEG (the server never converts a PNG), without the place name
    const stored = await context.request.get((await img.getAttribute('src'))!)
    expect(stored.headers()['content-type']).toBe('image/jpeg')
    expect((await stored.body()).includes(Buffer.from('Millbrook'))).toBe(false)
    await expect(at.textContent()).resolves.toContain('Lip at the edge')
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390)
    await shot(page, 'inspection-phone-photo')
    expect(foreignRequests(requests)).toEqual([])
  })

  it('the owner sees the photo beside the line it explains', async () => {
    const manager = await as(people.manager)
    const email = ownerEmail()
    const q = await manager.post('/api/quotes', { vehicleId: VEHICLE_ID, ownerName: 'Nell Harrow', ownerEmail: email, inspectionId })
    expect(q.status, q.text).toBe(201)
    const { token } = await sendAndReadLink(manager, q.body.id, email)
    const owner = await newContext(browser, PHONE)
    const phone = await owner.context.newPage()
    await open(phone, `/q/${token}`)
    const line = phone.locator('[data-owner-line]').filter({ has: phone.locator('img[data-owner-photo]') }).first()
    await line.scrollIntoViewIfNeeded()
    await expect(line.textContent()).resolves.toMatch(/front left brake disc has worn thinner/)
    await expect(line.getByRole('img', { name: 'Front left: Lip at the edge' }).isVisible()).resolves.toBe(true)
    await phone.waitForFunction(() => [...document.querySelectorAll<HTMLImageElement>('img[data-owner-photo]')].some((i) => i.complete && i.naturalWidth > 0))
    expect(await phone.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390)
    await shot(phone, 'inspection-phone-owner')
    expect(foreignRequests(owner.requests)).toEqual([])
  })
})
