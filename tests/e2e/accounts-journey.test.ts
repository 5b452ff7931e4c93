/**
 * The trade-account life cycle against the built server, with the e-mails read back from the mail catcher:
 * apply -> the admin decides -> the garage signs in; rejection; decisions refused twice; suspension and
 * reactivation; tier and terms changes and the tiers themselves; every decision in the audit log.
 */
import { createHash } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { Client, as, env, mailFor, people, waitForMail } from '../support/api'
import { applicationFields, applicationForm, applyAsNewGarage, dbRows, dbValue, garageIdOf, newApprovedGarage, pdfBytes, postApplication, unique } from '../support/accounts'

await setup({ host: env().baseUrl })

let admin: Client
let tiers: { id: number; name: string; percentBp: number }[]
// the branch that will supply the garage's orders: required on approval
let homeBranchId: number
beforeAll(async () => {
  admin = await as(people.admin)
  tiers = (await admin.get('/api/admin/tiers')).body.data
  homeBranchId = (await admin.get('/api/branches')).body[0].id
})
const tier = (name: string) => tiers.find((t) => t.name === name)!

describe('apply -> approve -> sign in', () => {
  const fields = applicationFields()
  const document = Buffer.concat([pdfBytes(), Buffer.from(`% ${unique('doc')}\n`)])
  let id = 0
  const applicant = new Client()

  it('takes the application with its document and answers 201 pending', async () => {
    const res = await postApplication(new Client(), applicationForm(fields, [{ name: 'Trade Registration.PDF', bytes: document, type: 'application/pdf' }]))
    expect(res.status).toBe(201)
    expect(res.body.status).toBe('pending')
    id = garageIdOf(fields.email)
    const stored = dbRows<{ stored_name: string; original_name: string; mime: string; size_bytes: number }>(`SELECT * FROM proof_documents WHERE organisation_id = ${id}`)
    expect(stored).toHaveLength(1)
    expect(stored[0]).toMatchObject({ original_name: 'Trade Registration.PDF', mime: 'application/pdf', size_bytes: document.length })
    // a name of our own, not the client's
    expect(stored[0]!.stored_name).toMatch(/^[a-f0-9]{32}\.pdf$/)
    const user = dbRows<{ role: string; status: string; password_hash: string }>(`SELECT role, status, password_hash FROM users WHERE email = '${fields.email}'`)[0]!
    expect(user).toMatchObject({ role: 'garage_manager', status: 'active' })
    expect(user.password_hash).not.toContain(fields.password)
  })

  it('e-mails a confirmation to the applicant and a notice to the distributor admin', async () => {
    const confirmation = await waitForMail(fields.email, /we have your trade account application/)
    expect(confirmation.text).toContain(fields.businessName)
    const notice = await waitForMail(people.admin, new RegExp(`new trade account application from ${fields.businessName.replace(/[.*+?^${}()|[\]\\&]/g, '\\$&')}`))
    expect(notice.text).toContain(`/admin/applications/${id}`)
    expect(notice.text).toContain(fields.email)
  })

  it('lets the pending applicant sign in to its status page only', async () => {
    const r = await applicant.signIn(fields.email, fields.password)
    expect(r.body.organisationStatus).toBe('pending')
    expect((await applicant.get('/api/trade-applications/mine')).body).toMatchObject({ status: 'pending', businessName: fields.businessName, document: { originalName: 'Trade Registration.PDF' } })
    expect((await applicant.get('/api/account')).status).toBe(403)
    expect((await applicant.get('/api/staff')).status).toBe(403)
  })

  it('shows the admin the queue, filtered, sorted and paged, and the application with its document', async () => {
    const list = await admin.get(`/api/admin/trade-applications?status=pending&q=${encodeURIComponent(fields.businessName.slice(0, 20))}`)
    expect(list.status).toBe(200)
    expect(list.body.meta).toEqual({ page: 1, pageSize: 20, total: 1, pages: 1 })
    expect(list.body.data[0]).toMatchObject({ id, name: fields.businessName, status: 'pending' })

    const paged = await admin.get('/api/admin/trade-applications?status=all&sort=-submitted&page=1&pageSize=2')
    expect(paged.body.data).toHaveLength(2)
    expect(paged.body.meta.total).toBeGreaterThanOrEqual(3)
    const [first, second] = paged.body.data as { submittedAt: string }[]
    expect(first!.submittedAt >= second!.submittedAt).toBe(true) // newest first
    const byName = (await admin.get('/api/admin/trade-applications?status=all&sort=name&pageSize=100')).body.data.map((g: { name: string }) => g.name)
    expect(byName).toEqual([...byName].sort((a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0)))
    expect((await admin.get('/api/admin/trade-applications?status=nonsense')).status).toBe(422)
    expect((await admin.get('/api/admin/trade-applications?page=0')).status).toBe(422)

    const detail = await admin.get(`/api/admin/trade-applications/${id}`)
    expect(detail.body).toMatchObject({ id, status: 'pending', taxNumber: fields.taxNumber, tradingAddress: fields.tradingAddress, document: { originalName: 'Trade Registration.PDF', mime: 'application/pdf', sizeBytes: document.length } })
    expect(detail.body.people.map((p: { email: string }) => p.email)).toEqual([fields.email])

    const file = await fetch(`${env().baseUrl}/api/admin/trade-applications/${id}/document`, { headers: { cookie: admin.cookieHeader() } })
    expect(file.status).toBe(200)
    expect(file.headers.get('content-type')).toBe('application/pdf')
    expect(file.headers.get('content-disposition')).toMatch(/^attachment; filename="Trade Registration.PDF"/)
    expect(file.headers.get('x-content-type-options')).toBe('nosniff')
    const bytes = Buffer.from(await file.arrayBuffer())
    expect(createHash('sha256').update(bytes).digest('hex')).toBe(createHash('sha256').update(document).digest('hex'))
    // counter staff may read it too; garages may not
    expect((await (await as(people.counter)).get(`/api/admin/trade-applications/${id}/document`)).status).toBe(200)
    expect((await applicant.get(`/api/admin/trade-applications/${id}/document`)).status).toBe(403)
    expect((await admin.get('/api/admin/trade-applications/999999/document')).status).toBe(404)
  })

  it('refuses inconsistent terms and unknown tiers (422) and leaves the application pending', async () => {
    const noLimit = await admin.post(`/api/admin/trade-applications/${id}/decision`, { decision: 'approve', tierId: tier('Silver').id, homeBranchId, terms: 'account' })
    expect(noLimit.status).toBe(422)
    expect(Object.keys(noLimit.body.data.fields).sort()).toEqual(['creditLimitMinor', 'paymentDays'])
    const cardWithLimit = await admin.post(`/api/admin/trade-applications/${id}/decision`, { decision: 'approve', tierId: tier('Silver').id, homeBranchId, terms: 'card', creditLimitMinor: 1000 })
    expect(cardWithLimit.body.data.fields).toHaveProperty('creditLimitMinor')
    const unknownTier = await admin.post(`/api/admin/trade-applications/${id}/decision`, { decision: 'approve', tierId: 999999, homeBranchId, terms: 'card' })
    expect(unknownTier.status).toBe(422)
    expect(unknownTier.body.data.fields).toHaveProperty('tierId')
    const rejectNoReason = await admin.post(`/api/admin/trade-applications/${id}/decision`, { decision: 'reject' })
    expect(rejectNoReason.body.data.fields).toHaveProperty('reason')
    const unknown = await admin.post(`/api/admin/trade-applications/${id}/decision`, { decision: 'maybe' })
    expect(unknown.status).toBe(422)
    expect(dbValue(`SELECT status FROM organisations WHERE id = ${id}`)).toBe('pending')
    expect(await waitForNoMail(fields.email, /trade account is open|not approved/)).toBe(true)
  })

  it('approves with a tier and account terms, e-mails the garage and refuses a second decision (409)', async () => {
    const silver = tier('Silver')
    const r = await admin.post(`/api/admin/trade-applications/${id}/decision`, { decision: 'approve', tierId: silver.id, homeBranchId, terms: 'account', creditLimitMinor: 250_000, paymentDays: 30 })
    expect(r.status).toBe(200)
    expect(r.body).toMatchObject({ status: 'approved', tier: { id: silver.id, name: 'Silver' }, terms: 'account', creditLimitMinor: 250_000, paymentDays: 30 })
    const mail = await waitForMail(fields.email, /your trade account is open/)
    expect(mail.text).toContain('Silver (12.5 % off list prices)')
    expect(mail.text).toContain('£2,500.00')
    expect(mail.text).toContain('30 days')

    expect((await admin.post(`/api/admin/trade-applications/${id}/decision`, { decision: 'approve', tierId: silver.id, homeBranchId, terms: 'card' })).status).toBe(409)
    expect((await admin.post(`/api/admin/trade-applications/${id}/decision`, { decision: 'reject', reason: 'Changed my mind about it' })).status).toBe(409)
    expect(dbValue(`SELECT status FROM organisations WHERE id = ${id}`)).toBe('approved')
  })

  it('records who decided what, and when, in the audit log', () => {
    const adminId = dbValue<number>(`SELECT id FROM users WHERE email = '${people.admin}'`)
    const entries = dbRows<{ action: string; actor_user_id: number; changes: string; created_at: string }>(
      `SELECT action, actor_user_id, changes, created_at FROM audit_log WHERE entity = 'organisation' AND entity_id = '${id}' ORDER BY id`)
    expect(entries.map((e) => e.action)).toEqual(['tradeApplication.submitted', 'tradeApplication.approved'])
    const approved = entries[1]!
    expect(approved.actor_user_id).toBe(adminId)
    expect(Date.now() - new Date(approved.created_at).getTime()).toBeLessThan(5 * 60_000)
    expect(JSON.parse(approved.changes)).toMatchObject({
      status: { from: 'pending', to: 'approved' }, terms: { from: null, to: 'account' },
      creditLimitMinor: { from: 0, to: 250_000 }, paymentDays: { from: 0, to: 30 },
    })
  })

  it('opens the account for the session the applicant already had, and at a new sign-in', async () => {
    expect((await applicant.get('/api/account')).status).toBe(200)
    const fresh = new Client()
    const r = await fresh.signIn(fields.email, fields.password)
    expect(r.body.organisationStatus).toBe('approved')
    const account = (await fresh.get('/api/account')).body
    expect(account.organisation).toMatchObject({ status: 'approved', terms: 'account', creditLimitMinor: 250_000, paymentDays: 30, tier: { name: 'Silver', percentBp: 1250 } })
  })
})

