/**
 * Price files in Chromium: counter staff upload a supplier file with a few bad rows and one large price jump,
 * choose the columns the file names its own way, read the preview, confirm the jump, leave out the bad rows,
 * apply, see the new price on the part page, then roll back and see the old price again.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import sqlite3 from 'sqlite3'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { env, people } from '../support/api'
import { foreignRequests, launch, newContext, shot, signInThroughForm } from '../support/browser'

interface DemoPart { id: number; sku: string; list: number; trade: number | null }

function query<T>(sql: string, params: unknown[] = []): Promise<T[]> {
  const db = new sqlite3.Database(env().dbPath, sqlite3.OPEN_READONLY)
  return new Promise((res, rej) => db.all(sql, params, (err, rows) => { db.close(); if (err) rej(err); else res(rows as T[]) }))
}

/** Pounds as the demo installation shows them (GBP, en-GB), written by Intl here rather than by the app's own formatter. */
const gbp = (minor: number) => new Intl.NumberFormat('en-GB', { style: 'currency', currency: 'GBP' }).format(minor / 100)
const amount = (minor: number) => (minor / 100).toFixed(2)

describe('price files in Chromium', () => {
  let browser: Browser
  let context: BrowserContext
  let requests: string[]
  let page: Page
  let dir: string
  let parts: DemoPart[]
  let jump: DemoPart
  let uploadPath: string

  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'price-browser-'))
    parts = await query<DemoPart>(
      `SELECT p.id, p.sku, pr.list_price_minor AS list, pr.trade_cost_minor AS trade FROM parts p
         JOIN part_prices pr ON pr.part_id = p.id
        WHERE p.status = 'active' AND p.sku NOT LIKE 'PLT-%' ORDER BY p.id LIMIT 6 OFFSET 60`)
    jump = parts[0]!
    // the supplier's own column names: only "Part ref" is obvious, the rest must be chosen by hand
    const lines = ['Part ref;Info;Kind;Sell each;Our cost']
    lines.push(`${jump.sku};;;${amount(Math.round(jump.list * 1.6))};`) // +60 %: needs confirming
    for (const p of parts.slice(1)) lines.push(`${p.sku};;;${amount(p.list + 25)};${p.trade ? amount(p.trade + 10) : ''}`)
    lines.push('PLT-BR-1;Browser test wear sensor;wear_sensor;14.90;8.10') // a new part
    lines.push(`${parts[1]!.sku}X X;;;9.99;`) // bad SKU
    lines.push('PLT-BR-2;Browser test hose;hose;12.5.0;') // bad price
    uploadPath = join(dir, 'greywell-december.csv')
    writeFileSync(uploadPath, lines.join('\r\n') + '\r\n')

    browser = await launch()
    ;({ context, requests } = await newContext(browser, { viewport: { width: 1280, height: 1000 }, acceptDownloads: true }))
    page = await context.newPage()
    await signInThroughForm(page, people.counter)
  })
  afterAll(async () => {
    await browser?.close()
    rmSync(dir, { recursive: true, force: true })
  })

  it('uploads the file, asks for the columns it could not place, and previews the check', async () => {
    await page.goto('/price-files')
    await page.getByRole('heading', { name: 'Price files', level: 1 }).waitFor()
    await expect(page.getByRole('link', { name: 'Price files' }).first().isVisible()).resolves.toBe(true) // in the menu
    await page.locator('input[name="file"]').setInputFiles(uploadPath)
    await page.locator('input[name="supplierName"]').fill('Greywell Browser Test')
    await page.locator('select[name="delimiter"]').selectOption('semicolon')
    await shot(page, 'price-files-upload')
    await page.getByRole('button', { name: 'Upload and check' }).click()
    await page.waitForURL(/\/price-files\/\d+$/)
    await page.getByText('Needs column choices').first().waitFor()
    await expect(page.getByTestId('price-file-message').textContent()).resolves.toMatch(/No column is chosen for the list price/)
    const listSelect = page.locator('select[name="mapping-listPrice"]')
    await expect(listSelect.locator('xpath=..').textContent()).resolves.toMatch(/No column is chosen for the list price/)
    await expect(page.locator('select[name="mapping-sku"]').inputValue()).resolves.toBe('Part ref')
    await shot(page, 'price-files-columns')

    await listSelect.selectOption('Sell each')
    await page.locator('select[name="mapping-tradeCost"]').selectOption('Our cost')
    await page.locator('select[name="mapping-description"]').selectOption('Info')
    await page.locator('select[name="mapping-type"]').selectOption('Kind')
    await page.getByRole('button', { name: 'Check the file with these columns' }).click()
    await page.getByText('Checked, not in use').first().waitFor({ timeout: 30_000 })

    await expect(page.locator('[data-count="rows"]').textContent()).resolves.toBe('9')
    await expect(page.locator('[data-count="changed"]').textContent()).resolves.toBe('6')
    await expect(page.locator('[data-count="new"]').textContent()).resolves.toBe('1')
    await expect(page.locator('[data-count="rejected"]').textContent()).resolves.toBe('2')
    await page.getByText('1 beyond 30 %').waitFor()

    // price changes, largest first, the jump flagged for checking
    const changes = page.locator('table[data-kind="changed"]')
    await changes.waitFor()
    const first = changes.locator('tbody tr').first()
    await expect(first.getAttribute('data-sku')).resolves.toBe(jump.sku)
    await expect(first.textContent()).resolves.toMatch(/\+(59\.9\d|60\.0\d) %check/)
    await expect(first.textContent()).resolves.toContain(gbp(jump.list))
    await page.locator('input[name="only-large"]').check()
    await expect.poll(() => changes.locator('tbody tr').count()).toBe(1)
    await shot(page, 'price-files-preview-changes')
    await page.locator('input[name="only-large"]').uncheck()
    await changes.getByRole('button', { name: /^Change/ }).click() // sort ascending
    await expect.poll(() => changes.locator('tbody tr').first().getAttribute('data-sku')).not.toBe(jump.sku)

    // the refused rows, with row, column and reason, and their CSV
    await page.getByRole('tab', { name: /Refused rows/ }).click()
    const refused = page.locator('table[data-kind="rejected"] tbody tr')
    await expect.poll(() => refused.count()).toBe(2)
    await expect(refused.nth(0).textContent()).resolves.toMatch(/^9.*Part ref.*not well-formed/)
    await expect(refused.nth(1).textContent()).resolves.toMatch(/^10PLT-BR-2Sell each.*not an amount/)
    const downloading = page.waitForEvent('download')
    await page.getByRole('link', { name: 'Download refused rows (CSV)' }).click()
    const file = await (await downloading).path()
    const text = readFileSync(file!, 'utf8')
    expect(text).toMatch(/^\ufeffrow,problem_columns,problem,Part ref,Info,Kind,Sell each,Our cost/)
    expect(text).toMatch(/\n10,Sell each,.*PLT-BR-2/)
    await shot(page, 'price-files-preview-refused')

    await page.getByRole('tab', { name: /New parts/ }).click()
    await page.locator('table[data-kind="new"] tr[data-sku="PLT-BR-1"]').waitFor()
  })

  it('asks for both confirmations next to their boxes, applies, and the part page shows the new price', async () => {
    await page.getByRole('button', { name: /^Apply as version \d+/ }).click()
    await page.locator('#confirm-err').waitFor()
    await expect(page.locator('#confirm-err').textContent()).resolves.toMatch(/1 price moves by more than 30 %/)
    await expect(page.locator('#exclude-err').textContent()).resolves.toMatch(/2 rows were refused/)
    await shot(page, 'price-files-apply-refused')

    await page.locator('input[name="confirmLargeChanges"]').check()
    await page.locator('input[name="excludeRejected"]').check()
    await page.getByRole('button', { name: /^Apply as version \d+/ }).click()
    // the page says what applying changes and asks in the page, not in a browser dialog
    const ask = page.locator('[data-confirm]')
    await ask.waitFor()
    await expect(ask.textContent()).resolves.toMatch(/price changes?|prices change/)
    await shot(page, 'price-files-apply-confirm')
    await page.getByRole('button', { name: /^Yes, apply version \d+/ }).click()
    await page.getByRole('button', { name: /^Roll back to version \d+/ }).waitFor({ timeout: 30_000 })
    await expect(page.getByText(/It is the version in use/).isVisible()).resolves.toBe(true)
    await shot(page, 'price-files-applied')

    const newList = Math.round(jump.list * 1.6)
    await page.goto(`/catalogue/parts/${encodeURIComponent(jump.sku)}`)
    const list = page.locator('[data-field="list"]')
    await list.waitFor()
    await expect(list.textContent()).resolves.toBe(gbp(newList))
    await shot(page, 'price-files-part-page')
  })

  it('rolls back: the previous version is in use again and the part page shows the old price', async () => {
    await page.goBack()
    await page.waitForURL(/\/price-files\/\d+$/)
    await page.getByRole('button', { name: /^Roll back to version \d+/ }).click()
    await page.getByRole('button', { name: /^Yes, roll back to version \d+/ }).click()
    await page.getByText('Withdrawn').first().waitFor({ timeout: 30_000 })
    await shot(page, 'price-files-rolled-back')
    await page.goto(`/catalogue/parts/${encodeURIComponent(jump.sku)}`)
    const list = page.locator('[data-field="list"]')
    await list.waitFor()
    await expect(list.textContent()).resolves.toBe(gbp(jump.list))
    await page.goto('/price-files')
    await page.locator('tr[data-version="2"]').or(page.locator('tr[data-version]').nth(1)).first().waitFor()
    await expect(page.getByText(/Version \d+ is in use/).textContent()).resolves.toMatch(/Version 1 is in use/)
    await shot(page, 'price-files-index')
    expect(foreignRequests(requests)).toEqual([])
  })
})
