import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { foreignRequests, launch, newContext, shot } from '../support/browser'

describe('home page in Chromium', () => {
  let browser: Browser
  beforeAll(async () => { browser = await launch() })
  afterAll(async () => { await browser?.close() })

  it('renders with the shipped fonts and makes no request off this machine', async () => {
    const { context, requests } = await newContext(browser)
    const page = await context.newPage()
    await page.goto('/', { waitUntil: 'networkidle' })
    await expect(page.getByRole('heading', { level: 1 })).toBeTruthy()
    expect(await page.title()).toContain('Boreline')
    const fonts = await page.evaluate(async () => {
      await document.fonts.ready
      return {
        text: document.fonts.check('16px Inter'),
        mono: document.fonts.check('16px "JetBrains Mono"'),
        loaded: [...document.fonts].filter((f) => f.status === 'loaded').map((f) => f.family),
        // every face's source a file: the content security policy allows fonts from this server only
        inlined: [...document.styleSheets].flatMap((s) => [...s.cssRules])
          .filter((r): r is CSSFontFaceRule => r instanceof CSSFontFaceRule && r.style.getPropertyValue('src').includes('data:'))
          .map((r) => r.style.getPropertyValue('font-family')),
      }
    })
    expect(fonts.loaded.some((f) => f.includes('Inter'))).toBe(true)
    expect(fonts.text).toBe(true)
    expect(fonts.inlined).toEqual([])
    // font files came from our own server
    expect(requests.some((u) => /\/_nuxt\/.*inter.*\.woff2/i.test(u))).toBe(true)
    expect(foreignRequests(requests)).toEqual([])
    await shot(page, 'home')
    await context.close()
  })

  it('is keyboard friendly: the first Tab reaches the skip link', async () => {
    const { context } = await newContext(browser)
    const page = await context.newPage()
    await page.goto('/')
    await page.keyboard.press('Tab')
    expect(await page.evaluate(() => document.activeElement?.textContent?.trim())).toBe('Skip to content')
    await context.close()
  })

  it('keeps fields and buttons closed until the page is hydrated, so nothing typed early is lost or sent by the browser itself', async () => {
    const { context } = await newContext(browser)
    // the app's scripts are held back, as on a slow phone: the server's HTML is on screen, Vue has not taken it over
    let release!: () => void
    const held = new Promise<void>((r) => { release = r })
    await context.route('**/_nuxt/**/*.js', async (route) => { await held; await route.continue() })
    const page = await context.newPage()
    await page.goto('/sign-in', { waitUntil: 'commit' }) // module scripts hold DOMContentLoaded back
    const email = page.getByLabel('E-mail')
    await email.waitFor()
    expect(await email.isEditable()).toBe(false)
    expect(await page.getByRole('button', { name: 'Sign in' }).isEnabled()).toBe(false)
    release()
    // once hydrated (Playwright waits for the field to be editable), what is typed is what is sent
    await email.fill('nobody-here@boreline.test')
    await page.getByLabel('Password').fill('not-the-password')
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.getByText(/not right|do not match|wrong/i).first().waitFor()
    expect(new URL(page.url()).search).toBe('')
    await context.close()
  })
})