describe('rejection', () => {
  it('rejects with a reason the garage reads in its e-mail and on its status page', async () => {
    const { id, fields } = await applyAsNewGarage()
    const reason = 'The document does not show a trading address. Please apply again with a current certificate.'
    const r = await admin.post(`/api/admin/trade-applications/${id}/decision`, { decision: 'reject', reason })
    expect(r.status).toBe(200)
    expect(r.body.status).toBe('rejected')
    const mail = await waitForMail(fields.email, /was not approved/)
    expect(mail.text).toContain(reason)
    const garage = new Client()
    expect((await garage.signIn(fields.email, fields.password)).body.organisationStatus).toBe('rejected')
    expect((await garage.get('/api/trade-applications/mine')).body).toMatchObject({ status: 'rejected', decisionReason: reason })
    expect((await garage.get('/api/account')).status).toBe(403)
    expect((await admin.post(`/api/admin/trade-applications/${id}/decision`, { decision: 'approve', tierId: tier('Bronze').id, homeBranchId, terms: 'card' })).status).toBe(409)
    const last = dbRows<{ action: string; changes: string }>(`SELECT action, changes FROM audit_log WHERE entity_id = '${id}' AND entity = 'organisation' ORDER BY id DESC LIMIT 1`)[0]!
    expect(last.action).toBe('tradeApplication.rejected')
    expect(JSON.parse(last.changes).reason).toBe(reason)
  })

  it('answers 404 for an application that does not exist and for the distributor itself', async () => {
    const distributorId = dbValue<number>(`SELECT id FROM organisations WHERE kind = 'distributor'`)
    expect((await admin.get('/api/admin/trade-applications/999999')).status).toBe(404)
    expect((await admin.get(`/api/admin/trade-applications/${distributorId}`)).status).toBe(404)
    expect((await admin.post(`/api/admin/trade-applications/${distributorId}/decision`, { decision: 'reject', reason: 'not a garage at all' })).status).toBe(404)
  })
})

