/**
 * The labour guide's page in Chromium: counter staff change the guide's hours for an operation of a vehicle (a
 * wrong figure is named under its field and the message goes as the field is corrected); a garage manager, on a
 * phone, sets the garage's own hours for it and goes back to the guide's. The guide's hours are put back after.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { as, people } from '../support/api'
import { launch, shot } from '../support/browser'
import { contextAs, DESK, PHONE, sidewaysScroll, visit } from '../support/screens'

const OPERATION = 'rear_hose'
const PAGE = '/labour-times?vehicleId=1'

describe('labour guide page', () => {
  let browser: Browser
  let guideBefore: number
  beforeAll(async () => {
    browser = await launch()
    const counter = await as(people.counter)
    guideBefore = (await counter.get(`/api/labour-times?vehicleId=1&operation=${OPERATION}`)).body.data[0]?.guideHours ?? 0.5
  })
  afterAll(async () => {
    const counter = await as(people.counter)
    await counter.request('/api/labour-times', { method: 'PUT', json: { vehicleId: 1, operation: OPERATION, hours: guideBefore } })
    await (await as(people.manager)).request('/api/labour-times', { method: 'PUT', json: { vehicleId: 1, operation: OPERATION, hours: null } })
    await browser?.close()
  })

  it('counter staff change the guide\'s hours; a wrong figure is named beside its field until corrected', async () => {
    const context = await contextAs(browser, people.counter, DESK)
    const page = await context.newPage()
    await visit(page, PAGE)
    const row = page.locator(`[data-operation="${OPERATION}"]`)
    const field = row.getByLabel(/Guide hours for/)
    await field.fill('1.234')
    await row.getByRole('button', { name: 'Save' }).click()
    await expect(row.locator('.field-error').textContent()).resolves.toMatch(/two decimals/)
    await field.fill('0.85')
    expect(await row.locator('.field-error').count()).toBe(0)
    await row.getByRole('button', { name: 'Save' }).click()
    await row.getByRole('status').waitFor()
    // the list is read again after the save: the guide's column shows the new hours
    await row.locator('[data-guide]', { hasText: '0.85 h' }).waitFor()
    await shot(page, 'labour-guide-counter-1280')
    await context.close()
  })

  it('a garage manager sets the garage\'s own hours on a phone, then goes back to the guide\'s', async () => {
    const context = await contextAs(browser, people.manager, PHONE)
    const page = await context.newPage()
    await visit(page, PAGE)
    const row = () => page.locator(`[data-operation="${OPERATION}"]`)
    await row().getByLabel(/Your garage's hours for/).fill('1.1')
    await row().getByRole('button', { name: 'Use my hours' }).click()
    await row().getByText('Your garage\'s hours are used on quotes.').waitFor()
    const manager = await as(people.manager)
    expect((await manager.get(`/api/labour-times?vehicleId=1&operation=${OPERATION}`)).body.data[0]).toMatchObject({ hours: 1.1, source: 'garage', guideHours: 0.85 })
    expect((await sidewaysScroll(page)).overflow).toBeLessThanOrEqual(0)
    await shot(page, 'labour-guide-manager-390')
    await row().getByRole('button', { name: 'Use the guide\'s' }).click()
    await row().getByText('Your garage\'s hours are used on quotes.').waitFor({ state: 'detached' })
    expect((await manager.get(`/api/labour-times?vehicleId=1&operation=${OPERATION}`)).body.data[0]).toMatchObject({ hours: 0.85, source: 'guide' })
    await context.close()
  })
})
