/**
 * Counter staff record a catalogued vehicle's steering side in the finder's vehicle box (the job card's bleeding
 * order starts from it), while garages only read it; and a manager's menu keeps one row at
 * desk width, the rarer pages under "More". Screenshots with BORELINE_SCREENSHOTS.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { as, people } from '../support/api'
import { launch, shot } from '../support/browser'
import { contextAs, DESK, PHONE, sidewaysScroll, visit } from '../support/screens'

const VEHICLE = 3 // a seeded right-hand-drive demo vehicle; put back after
let browser: Browser

beforeAll(async () => { browser = await launch() })
afterAll(async () => {
  await (await as(people.counter)).patch(`/api/vehicles/${VEHICLE}`, { steeringSide: 'right' })
  await browser?.close()
})

describe('the steering side in the finder', () => {
  it('counter staff correct it; garages only read it', async () => {
    const context = await contextAs(browser, people.counter, DESK)
    const page = await context.newPage()
    await visit(page, `/catalogue?vehicle=${VEHICLE}`)
    const box = page.getByTestId('steering-side')
    await expect.poll(() => box.textContent()).toMatch(/Right-hand drive/)
    await box.getByRole('button', { name: 'Correct steering side' }).click()
    await box.getByLabel('Steering side').selectOption({ label: 'Left-hand drive' })
    await shot(page, 'steering-side-edit')
    await box.getByRole('button', { name: 'Save' }).click()
    await expect.poll(() => box.textContent()).toMatch(/^Left-hand drive/)
    expect(await box.getByLabel('Steering side').count()).toBe(0)
    await context.close()

    const garage = await contextAs(browser, people.technician, DESK)
    const tp = await garage.newPage()
    await visit(tp, `/catalogue?vehicle=${VEHICLE}`)
    await expect.poll(() => tp.getByTestId('steering-side').textContent()).toMatch(/Left-hand drive/)
    expect(await tp.getByTestId('steering-side').getByRole('button').count()).toBe(0)
    await garage.close()
  })
})

describe('the steering side on a phone', () => {
  it('the form opens at 390 px without sideways scrolling', async () => {
    const context = await contextAs(browser, people.counter, PHONE)
    const page = await context.newPage()
    await visit(page, `/catalogue?vehicle=${VEHICLE}`)
    const box = page.getByTestId('steering-side')
    await box.getByRole('button', { name: /steering side/ }).click()
    await box.getByLabel('Steering side').waitFor()
    expect((await sidewaysScroll(page)).overflow).toBeLessThanOrEqual(0)
    await shot(page, 'steering-side-390')
    await context.close()
  })
})

describe('the menu at desk width', () => {
  it.each([1280, 1440])('a manager\'s menu is one row at %i px; the rarer pages open from "More"', async (width) => {
    const context = await contextAs(browser, people.manager, { viewport: { width, height: 900 } } as typeof DESK)
    const page = await context.newPage()
    await visit(page, '/quotes')
    const nav = page.getByRole('navigation', { name: 'Main' })
    const tops = await nav.locator(':scope > a:visible, :scope > div:visible > button').evaluateAll((els) => els.map((e) => Math.round(e.getBoundingClientRect().top)))
    expect(tops.length).toBeGreaterThan(5)
    expect(new Set(tops).size, `link rows at ${width} px: ${tops.join(', ')}`).toBe(1)
    await nav.getByRole('button', { name: 'More' }).click()
    await shot(page, `menu-more-${width}`)
    await nav.locator('#more-nav').getByRole('link', { name: 'Staff' }).click()
    await page.waitForURL((u) => u.pathname === '/staff')
    await context.close()
  })
})
