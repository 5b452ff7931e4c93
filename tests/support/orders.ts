/**
 * Fixtures for the order tests. The e2e database is shared by every e2e file in a run, so tests that change
 * balances or stock make their own garage, parts and stock here (written straight into the test database
 * through the app's own models) instead of touching the demo garages.
 * Also: signing webhook events with the test secret the global setup gives the server, and fake controls.
 */
import { randomBytes } from 'node:crypto'
import { expect } from 'vitest'
import Stripe from 'stripe'
import { QueryTypes } from 'sequelize'
import { getDb, withWrite } from '../../server/utils/db'
import { initModels } from '../../server/models/index'
import { Branch, DiscountTier, Organisation, User } from '../../server/models/accounts'
import { Fitment, PartPrice, Part, PriceVersion, StockLevel } from '../../server/models/catalogue'
import { CoreReturn, LedgerEntry, Order, OrderLine } from '../../server/models/orders'
import { Quote, QuoteLine } from '../../server/models/quotes'
import { hashPasswordOutsideNitro } from '../../server/services/password'
import { DEMO_PASSWORD, as, env, people, type Client } from './api'

/** tests/support/global-setup.ts starts the server and the payment fake with this secret */
export const WEBHOOK_SECRET = 'whsec_boreline_test_secret'

let bound = false
export function models(): void {
  if (bound) return
  process.env.DATABASE_URL = env().databaseUrl
  initModels(getDb())
  bound = true
}

export const uid = () => randomBytes(4).toString('hex')

let hash: Promise<string> | undefined

export interface TestGarage { id: number; name: string; email: string; managerId: number }

/** An approved garage with one manager who signs in with the demo password. */
export async function makeGarage(o: { terms: 'card' | 'account'; creditLimitMinor?: number; tier?: string; homeBranch?: string; label?: string }): Promise<TestGarage> {
  models()
  const id = uid()
  const email = `manager-${id}@e2e-garage.test`
  const passwordHash = await (hash ??= hashPasswordOutsideNitro(DEMO_PASSWORD))
  return withWrite(async (t) => {
    const tier = o.tier ? await DiscountTier.findOne({ where: { name: o.tier }, transaction: t }) : null
    const branch = await Branch.findOne({ where: { code: o.homeBranch ?? 'NGT' }, transaction: t })
    const org = await Organisation.create({
      kind: 'garage', name: `${o.label ?? 'E2E Garage'} ${id}`, status: 'approved', tierId: tier?.id ?? null,
      paymentTerms: o.terms, creditLimitMinor: o.creditLimitMinor ?? 0, paymentDays: o.terms === 'account' ? 30 : 0,
      homeBranchId: branch!.id, email: `office-${id}@e2e-garage.test`, tradingAddress: '1 Test Lane, Northgate', taxNumber: 'GB 000 0000 01',
    }, { transaction: t })
    const user = await User.create({ organisationId: org.id, email, name: `Manager ${id}`, role: 'garage_manager', passwordHash, status: 'active' }, { transaction: t })
    return { id: org.id, name: org.name, email, managerId: user.id }
  })
}

export interface TestPart { id: number; sku: string }

