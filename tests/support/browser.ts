/**
 * Chromium for browser tests through playwright-core (Debian's /usr/bin/chromium or CHROMIUM_PATH).
 * No Chromium -> the browser project fails with the install command; it is never skipped.
 */
import { existsSync } from 'node:fs'
import { chromium, type Browser, type BrowserContext, type Page, type Request } from 'playwright-core'
import { env } from './api'

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

export async function signInThroughForm(page: Page, email: string, password = 'brake-demo-2026'): Promise<void> {
  await page.goto('/sign-in')
  await hydrated(page)
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password').fill(password)
  await page.getByRole('button', { name: 'Sign in' }).click()
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
    return !!el?.__vue_app__ && el.__vue_app__.$nuxt?.isHydrating === false
  }, undefined, { timeout: 30_000 })
}

/** `page.goto` that returns once the page is hydrated. */
export async function open(page: Page, url: string): Promise<void> {
  await page.goto(url)
  await hydrated(page)
}
