/**
 * Accessibility of the main pages of each role and of the owner's quote page, checked by axe-core (WCAG 2.1 A and
 * AA rules and best practice) in Chromium at desk size: no serious or critical finding, which covers a label for
 * every form control. Focus stays visible when moving by keyboard, and the two journeys people make with the
 * keyboard alone work: choosing a vehicle in the finder, and the owner's approve/decline and signature.
 */
import { describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { people } from '../support/api'
import { newContext, shot } from '../support/browser'
import { axeFindings, contextAs, DESK, screensForTests, visit, type AxeFinding } from '../support/screens'

describe('accessibility of the main pages (axe-core)', () => {
  const run = screensForTests()

  async function findingsOf(page: Page, urls: string[]): Promise<Record<string, AxeFinding[]>> {
    const out: Record<string, AxeFinding[]> = {}
    for (const url of urls) {
      await visit(page, url)
      await shot(page, `desk-${url.replace(/^\//, '').replace(/[^a-z0-9]+/gi, '-').replace(/-$/, '') || 'home'}`)
      const found = await axeFindings(page)
      if (found.length) out[url] = found
    }
    return out
  }

  for (const role of ['technician', 'manager', 'counter', 'admin'] as const) {
    it(`${role}: no serious or critical finding on the main pages`, async () => {
      const context = await contextAs(run.browser, people[role], DESK)
      const page = await context.newPage()
      expect(await findingsOf(page, run.screens[role])).toEqual({})
      await context.close()
    })
  }

  it('owner: no serious or critical finding on the quote page, before and after choosing', async () => {
    const { context } = await newContext(run.browser, DESK)
    const page = await context.newPage()
    expect(await findingsOf(page, run.screens.owner)).toEqual({})
    await page.getByRole('radio', { name: 'Decline' }).first().click()
    expect(await axeFindings(page)).toEqual([])
    await context.close()
  })

  it('focus is visible on every control reached by Tab', async () => {
    const context = await contextAs(run.browser, people.manager, DESK)
    const page = await context.newPage()
    await visit(page, '/quotes/new')
    const invisible: string[] = []
    for (let i = 0; i < 25; i++) {
      await page.keyboard.press('Tab')
      const seen = await page.evaluate(() => {
        const el = document.activeElement as HTMLElement | null
        if (!el || el === document.body) return null
        const s = getComputedStyle(el)
        const ring = (s.outlineStyle !== 'none' && parseFloat(s.outlineWidth) > 0) || (s.boxShadow && s.boxShadow !== 'none')
        return { ok: !!ring, what: `${el.tagName.toLowerCase()} ${el.textContent?.trim().slice(0, 30) || el.getAttribute('name') || el.getAttribute('aria-label') || ''}` }
      })
      if (seen && !seen.ok) invisible.push(seen.what)
    }
    expect(invisible).toEqual([])
    await context.close()
  })

  it('the finder works by keyboard: make, model, year and engine chosen with Tab and Enter', async () => {
    const context = await contextAs(run.browser, people.technician, DESK)
    const page = await context.newPage()
    await visit(page, '/catalogue')
    for (const step of ['Make', 'Model', 'Year', 'Engine / variant']) {
      // the group whose own legend names the step (the page as a whole sits in a fieldset too, see app.vue)
      const choice = page.locator('fieldset', { has: page.locator(':scope > legend', { hasText: step }) }).getByRole('button').first()
      await choice.waitFor()
      await choice.focus()
      await page.keyboard.press('Enter')
    }
    await page.getByText(/parts? fits?/).first().waitFor()
    await shot(page, 'a11y-finder-keyboard')
    await context.close()
  })

  it('the owner approves, declines and signs by keyboard alone', async () => {
    const { context } = await newContext(run.browser, DESK)
    const page = await context.newPage()
    await visit(page, run.screens.owner[0]!)
    // each line: Tab to its choice and press Space or Enter (the first declined, then changed to approved)
    const decline = page.getByRole('radio', { name: 'Decline' }).first()
    await decline.focus()
    await page.keyboard.press('Space')
    await expect(decline.getAttribute('aria-checked')).resolves.toBe('true')
    const approves = page.getByRole('radio', { name: 'Approve' })
    for (let i = 0; i < await approves.count(); i++) {
      await approves.nth(i).focus()
      await page.keyboard.press('Enter')
      await expect(approves.nth(i).getAttribute('aria-checked')).resolves.toBe('true')
    }
    await page.getByLabel('Type your full name to sign').focus()
    await page.keyboard.type('Robin Tester')
    await page.keyboard.press('Enter')
    await page.locator('[data-decided]').waitFor()
    await shot(page, 'a11y-owner-keyboard')
    await context.close()
  })
})