describe('suspension, reactivation and terms', () => {
  it('suspends a garage: its manager\'s next request is refused (403) without a new sign-in; reactivation lets it back', async () => {
    const { id, fields, manager } = await newApprovedGarage(admin)
    expect((await manager.get('/api/account')).status).toBe(200)
    expect((await admin.post(`/api/admin/trade-accounts/${id}/suspend`, { reason: 'Statement overdue by 60 days.' })).status).toBe(200)
    const refused = await manager.get('/api/account')
    expect(refused.status).toBe(403)
    expect(refused.body.message).toMatch(/suspended/)
    expect((await manager.get('/api/staff')).status).toBe(403)
    // they still see why
    expect((await manager.get('/api/trade-applications/mine')).body).toMatchObject({ status: 'suspended', decisionReason: 'Statement overdue by 60 days.' })
    expect((await waitForMail(fields.email, /suspended/)).text).toContain('Statement overdue by 60 days.')
    expect((await admin.post(`/api/admin/trade-accounts/${id}/suspend`, { reason: 'Twice is once too many.' })).status).toBe(409)

    expect((await admin.post(`/api/admin/trade-accounts/${id}/reactivate`, {})).status).toBe(200)
    expect((await manager.get('/api/account')).status).toBe(200)
    await waitForMail(fields.email, /active again/)
    expect((await admin.post(`/api/admin/trade-accounts/${id}/reactivate`, {})).status).toBe(409)
    const actions = dbRows<{ action: string }>(`SELECT action FROM audit_log WHERE entity = 'organisation' AND entity_id = '${id}' ORDER BY id`).map((r) => r.action)
    expect(actions).toEqual(['tradeApplication.submitted', 'tradeApplication.approved', 'tradeAccount.suspended', 'tradeAccount.reactivated'])
  })

  it('changes tier and terms, audits only what changed and tells the garage', async () => {
    const { id, fields } = await newApprovedGarage(admin, { tierId: tier('Bronze').id })
    const r = await admin.patch(`/api/admin/trade-accounts/${id}`, { tierId: tier('Gold').id, terms: 'account', creditLimitMinor: 120_000, paymentDays: 45 })
    expect(r.status).toBe(200)
    expect(r.body).toMatchObject({ tier: { name: 'Gold' }, terms: 'account', creditLimitMinor: 120_000, paymentDays: 45 })
    const mail = await waitForMail(fields.email, /trade terms have changed/)
    expect(mail.text).toContain('Gold (20 % off list prices)')
    const entry = dbRows<{ changes: string; actor_user_id: number }>(`SELECT changes, actor_user_id FROM audit_log WHERE entity = 'organisation' AND entity_id = '${id}' AND action = 'tradeAccount.terms_changed'`)
    expect(entry).toHaveLength(1)
    expect(JSON.parse(entry[0]!.changes)).toEqual({
      tierId: { from: 'Bronze (5 %)', to: 'Gold (20 %)' },
      paymentTerms: { from: 'card', to: 'account' },
      creditLimitMinor: { from: 0, to: 120_000 },
      paymentDays: { from: 0, to: 45 },
    })
    // back to card: the limit and the days go with it
    const card = await admin.patch(`/api/admin/trade-accounts/${id}`, { terms: 'card' })
    expect(card.body).toMatchObject({ terms: 'card', creditLimitMinor: 0, paymentDays: 0, tier: { name: 'Gold' } })
    // inconsistent terms are refused and change nothing
    const bad = await admin.patch(`/api/admin/trade-accounts/${id}`, { terms: 'account' })
    expect(bad.status).toBe(422)
    expect(bad.body.data.fields).toHaveProperty('creditLimitMinor')
    expect(dbValue(`SELECT payment_terms FROM organisations WHERE id = ${id}`)).toBe('card')
    // pending applications are decided, not edited
    const { id: pendingId } = await applyAsNewGarage()
    expect((await admin.patch(`/api/admin/trade-accounts/${pendingId}`, { tierId: tier('Gold').id })).status).toBe(409)
  })

  it('lists the accounts for distributor staff with filters; counter staff read but cannot change', async () => {
    const counter = await as(people.counter)
    const list = await counter.get('/api/admin/trade-accounts?status=approved&sort=name&pageSize=100')
    expect(list.status).toBe(200)
    expect(list.body.data.every((g: { status: string }) => g.status === 'approved')).toBe(true)
    expect(list.body.data.map((g: { name: string }) => g.name)).toContain('Millbrook Motor Works')
    const millbrook = list.body.data.find((g: { name: string }) => g.name === 'Millbrook Motor Works')
    const detail = await counter.get(`/api/admin/trade-accounts/${millbrook.id}`)
    expect(detail.body).toMatchObject({ terms: 'account', tier: { name: 'Silver' } })
    expect(detail.body.history).toEqual([]) // the audit log is the admin's
    expect((await counter.patch(`/api/admin/trade-accounts/${millbrook.id}`, { terms: 'card' })).status).toBe(403)
    expect((await counter.post(`/api/admin/trade-accounts/${millbrook.id}/suspend`, { reason: 'I am not allowed to' })).status).toBe(403)
  })
})

