/**
 * Every main page of each role, and the owner's quote page, is usable at 390 px wide without sideways scrolling:
 * the document is no wider than the viewport (wide tables turn into cards or scroll inside their own card).
 * Screenshots of each page at 390 px with BORELINE_SCREENSHOTS.
 */
import { describe, expect, it } from 'vitest'
import { people } from '../support/api'
import { newContext, shot } from '../support/browser'
import { contextAs, PHONE, screensForTests, sidewaysScroll, visit } from '../support/screens'

describe('main pages at 390 px wide', () => {
  const run = screensForTests()

  const name = (url: string) => url.replace(/^\//, '').replace(/[^a-z0-9]+/gi, '-').replace(/-$/, '') || 'home'

  it('the bore check on a phone: findings and key figures first, the figures typed in folded below them', async () => {
    const context = await contextAs(run.browser, people.technician, PHONE)
    const page = await context.newPage()
    await visit(page, '/calculations/bore-check?vehicleId=1')
    await page.getByTestId('bore-check-results').waitFor()
    const top = async (sel: string) => page.locator(sel).first().evaluate((el) => el.getBoundingClientRect().top + window.scrollY)
    expect(await top('#findings-h')).toBeLessThan(await top('[data-testid="bore-check-inputs"]'))
    expect(await top('[data-card]')).toBeLessThan(await top('[data-testid="bore-check-inputs"]'))
    // folded: its inputs are not laid out until opened
    expect(await page.getByTestId('bore-check-inputs').getAttribute('open')).toBeNull()
    expect(await page.locator('#pedalForceN').isVisible()).toBe(false)
    await page.getByTestId('bore-check-inputs').locator(':scope > summary').click()
    await expect(page.locator('#pedalForceN').isVisible()).resolves.toBe(true)
    expect((await sidewaysScroll(page)).overflow).toBeLessThanOrEqual(0)
    await shot(page, '390-bore-check-opened')
    await context.close()
  })

  for (const role of ['technician', 'manager', 'counter', 'admin', 'owner'] as const) {
    it(`${role}: no page scrolls sideways`, async () => {
      const context = role === 'owner' ? (await newContext(run.browser, PHONE)).context : await contextAs(run.browser, people[role], PHONE)
      const page = await context.newPage()
      const wide: Record<string, { overflow: number; culprits: string[] }> = {}
      for (const url of run.screens[role]) {
        await visit(page, url)
        const m = await sidewaysScroll(page)
        if (m.overflow > 0) wide[url] = m
        await shot(page, `390-${role}-${role === 'owner' ? 'quote' : name(url)}`)
      }
      expect(wide).toEqual({})
      await context.close()
    })
  }
})
