/**
 * The counter's day in Chromium: a garage puts a part in its basket, is told beside the field why 0 is not a
 * quantity, orders more than the shelf holds and chooses to have what is here sent now; counter staff pick one
 * fewer than expected (the rest back-ordered, never a silent change) and send it, which issues the invoice; the
 * garage downloads the invoice, sends a wrong part back, the counter accepts it and the garage downloads the
 * credit note. No page scrolls sideways, at 1280 px on the desk or at 390 px on a phone.
 * Uses its own garage and part so the demo data is left alone. Figures worked by hand: UK standard VAT 20 %
 * (gov.uk "VAT rates").
 */
import { mkdirSync, writeFileSync } from 'node:fs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { people } from '../support/api'
import { foreignRequests, hydrated, launch, newContext, open, shot, signInThroughForm } from '../support/browser'
import { makeGarage, makePart, type TestGarage, type TestPart } from '../support/orders'

let browser: Browser
let garage: TestGarage
let part: TestPart

beforeAll(async () => {
  browser = await launch()
  garage = await makeGarage({ terms: 'account', creditLimitMinor: 5_000_000, label: 'Counter Day Garage' })
  // £45.00 list, no tier: £45.00 net; 3 on the Northgate shelf and none at any other branch
  part = await makePart({ listPriceMinor: 4_500, stock: { NGT: 3 } })
})
afterAll(async () => { await browser?.close() })

/** The PDF behind a download link, kept beside the screenshots (when asked for) to be looked at. */
async function pdfOf(page: Page, click: () => Promise<void>, name: string): Promise<Buffer> {
  const [download] = await Promise.all([page.waitForEvent('download'), click()])
  const stream = await download.createReadStream()
  const chunks: Buffer[] = []
  for await (const c of stream) chunks.push(c as Buffer)
  const bytes = Buffer.concat(chunks)
  if (process.env.BORELINE_SCREENSHOTS) {
    mkdirSync(process.env.BORELINE_SCREENSHOTS, { recursive: true })
    writeFileSync(`${process.env.BORELINE_SCREENSHOTS}/${name}.pdf`, bytes)
  }
  return bytes
}

/** How far the page reaches past the window's right edge, in CSS pixels (0 when nothing scrolls sideways). */
const sideways = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)

let orderId = 0
let returnLineId = 0