describe('discount tiers', () => {
  it('creates, renames, re-prices and deletes a tier; refuses duplicates and deleting a tier in use', async () => {
    const name = unique('Fleet')
    const created = await admin.post('/api/admin/tiers', { name, percent: 7.5 })
    expect(created.status).toBe(201)
    expect(created.body).toMatchObject({ name, percentBp: 750 })
    const id = created.body.id
    expect((await admin.post('/api/admin/tiers', { name, percent: 3 })).body.data.fields).toHaveProperty('name')
    expect((await admin.post('/api/admin/tiers', { name: `${name}-x`, percent: 12.345 })).body.data.fields).toHaveProperty('percent')
    expect((await admin.post('/api/admin/tiers', { name: `${name}-y`, percent: 101 })).status).toBe(422)
    expect((await admin.patch(`/api/admin/tiers/${id}`, { percent: 8.25 })).body).toMatchObject({ percentBp: 825 })
    expect((await admin.patch(`/api/admin/tiers/${id}`, { name: 'Silver' })).status).toBe(422)

    const { id: garageId } = await newApprovedGarage(admin, { tierId: id })
    expect((await admin.del(`/api/admin/tiers/${id}`)).status).toBe(409)
    expect((await admin.get('/api/admin/tiers')).body.data.find((t: { id: number }) => t.id === id).garages).toBe(1)
    await admin.patch(`/api/admin/trade-accounts/${garageId}`, { tierId: tier('Standard').id })
    expect((await admin.del(`/api/admin/tiers/${id}`)).status).toBe(200)
    expect((await admin.del(`/api/admin/tiers/${id}`)).status).toBe(404)
    const actions = dbRows<{ action: string }>(`SELECT action FROM audit_log WHERE entity = 'discount_tier' AND entity_id = '${id}' ORDER BY id`).map((r) => r.action)
    expect(actions).toEqual(['tier.created', 'tier.changed', 'tier.deleted'])
  })
})

/** True when no e-mail matching `subject` reaches `to` within a short while. */
async function waitForNoMail(to: string, subject: RegExp, ms = 600): Promise<boolean> {
  await new Promise((r) => setTimeout(r, ms))
  return !(await mailFor(to)).some((m) => subject.test(m.subject))
}
