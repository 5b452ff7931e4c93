/**
 * Two-step sign-in in Chromium, as a new distributor admin meets it: the first sign-in asks for an authenticator app
 * (the QR code is made by the server: no request leaves the machine), the admin reads the key beside it as an app
 * would scan it, confirms with a code, keeps the ten recovery codes, signs out and in again with the next code, and a
 * recovery code works once. Codes are computed from the key by tests/support/totp.ts (RFC 6238).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { foreignRequests, hydrated, launch, newContext, shot } from '../support/browser'
import { createStaff, type Staff } from '../support/staff'
import { codeAtStep, stepNow } from '../support/totp'

describe('two-step sign-in in the browser', () => {
  let browser: Browser
  let admin: Staff
  beforeAll(async () => {
    admin = await createStaff('distributor_admin', { secret: null, name: 'Wren Ashdown' })
    browser = await launch()
  })
  afterAll(async () => { await browser?.close() })

  async function password(page: Page) {
    await page.goto('/sign-in')
    await hydrated(page)
    await page.getByLabel('E-mail').fill(admin.email)
    await page.getByLabel('Password').fill(admin.password)
    await page.getByRole('button', { name: 'Sign in' }).click()
  }

  async function signOut(page: Page) {
    await page.getByRole('button', { name: 'Sign out' }).filter({ visible: true }).first().click()
    await page.waitForURL((u) => u.pathname.startsWith('/sign-in'))
  }

  it('enrols by reading the QR code\'s key, signs out and in with a code, and takes a recovery code once', async () => {
    const { context, requests } = await newContext(browser)
    const page = await context.newPage()

    // first sign-in: set up the app
    await password(page)
    await page.getByRole('heading', { name: 'Set up two-step sign-in' }).waitFor()
    const qr = page.getByRole('img', { name: /QR code/ })
    await qr.waitFor()
    expect(await qr.getAttribute('src')).toMatch(/^data:image\/png;base64,/)
    expect(await qr.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth > 100)).toBe(true)
    const key = (await page.locator('[data-secret]').innerText()).replace(/\s+/g, '')
    expect(key).toMatch(/^[A-Z2-7]{32}$/)
    await shot(page, 'second-factor-enrol')
    const step = stepNow()
    await page.getByLabel('Code shown in the app').fill(codeAtStep(key, step - 3))
    await page.getByRole('button', { name: 'Continue' }).click()
    await page.getByText('That code is not right').first().waitFor()
    await page.getByLabel('Code shown in the app').fill(codeAtStep(key, step))
    await page.getByRole('button', { name: 'Continue' }).click()
    await page.getByRole('heading', { name: 'Keep your recovery codes' }).waitFor()
    const codes = await page.locator('[data-recovery-code]').allInnerTexts()
    expect(codes).toHaveLength(10)
    await shot(page, 'second-factor-recovery-codes')
    await page.getByRole('button', { name: 'I have kept them' }).click()
    await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'))

    // out, and in again with the next code from the app
    await signOut(page)
    await password(page)
    await page.getByRole('heading', { name: 'Two-step sign-in' }).waitFor()
    await page.getByLabel('Code from your authenticator app').fill(codeAtStep(key, step + 1))
    await page.getByRole('button', { name: 'Continue' }).click()
    await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'))
    await page.goto('/account')
    await page.getByText('10 of 10 recovery codes left').waitFor()
    await shot(page, 'second-factor-account')

    // a recovery code instead of the phone: once
    await signOut(page)
    await password(page)
    await page.getByLabel('Code from your authenticator app').fill(codes[0]!)
    await page.getByRole('button', { name: 'Continue' }).click()
    await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'))
    await signOut(page)
    await password(page)
    await page.getByLabel('Code from your authenticator app').fill(codes[0]!)
    await page.getByRole('button', { name: 'Continue' }).click()
    await page.getByText(/already been used|not right/).first().waitFor()
    expect(new URL(page.url()).pathname).toBe('/sign-in')
    await shot(page, 'second-factor-used-code')

    expect(foreignRequests(requests)).toEqual([])
    await context.close()
  })
})
