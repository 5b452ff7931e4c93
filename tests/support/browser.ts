/**
 * Chromium for browser tests through playwright-core (Debian's /usr/bin/chromium or CHROMIUM_PATH).
 * No Chromium -> the browser project fails with the install command; it is never skipped.
 */
import { existsSync } from 'node:fs'
import { chromium, type Browser, type BrowserContext, type Page, type Request } from 'playwright-core'
import { env } from './api'
import { freshCode, rememberSecret, secretOf } from './totp'

export const chromiumPath = process.env.CHROMIUM_PATH || '/usr/bin/chromium'

export async function launch(): Promise<Browser> {
  if (!existsSync(chromiumPath)) {
    throw new Error(`Chromium not found at ${chromiumPath}. Install it with: apt-get install -y chromium (or set CHROMIUM_PATH).`)
  }
  return chromium.launch({
    executablePath: chromiumPath,
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking',
      '--disable-component-update', '--disable-sync', '--disable-dev-shm-usage'],
  })
}

/** A context that records every request, so a test can assert that none left localhost. */
export async function newContext(browser: Browser, options: Parameters<Browser['newContext']>[0] = {}): Promise<{ context: BrowserContext; requests: string[] }> {
  const context = await browser.newContext({ baseURL: env().baseUrl, ...options })
  const requests: string[] = []
  context.on('request', (r: Request) => { requests.push(r.url()) })
  return { context, requests }
}

export function foreignRequests(requests: string[]): string[] {
  return requests.filter((u) => {
    const { protocol, hostname } = new URL(u)
    if (protocol === 'data:' || protocol === 'blob:' || protocol === 'about:') return false
    return !['127.0.0.1', 'localhost', '[::1]'].includes(hostname)
  })
}

/**
 * Signs in through the form as a person would. People with two-step sign-in then type the code computed from their
 * secret (tests/support/totp.ts); someone asked to set up an app reads its key off the page, as a person would.
 */
export async function signInThroughForm(page: Page, email: string, password = 'brake-demo-2026'): Promise<void> {
  await page.goto('/sign-in')
  await hydrated(page)
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password').fill(password)
  await page.getByRole('button', { name: 'Sign in' }).click()
  const codeField = page.locator('input[name="code"]')
  // whichever comes first; the other is left to time out quietly
  const next = await Promise.race([
    page.waitForURL((u) => !u.pathname.startsWith('/sign-in')).then(() => 'signed-in' as const, () => 'timeout' as const),
    codeField.waitFor().then(() => 'code' as const, () => 'timeout' as const),
  ])
  if (next === 'signed-in') return
  if (next === 'timeout') throw new Error(`sign-in as ${email} went nowhere`)
  const offered = await page.locator('[data-secret]').getAttribute('data-value', { timeout: 500 }).catch(() => null)
  if (offered) rememberSecret(email, offered)
  await codeField.fill(await freshCode(email, offered ?? secretOf(email)))
  await page.getByRole('button', { name: 'Continue' }).click()
  if (offered) await page.getByRole('button', { name: 'I have kept them' }).click()
  await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'))
}

export async function shot(page: Page, name: string): Promise<void> {
  if (process.env.BORELINE_SCREENSHOTS) await page.screenshot({ path: `${process.env.BORELINE_SCREENSHOTS}/${name}.png`, fullPage: true })
}

/**
 * Waits until Nuxt has hydrated the page: a click on server-rendered markup before that does nothing,
 * which makes journeys flaky on a busy machine.
 */
export async function hydrated(page: Page): Promise<void> {
  await page.waitForFunction(() => {
    const el = document.querySelector('#__nuxt') as (Element & { __vue_app__?: { $nuxt?: { isHydrating?: boolean } } }) | null
    // and app.vue has opened its fields (they are closed until hydration; an error page has no such frame)
    return !!el?.__vue_app__ && el.__vue_app__.$nuxt?.isHydrating === false && !document.querySelector('[data-app-frame][disabled]')
  }, undefined, { timeout: 30_000 })
}

/** `page.goto` that returns once the page is hydrated. */
export async function open(page: Page, url: string): Promise<void> {
  await page.goto(url)
  await hydrated(page)
}