/** A part on the active price version with stock at the branches given (code -> units). */
export async function makePart(o: { listPriceMinor: number; coreDepositMinor?: number; stock: Record<string, number>; prefix?: string }): Promise<TestPart> {
  models()
  const sku = `${o.prefix ?? 'ZT'}-${uid().toUpperCase()}`
  return withWrite(async (t) => {
    let list = await PriceVersion.findOne({ where: { status: 'active' }, transaction: t })
    if (!list) list = await PriceVersion.create({ version: 9000, label: 'e2e list', status: 'active', activatedAt: new Date() }, { transaction: t })
    const part = await Part.create({ sku, type: 'caliper', description: `Test caliper ${sku}, remanufactured (exchange)`, specs: {}, status: 'active' }, { transaction: t })
    await PartPrice.create({ partId: part.id, listPriceMinor: o.listPriceMinor, coreDepositMinor: o.coreDepositMinor ?? 0, packQuantity: 1, priceVersionId: list.id }, { transaction: t })
    // listed for the quote tests' demo vehicle (id 1), so the fitment guard lets it onto their quotes
    await Fitment.create({ vehicleId: 1, partId: part.id, axle: 'front', side: 'left', quantity: 1, qualifiers: {}, note: 'test part' }, { transaction: t })
    for (const [code, quantity] of Object.entries(o.stock)) {
      const b = await Branch.findOne({ where: { code }, transaction: t })
      await StockLevel.create({ partId: part.id, branchId: b!.id, quantity, updatedAt: new Date() }, { transaction: t })
    }
    return { id: part.id, sku }
  })
}

export interface TestQuoteLine {
  kind?: 'part' | 'labour'
  sku?: string
  partId?: number
  quantity?: number
  /** the net unit price the quote captured (parts) */
  unitNetMinor?: number
  decision: 'approved' | 'declined' | null
}

/**
 * A quote the owner has already decided on, written as the quote routes would leave it (status and each
 * line's decision), so the order tests do not depend on the whole quoting journey.
 */
export async function makeQuote(garage: TestGarage, status: 'approved' | 'partly_approved' | 'sent' | 'draft', lines: TestQuoteLine[]): Promise<{ id: number }> {
  models()
  return withWrite(async (t) => {
    const number = 1 + Number(await Quote.max('number', { where: { organisationId: garage.id }, transaction: t }) || 0)
    const quote = await Quote.create({
      organisationId: garage.id, number, status, ownerName: 'Pat Owner', ownerEmail: 'pat.owner@example.test',
      vehicleLabel: 'Test vehicle', createdByUserId: garage.managerId,
      ...(status === 'draft' ? {} : { sentAt: new Date(), expiresAt: new Date(Date.now() + 14 * 86_400_000) }),
      ...(status === 'approved' || status === 'partly_approved' ? { decidedAt: new Date() } : {}),
    }, { transaction: t })
    let position = 0
    for (const l of lines) {
      const kind = l.kind ?? 'part'
      const quantity = l.quantity ?? 1
      const unit = kind === 'labour' ? 6000 : Math.round((l.unitNetMinor ?? 1000) * 1.3)
      await QuoteLine.create({
        quoteId: quote.id, position: position++, kind, partId: l.partId ?? null, sku: l.sku ?? null,
        description: kind === 'labour' ? 'Fit and bleed' : `Part ${l.sku}`, quantity,
        ...(kind === 'labour' ? { hoursHundredths: 100, rateMinor: 6000 } : { unitNetMinor: l.unitNetMinor ?? null, markupBp: 3000 }),
        unitPriceMinor: unit, amountMinor: unit * quantity, taxBp: 2000, ownerDecision: l.decision,
      }, { transaction: t })
    }
    return { id: quote.id }
  })
}

export async function stockOf(partId: number, code = 'NGT'): Promise<number> {
  models()
  const b = await Branch.findOne({ where: { code } })
  const row = await StockLevel.findOne({ where: { partId, branchId: b!.id } })
  return row?.quantity ?? 0
}

export async function branchId(code: string): Promise<number> {
  models()
  return (await Branch.findOne({ where: { code } }))!.id
}

export async function ledgerOf(organisationId: number): Promise<{ kind: string; amountMinor: number; externalId: string | null }[]> {
  models()
  const rows = await LedgerEntry.findAll({ where: { organisationId }, order: [['id', 'ASC']] })
  return rows.map((r) => ({ kind: r.kind, amountMinor: r.amountMinor, externalId: r.externalId ?? null }))
}

export async function orderRow(id: number): Promise<Order | null> {
  models()
  return Order.findByPk(id)
}

