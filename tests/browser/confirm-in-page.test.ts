/**
 * Removing a person from the staff and deleting a discount tier ask in the page (ui/ConfirmInPage: what changes,
 * the action in words, a way out), never in the browser's own dialog; "Not now" changes nothing.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { as, people } from '../support/api'
import { launch } from '../support/browser'
import { makeGarage, type TestGarage } from '../support/orders'
import { contextAs, DESK, visit } from '../support/screens'
import { withWrite } from '../../server/utils/db'
import { User } from '../../server/models/accounts'

/** Fails the test if the page opens a browser dialog (confirm, alert). */
function refuseDialogs(page: Page): string[] {
  const opened: string[] = []
  page.on('dialog', (d) => { opened.push(d.message()); void d.dismiss() })
  return opened
}

describe('confirmations in the page', () => {
  let browser: Browser
  let garage: TestGarage
  beforeAll(async () => {
    browser = await launch()
    garage = await makeGarage({ terms: 'card', label: 'Confirm Garage' })
    await withWrite((t) => User.create({ organisationId: garage.id, email: `tech-${garage.id}@e2e-garage.test`, name: 'Morgan Leaver', role: 'garage_technician', passwordHash: 'x', status: 'active' }, { transaction: t }))
  })
  afterAll(async () => { await browser?.close() })

  it('a manager removes a technician after confirming in the page; "Not now" keeps them', async () => {
    const context = await contextAs(browser, garage.email, DESK)
    const page = await context.newPage()
    const dialogs = refuseDialogs(page)
    await visit(page, '/staff')
    const row = page.getByRole('row', { name: /Morgan Leaver/ })
    await row.getByRole('button', { name: 'Remove' }).click()
    const ask = page.getByRole('alertdialog', { name: 'Remove Morgan Leaver?' })
    await expect(ask.textContent()).resolves.toMatch(/signed out at once/)
    await ask.getByRole('button', { name: 'Not now' }).click()
    expect(await page.getByRole('alertdialog').count()).toBe(0)
    expect(await row.count()).toBe(1)
    await row.getByRole('button', { name: 'Remove' }).click()
    await page.getByRole('alertdialog').getByRole('button', { name: 'Remove from the staff' }).click()
    await row.waitFor({ state: 'detached' })
    expect(dialogs).toEqual([])
    await context.close()
  })

  it('the admin deletes an unused tier after confirming in the page', async () => {
    const admin = await as(people.admin)
    const name = `Trial ${Date.now() % 100_000}`
    expect((await admin.post('/api/admin/tiers', { name, percent: 3 })).status).toBe(201)
    const context = await contextAs(browser, people.admin, DESK)
    const page = await context.newPage()
    const dialogs = refuseDialogs(page)
    await visit(page, '/admin/tiers')
    // the demo has a handful of tiers: the new one is on the first page
    const row = page.getByRole('row', { name: new RegExp(name) })
    await row.getByRole('button', { name: 'Delete' }).click()
    await page.getByRole('alertdialog', { name: `Delete the tier ${name}?` }).getByRole('button', { name: 'Delete the tier' }).click()
    await row.waitFor({ state: 'detached' })
    expect(dialogs).toEqual([])
    await context.close()
  })
})
