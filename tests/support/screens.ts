/**
 * The main pages of each role, opened in Chromium as that person (the session of `as(email)` handed to the browser,
 * so distributor staff need no fresh authenticator code per page), with the two measures the screen tests take:
 * axe-core's accessibility findings and sideways scrolling.
 */
import { readFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import { afterAll, beforeAll } from 'vitest'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { as, env, people, type Client } from './api'
import { hydrated, launch, newContext } from './browser'
import { ok } from './jobs'
import { sendAndReadLink, startQuote } from './quotes'

export const PHONE = { viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true, deviceScaleFactor: 1 }
export const DESK = { viewport: { width: 1280, height: 900 } }

/** A browser context signed in as `email` (the cookies of its API session). */
export async function contextAs(browser: Browser, email: string, size: typeof PHONE | typeof DESK): Promise<BrowserContext> {
  const client = await as(email)
  const { context } = await newContext(browser, size)
  const url = new URL(env().baseUrl)
  await context.addCookies([...client.cookies].map(([name, value]) => ({ name, value, domain: url.hostname, path: '/' })))
  return context
}

export interface Screens { technician: string[]; manager: string[]; counter: string[]; admin: string[]; owner: string[] }

/**
 * The pages each role lives in, with real records: a quote sent to its owner (the owner's link), the demo orders,
 * a trade account, a vehicle of the garage, a price file when there is one.
 */
export async function mainScreens(): Promise<Screens & { ownerToken: string }> {
  const manager = await as(people.manager)
  const counter = await as(people.counter)
  const admin = await as(people.admin)
  const { quote, ownerEmail } = await startQuote(manager)
  for (const sku of ['KD-1001', 'KP-1001']) ok(await manager.post(`/api/quotes/${quote.id}/lines`, { kind: 'part', sku, recommendation: 'advised' }), 201)
  ok(await manager.post(`/api/quotes/${quote.id}/lines`, { kind: 'labour', description: 'Fit and test', hours: 1.5, recommendation: 'advised' }), 201)
  const { token } = await sendAndReadLink(manager, quote.id, ownerEmail)
  const first = async (c: Client, url: string, pick: (r: any) => boolean = () => true) => (ok(await c.get(url)).body.data as any[]).find(pick)?.id as number | undefined
  const order = await first(manager, '/api/orders')
  const counterOrder = await first(counter, '/api/counter/orders', (o) => ['confirmed', 'picking'].includes(o.status))
  const account = await first(admin, '/api/admin/trade-accounts')
  const vehicle = await first(manager, '/api/garage/vehicles')
  const priceFile = await first(counter, '/api/price-files')
  const technician = ['/', '/catalogue?make=Veltra', '/catalogue/search?q=pads', '/catalogue/parts/KP-1001', '/calculations/bore-check?vehicleId=1',
    '/inspections', '/inspections/new', '/garage/vehicles', ...(vehicle ? [`/garage/vehicles/${vehicle}`] : []), '/account']
  return {
    ownerToken: token,
    technician,
    manager: ['/quotes', '/quotes/new', `/quotes/${quote.id}`, '/orders', ...(order ? [`/orders/${order}`] : []), '/orders/new', '/documents',
      '/core-returns', '/returns', '/garage/settings', '/garage/follow-ups', '/staff', '/labour-times?vehicleId=1'],
    counter: ['/counter/orders', ...(counterOrder ? [`/counter/orders/${counterOrder}`] : []), '/counter/returns', '/counter/core-returns',
      '/counter/goods-in', '/price-files', ...(priceFile ? [`/price-files/${priceFile}`] : []), '/catalogue/parts/KD-1001', '/catalogue/parts/KD-1001/edit', '/labour-times?vehicleId=1'],
    admin: ['/admin/applications', '/admin/trade-accounts', ...(account ? [`/admin/trade-accounts/${account}`] : []), '/admin/tiers', '/staff'],
    owner: [`/q/${token}`],
  }
}

/** Inside a `describe`: Chromium and the main screens, made once before its tests and closed after them. */
export function screensForTests(): { browser: Browser; screens: Screens & { ownerToken: string } } {
  const shared = {} as { browser: Browser; screens: Screens & { ownerToken: string } }
  beforeAll(async () => {
    shared.browser = await launch()
    shared.screens = await mainScreens()
  })
  afterAll(async () => { await shared.browser?.close() })
  return shared
}

/** Opens a page as a person would and waits until it has loaded and hydrated. */
export async function visit(page: Page, url: string): Promise<void> {
  const res = await page.goto(url, { waitUntil: 'networkidle' })
  if (!res || res.status() >= 400) throw new Error(`${url} answered ${res?.status()}`)
  await hydrated(page)
}

const axeSource = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8')

export interface AxeFinding { id: string; impact: string; help: string; targets: string[] }

/** axe-core's serious and critical findings on the page as it stands (WCAG 2.1 A and AA rules and best practice). */
export async function axeFindings(page: Page): Promise<AxeFinding[]> {
  if (!(await page.evaluate(() => 'axe' in window))) await page.addScriptTag({ content: axeSource })
  const violations = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (ctx: Document, o: object) => Promise<{ violations: { id: string; impact: string | null; help: string; nodes: { target: string[] }[] }[] }> } }).axe
    const r = await axe.run(document, { runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'best-practice'] } })
    return r.violations.map((v) => ({ id: v.id, impact: v.impact ?? '', help: v.help, targets: v.nodes.slice(0, 5).map((n) => n.target.join(' ')) }))
  })
  return violations.filter((v) => v.impact === 'serious' || v.impact === 'critical')
}

/** How far the page scrolls sideways beyond the viewport, in CSS pixels, and the widest elements that cause it. */
export async function sidewaysScroll(page: Page): Promise<{ overflow: number; culprits: string[] }> {
  return page.evaluate(() => {
    const vw = document.documentElement.clientWidth
    const overflow = document.documentElement.scrollWidth - vw
    const culprits: string[] = []
    if (overflow > 0) {
      // what sticks out of the page, not what scrolls inside its own box
      const scrolls = (el: Element | null): boolean => {
        for (let a = el?.parentElement; a && a !== document.body; a = a.parentElement) {
          if (['auto', 'scroll', 'hidden'].includes(getComputedStyle(a).overflowX)) return true
        }
        return false
      }
      for (const el of document.querySelectorAll('body *')) {
        const r = el.getBoundingClientRect()
        if (r.right > vw + 1 && r.width > 0 && !scrolls(el)) culprits.push(`${el.tagName.toLowerCase()}${el.id ? `#${el.id}` : ''}.${String(el.className).split(' ').slice(0, 3).join('.')} (${Math.round(r.right)} px)`)
        if (culprits.length >= 6) break
      }
    }
    return { overflow, culprits }
  })
}