/** Moves an order's creation time back (as if it had been placed earlier), for the sweep. */
export async function backdateOrder(id: number, ms: number): Promise<void> {
  models()
  await withWrite((t) => getDb().query('UPDATE orders SET created_at = :at WHERE id = :id', { replacements: { at: new Date(Date.now() - ms), id }, transaction: t }))
}

export async function coreReturnsOf(orderId: number): Promise<CoreReturn[]> {
  models()
  return CoreReturn.findAll({ where: { orderId }, order: [['id', 'ASC']] })
}

/** The order's stored fields that must not move when an event is refused or repeated. */
export async function snapshot(orderId: number, organisationId: number) {
  const o = await orderRow(orderId)
  return {
    order: o ? { status: o.status, paymentState: o.paymentState, paidAt: o.paidAt?.toISOString() ?? null, declineReason: o.declineReason ?? null, stockHeld: o.stockHeld } : null,
    ledger: await ledgerOf(organisationId),
  }
}

// ---- the payment fake and the webhook ------------------------------------------------------------

export async function fake(method: 'GET' | 'POST', path: string, body?: unknown): Promise<{ status: number; json: any }> {
  const res = await fetch(`${env().paymentsUrl}${path}`, {
    method,
    headers: body === undefined ? {} : { 'content-type': 'application/json' },
    body: body === undefined ? undefined : JSON.stringify(body),
  })
  return { status: res.status, json: await res.json() }
}

/** Pays a checkout session through the fake's control route (as the hosted page would), waiting for the webhook. */
export async function payOnFake(sessionId: string, card = '4242 4242 4242 4242') {
  return fake('POST', `/_fake/sessions/${sessionId}/complete`, { card })
}

export const sessionIdOf = (url: string) => decodeURIComponent(new URL(url).pathname.split('/').pop()!)

/** Events the fake sent, newest last, optionally of one type. */
export async function fakeEvents(type?: string): Promise<{ event: any; deliveries: any[] }[]> {
  const r = await fake('GET', `/_fake/events${type ? `?type=${encodeURIComponent(type)}` : ''}`)
  return r.json.data
}

/** The events about one checkout session / payment intent. */
export async function eventsFor(objectId: string, type?: string) {
  return (await fakeEvents(type)).filter((e) => e.event.data?.object?.id === objectId)
}

const signer = new Stripe('sk_test_unused', { telemetry: false })

/** POSTs an event to the app's webhook signed like the payment service would (or not: `signature`). */
export async function postEvent(evt: Record<string, unknown>, options: { signature?: 'valid' | 'invalid' | 'stale' | 'none' } = {}): Promise<{ status: number; body: any }> {
  const payload = JSON.stringify(evt)
  const headers: Record<string, string> = { 'content-type': 'application/json' }
  const kind = options.signature ?? 'valid'
  if (kind !== 'none') {
    const timestamp = Math.floor(Date.now() / 1000) - (kind === 'stale' ? 3600 : 0)
    headers['stripe-signature'] = signer.webhooks.generateTestHeaderString({
      payload, secret: kind === 'invalid' ? 'whsec_someone_else' : WEBHOOK_SECRET, timestamp,
    })
  }
  const res = await fetch(`${env().baseUrl}/api/webhooks/stripe`, { method: 'POST', headers, body: payload })
  const text = await res.text()
  let body: any = text
  try { body = JSON.parse(text) } catch { /* not JSON */ }
  return { status: res.status, body }
}

/** A made-up event envelope around an object, with a fresh id. */
export function eventOf(type: string, object: Record<string, unknown>): Record<string, unknown> {
  return { id: `evt_e2e_${uid()}${uid()}`, object: 'event', type, created: Math.floor(Date.now() / 1000), livemode: false, api_version: null, data: { object } }
}

