/**
 * The trade-account journey in Chromium: a garage applies with a document, the distributor admin approves
 * it, the manager signs in and invites a technician, who sets a password from the e-mailed link.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { people, waitForMail } from '../support/api'
import { foreignRequests, launch, newContext, shot, signInThroughForm } from '../support/browser'
import { applicationFields, pdfBytes, uniqueEmail } from '../support/accounts'

describe('trade accounts in the browser', () => {
  let browser: Browser
  beforeAll(async () => { browser = await launch() })
  afterAll(async () => { await browser?.close() })

  const garage = applicationFields()
  const technician = { email: uniqueEmail('browser-tech'), name: 'Tove Wheelnut', password: 'toves-own-password' }

  async function visible(page: Page, text: string | RegExp) {
    await page.getByText(text).first().waitFor({ state: 'visible', timeout: 15_000 })
  }

  it('a garage applies with its proof-of-trade document', async () => {
    const { context, requests } = await newContext(browser)
    const page = await context.newPage()
    await page.goto('/apply')
    // the form says what is wrong, next to the fields, before anything is sent
    await page.getByRole('button', { name: 'Send application' }).click()
    await visible(page, 'Enter the business name.')
    await page.getByLabel('Business name').fill(garage.businessName)
    await page.getByLabel('Trading address').fill(garage.tradingAddress)
    await page.getByLabel('Tax / VAT number').fill(garage.taxNumber)
    await page.getByLabel('Your name').fill(garage.contactName)
    await page.getByLabel('Phone').fill(garage.phone)
    await page.getByLabel('E-mail (you sign in with it)').fill(garage.email)
    await page.getByLabel('Password (at least 10 characters)').fill(garage.password)
    await page.getByLabel(/^Proof of trade/).setInputFiles({ name: 'trade-registration.pdf', mimeType: 'application/pdf', buffer: pdfBytes() })
    await shot(page, 'accounts-apply')
    await page.getByRole('button', { name: 'Send application' }).click()
    await visible(page, 'Application received')
    await waitForMail(garage.email, /we have your trade account application/)
    expect(foreignRequests(requests)).toEqual([])
    await context.close()
  })

  it('the distributor admin finds it in the queue, downloads the document and approves it', async () => {
    const { context } = await newContext(browser, { acceptDownloads: true })
    const page = await context.newPage()
    await signInThroughForm(page, people.admin)
    await page.goto('/admin/applications')
    await page.getByLabel(/^Search/).fill(garage.businessName)
    await page.getByRole('link', { name: garage.businessName }).click()
    await page.getByRole('heading', { level: 1, name: new RegExp(garage.businessName.replace(/[.*+?^${}()|[\]\\&]/g, '\\$&')) }).waitFor()
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: /^Download trade-registration\.pdf/ }).click()])
    expect(download.suggestedFilename()).toBe('trade-registration.pdf')
    await page.getByLabel('Discount tier').selectOption({ label: 'Silver — 12.5 % off list' })
    await page.getByLabel('Home branch').selectOption({ label: 'Northgate (NGT)' })
    await page.getByLabel('Trade account with a credit limit').check()
    await page.getByLabel('Credit limit', { exact: true }).fill('1500.00')
    await page.getByLabel('Days to pay').fill('30')
    await shot(page, 'accounts-decide')
    await page.getByRole('button', { name: 'Approve and open the trade account' }).click()
    await visible(page, 'The garage has been told by e-mail.')
    const mail = await waitForMail(garage.email, /your trade account is open/)
    expect(mail.text).toContain('£1,500.00')
    await context.close()
  })

  it('the manager signs in and invites a technician by e-mail', async () => {
    const { context } = await newContext(browser)
    const page = await context.newPage()
    await signInThroughForm(page, garage.email, garage.password)
    await page.goto('/account')
    await visible(page, 'Trade account: £1,500.00 credit limit, 30 days to pay')
    await page.getByRole('link', { name: /Manage your staff/ }).click()
    await page.getByRole('heading', { level: 1, name: 'Staff' }).waitFor()
    await page.getByLabel('Name', { exact: true }).fill(technician.name)
    await page.getByLabel('E-mail', { exact: true }).fill(technician.email)
    await page.locator('form select[name="role"]').selectOption({ label: 'Technician' })
    await page.getByRole('button', { name: 'Send invitation' }).click()
    await visible(page, `Invitation sent to ${technician.email}.`)
    await visible(page, 'Invited, no password yet')
    await shot(page, 'accounts-staff')
    await context.close()
  })

  it('the technician sets a password from the e-mailed link and signs in', async () => {
    const mail = await waitForMail(technician.email, /invited you to/)
    const link = /(http\S+\/invite\/[A-Za-z0-9_-]+)/.exec(mail.text)![1]!
    const { context } = await newContext(browser)
    const page = await context.newPage()
    await page.goto(link)
    await visible(page, `Join ${garage.businessName}`)
    expect(await page.getByLabel('Your name').inputValue()).toBe(technician.name)
    await page.getByLabel('Choose a password').fill(technician.password)
    await page.getByLabel('Password again').fill('something-else-entirely')
    await page.getByRole('button', { name: 'Set password and join' }).click()
    await visible(page, 'The two passwords differ.')
    await page.getByLabel('Password again').fill(technician.password)
    await page.getByRole('button', { name: 'Set password and join' }).click()
    await page.waitForURL((u) => u.pathname === '/sign-in')
    await visible(page, 'Your password is set. Sign in to start.')
    expect(await page.getByLabel('E-mail').inputValue()).toBe(technician.email)
    await page.getByLabel('Password').fill(technician.password)
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'))
    await visible(page, technician.name)
    // the link worked once
    await page.goto(link)
    await visible(page, /expired or has already been used/)
    await context.close()
  })

  it('a pending garage sees only its application status', async () => {
    const { context } = await newContext(browser)
    const page = await context.newPage()
    await signInThroughForm(page, people.pendingManager)
    await page.waitForURL((u) => u.pathname === '/trade-application')
    await visible(page, 'Pending review')
    await page.goto('/staff')
    await page.waitForURL((u) => u.pathname === '/trade-application')
    expect(await page.getByRole('navigation', { name: 'Main' }).getByRole('link').count()).toBe(0)
    await context.close()
  })
})