describe('the counter\'s day in the browser', () => {
  it('orders a short line, picks short, sends, invoices, takes a wrong part back and credits it', async () => {
    const { context, requests } = await newContext(browser, { viewport: { width: 1280, height: 900 } })
    const page = await context.newPage()
    await signInThroughForm(page, garage.email)

    // into the basket from the catalogue; 0 is refused beside the field and the line stays
    await open(page, `/catalogue/parts/${part.sku}`)
    await page.getByRole('button', { name: 'Add to order' }).click()
    await page.getByRole('link', { name: 'Review the order' }).click()
    await page.waitForURL(/\/orders\/new$/)
    await hydrated(page)
    const qty = page.getByLabel(`Quantity of ${part.sku}`)
    await qty.fill('0')
    await qty.press('Tab')
    await page.getByText('Order at least 1.').waitFor()
    expect(await page.getByTestId('basket').textContent()).toContain(part.sku)
    await shot(page, 'counter-day-01-quantity-refused')

    // 5 wanted, 3 on the shelf: 2 back-ordered, and the garage has what is here sent now
    await qty.fill('5')
    await qty.press('Tab')
    const short = page.getByTestId('short-lines')
    await short.waitFor()
    expect(await short.textContent()).toContain('5 wanted; 3 here now, 2 back-ordered from the supplier')
    await short.getByLabel('Send what is here now, the rest follows').check()
    expect(await page.locator('[data-testid="line-supply"]').allTextContents()).toEqual([
      expect.stringContaining('From the shelf'), expect.stringContaining('Back-ordered from the supplier'),
    ])
    // 5 x £45.00 = £225.00 + VAT 20 % £45.00 = £270.00
    expect(await page.getByTestId('order-total').textContent()).toBe('£270.00')
    await shot(page, 'counter-day-02-short-line')
    expect(await sideways(page)).toBeLessThanOrEqual(0)
    await page.getByLabel('Charge to the trade account').check()
    await page.getByRole('button', { name: 'Place order for £270.00' }).click()
    await page.waitForURL(/\/orders\/\d+\?placed=1/)
    orderId = Number(new URL(page.url()).pathname.split('/').pop())

    // the counter picks 2 of the 3 on the shelf; the third is back-ordered, then sends what is picked
    const counterCtx = await newContext(browser, { viewport: { width: 1280, height: 900 } })
    const counter = await counterCtx.context.newPage()
    await signInThroughForm(counter, people.counter)
    await open(counter, `/counter/orders/${orderId}`)
    await counter.getByRole('button', { name: 'Start picking' }).click()
    const picked = counter.getByLabel(`Picked of ${part.sku}`)
    await picked.waitFor()
    await picked.fill('2')
    await counter.getByLabel(`Where the rest of ${part.sku} comes from`).selectOption('back_order')
    await shot(counter, 'counter-day-03-short-pick')
    await counter.getByRole('button', { name: 'Record what was picked' }).click()
    await counter.getByText('2 picked').waitFor()
    await counter.getByRole('button', { name: 'Send what is picked' }).click()
    const counterDocs = counter.getByTestId('documents')
    await counterDocs.waitFor()
    expect(await counterDocs.textContent()).toContain('Parts sent')
    await shot(counter, 'counter-day-04-sent')
    expect(await sideways(counter)).toBeLessThanOrEqual(0)

    // the garage sees two sent, three to come, and downloads the invoice: 2 x £45.00 + VAT £18.00 = £108.00
    await open(page, `/orders/${orderId}`)
    const invoiceRow = page.getByTestId('documents').locator('tr[data-document]')
    expect(await invoiceRow.count()).toBe(1)
    expect(await invoiceRow.textContent()).toContain('£108.00')
    const invoice = await pdfOf(page, () => invoiceRow.getByRole('link', { name: 'PDF' }).click(), 'counter-day-invoice')
    expect(invoice.subarray(0, 5).toString()).toBe('%PDF-')
    await shot(page, 'counter-day-05-garage-order')
    expect(await sideways(page)).toBeLessThanOrEqual(0)

    // one of the two was the wrong part: it goes back
    await page.getByRole('link', { name: 'Return parts' }).click()
    await page.waitForURL(/\/returns\/new\?line=\d+/)
    returnLineId = Number(new URL(page.url()).searchParams.get('line'))
    await hydrated(page)
    await page.getByLabel('How many').fill('1')
    await page.getByLabel('Wrong part ordered').check()
    await page.getByLabel('Note for the counter').fill('Ordered for the rear axle by mistake')
    await shot(page, 'counter-day-06-return-asked')
    await page.getByRole('button', { name: 'Ask to send them back' }).click()
    await page.waitForURL(/\/returns\?sent=\d+/)
    await page.getByTestId('return-status').first().waitFor()

    // the counter takes it back in full: £45.00 + VAT £9.00 = £54.00 on a credit note
    await open(counter, '/counter/returns')
    const item = counter.locator('[data-return]', { hasText: part.sku })
    await item.getByRole('button', { name: 'Accept and credit' }).click()
    const done = counter.getByRole('status').filter({ hasText: 'credited on' })
    await done.waitFor()
    expect(await done.textContent()).toContain('£54.00 credited on CRN')
    await shot(counter, 'counter-day-07-return-accepted')

    await open(page, '/returns')
    const credit = page.getByTestId('return-credit').first()
    await credit.waitFor()
    expect(await credit.textContent()).toContain('£54.00 credited')
    const note = await pdfOf(page, () => credit.getByRole('link', { name: /Credit note/ }).click(), 'counter-day-credit-note')
    expect(note.subarray(0, 5).toString()).toBe('%PDF-')
    await shot(page, 'counter-day-08-credit')
    await open(page, '/documents')
    expect(await page.getByTestId('documents').locator('tr[data-document]').count()).toBe(2)
    await shot(page, 'counter-day-09-documents')

    expect(foreignRequests(requests)).toEqual([])
    await counterCtx.context.close()
    await context.close()
  })

  it('fits the pages on a 390 px phone without scrolling sideways', async () => {
    expect(orderId).toBeGreaterThan(0)
    const phone = { viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true }
    const g = await newContext(browser, phone)
    const page = await g.context.newPage()
    await signInThroughForm(page, garage.email)
    for (const [path, name] of [[`/orders/${orderId}`, 'order'], ['/orders/new', 'basket'], ['/returns', 'returns'],
      [`/returns/new?line=${returnLineId}`, 'return-form'], ['/documents', 'documents']] as const) {
      await open(page, path)
      await page.waitForLoadState('networkidle')
      await shot(page, `counter-day-phone-${name}`)
      expect(await sideways(page), path).toBeLessThanOrEqual(0)
    }
    const c = await newContext(browser, phone)
    const counter = await c.context.newPage()
    await signInThroughForm(counter, people.counter)
    for (const [path, name] of [[`/counter/orders/${orderId}`, 'counter-order'], ['/counter/returns', 'counter-returns'],
      ['/counter/goods-in', 'goods-in'], ['/documents', 'counter-documents']] as const) {
      await open(counter, path)
      await counter.waitForLoadState('networkidle')
      await shot(counter, `counter-day-phone-${name}`)
      expect(await sideways(counter), path).toBeLessThanOrEqual(0)
    }
    await c.context.close()
    await g.context.close()
  })
})