export async function waitFor<T>(fn: () => Promise<T | undefined | null | false>, what: string, ms = 10_000): Promise<T> {
  const until = Date.now() + ms
  for (;;) {
    const v = await fn()
    if (v) return v
    if (Date.now() > until) throw new Error(`timed out waiting for ${what}`)
    await new Promise((r) => setTimeout(r, 100))
  }
}

/** A ledger entry dated in the past (statement periods): written, then re-dated in the form Sequelize stores. */
export async function addLedgerEntry(organisationId: number, e: { kind: 'order' | 'account_payment' | 'credit'; amountMinor: number; reference: string; at: string }): Promise<number> {
  models()
  const row = await withWrite((t) => LedgerEntry.create({ organisationId, orderId: null, kind: e.kind, amountMinor: e.amountMinor, reference: e.reference, description: `test entry ${e.reference}` }, { transaction: t }))
  const at = new Date(e.at)
  await withWrite((t) => getDb().query('UPDATE ledger_entries SET created_at = $1 WHERE id = $2', { bind: [`${at.toISOString().replace('T', ' ').replace('Z', '')} +00:00`, row.id], transaction: t }))
  return row.id
}

// ---- the counter's day: moved clocks, lines, documents ---------------------------------------------

/**
 * The header that moves the server's clock for one request (honoured only with BORELINE_TEST_HOOKS=1, which the
 * e2e setup sets): delivery promises, picking and return periods then read this instant as "now".
 */
export const at = (iso: string) => ({ 'x-boreline-test-now': iso })

/** POST/PATCH as at a moved instant. */
export function sendAt<T = any>(c: Client, method: 'POST' | 'PATCH' | 'GET', path: string, iso: string, json?: unknown) {
  return c.request<T>(path, { method, headers: at(iso), ...(json === undefined ? {} : { json }) })
}

/** The counter picks and dispatches an order (at a moved instant when `iso` is given); the dispatch's answer. */
export async function pickAndDispatch(counter: Client, orderId: number, iso?: string): Promise<any> {
  const move = (status: string) => (iso ? sendAt(counter, 'PATCH', `/api/counter/orders/${orderId}`, iso, { status }) : counter.patch(`/api/counter/orders/${orderId}`, { status }))
  const picking = await move('picking')
  expect(picking.status, picking.text).toBe(200)
  const r = await move('dispatched')
  expect(r.status, r.text).toBe(200)
  return r.body
}

/** Counter staff signed in, and a garage of the test's own on account terms with room to order, its manager signed in. */
export async function counterAndAccountGarage(label: string): Promise<{ counter: Client; garage: TestGarage; c: Client }> {
  const counter = await as(people.counter)
  const garage = await makeGarage({ terms: 'account', creditLimitMinor: 50_000_000, label })
  return { counter, garage, c: await as(garage.email) }
}

export async function linesOf(orderId: number): Promise<OrderLine[]> {
  models()
  return OrderLine.findAll({ where: { orderId }, order: [['id', 'ASC']] })
}

/** Every number issued in a series, in order. */
export async function seriesNumbers(series: 'INV' | 'CRN'): Promise<number[]> {
  models()
  const rows = await getDb().query('SELECT number FROM documents WHERE series = :series ORDER BY number', { replacements: { series }, type: QueryTypes.SELECT }) as { number: number }[]
  return rows.map((r) => Number(r.number))
}

/** Tries to change an issued document behind the app's back; resolves with the database's refusal. */
export async function tamperWithDocument(id: number): Promise<string> {
  models()
  try {
    await withWrite((t) => getDb().query('UPDATE documents SET total_minor = 0, net_minor = 0, tax_minor = 0 WHERE id = :id', { replacements: { id }, transaction: t }))
    return 'changed'
  } catch (err) {
    // Sequelize names a constraint refusal "Validation error"; the database's own words are on the original
    const e = err as Error & { original?: Error; parent?: Error }
    return (e.original ?? e.parent ?? e).message
  }
}
