/**
 * The server holds under abuse (OWASP ASVS 5.0 V2.4 anti-automation, V13 resource limits; WSTG-BUSL-05/07): nobody
 * can make it hash passwords without end, read bodies without end, walk a spreadsheet cell by cell into column XFD, or
 * answer 500 to a malformed link. Memory is the server's resident memory (/proc), health the time /api/health takes
 * meanwhile; the thresholds are the ones the product promises (health under 1 s, memory under +300 MB), far from what
 * the same requests cost when unbounded (2.1 GB and 6 s measured before). Requests that are refused on purpose come
 * from loopback addresses of their own (127.0.2.x), so the rest of the suite is not throttled.
 */
import { randomBytes } from 'node:crypto'
import { describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { as, Client, DEMO_PASSWORD, env, people } from '../support/api'
import { fromAddress, sendFrom } from '../support/accounts'
import { postChunked, serverRssMb, watchServer, wideXlsx } from '../support/probe'
import { getFrom } from '../support/quotes'

await setup({ host: env().baseUrl })

const madeUpToken = () => randomBytes(32).toString('base64url')
const MB = 1024 * 1024

describe('password hashing cannot be driven by anyone', () => {
  it('16 parallel resets with a made-up token: 410 each, health under 1 s, memory under +300 MB, sign-in works meanwhile', async () => {
    const before = serverRssMb()
    const watch = watchServer()
    const [resets, someoneElse] = await Promise.all([
      Promise.all(Array.from({ length: 16 }, () => fromAddress('127.0.2.180', '/api/auth/reset-password', { token: madeUpToken(), password: 'a-brand-new-password' }))),
      new Client().post('/api/auth/sign-in', { email: people.technician, password: DEMO_PASSWORD }),
    ])
    const w = await watch.stop()
    expect(resets.map((r) => r.status)).toEqual(Array(16).fill(410))
    expect(someoneElse.status).toBe(200)
    expect(w.healthChecks).toBeGreaterThan(0)
    expect(w.slowestHealthMs).toBeLessThan(1000)
    expect(w.peakRssMb - before).toBeLessThan(300)
  })

  it('an invitation is checked before its password is hashed too', async () => {
    const before = serverRssMb()
    const accepted = await Promise.all(Array.from({ length: 16 }, () => fromAddress('127.0.2.181', '/api/auth/invitations/accept', { token: madeUpToken(), password: 'a-brand-new-password' })))
    expect(accepted.map((r) => r.status)).toEqual(Array(16).fill(410))
    expect(serverRssMb() - before).toBeLessThan(300)
  })

  it('throttles the e-mailed links per address: the 61st try in 15 minutes gets 429 with Retry-After', async () => {
    const address = '127.0.2.182'
    for (let i = 0; i < 60; i++) expect((await fromAddress(address, '/api/auth/reset-password', { token: madeUpToken(), password: 'a-brand-new-password' })).status).toBe(410)
    const refused = await fromAddress(address, '/api/auth/reset-password', { token: madeUpToken(), password: 'a-brand-new-password' })
    expect(refused.status).toBe(429)
    expect(Number(refused.headers['retry-after'])).toBeGreaterThan(0)
    expect((await getFrom(address, `/api/auth/reset-password/${madeUpToken()}`)).status).toBe(429)
    // another address is unaffected
    expect((await fromAddress('127.0.2.183', '/api/auth/reset-password', { token: madeUpToken(), password: 'a-brand-new-password' })).status).toBe(410)
  })

  it('bounds hashing itself: 24 parallel sign-ins from 24 addresses keep memory bounded and health answering', async () => {
    const before = serverRssMb()
    const watch = watchServer()
    const results = await Promise.all(Array.from({ length: 24 }, (_, i) =>
      fromAddress(`127.0.2.${100 + i}`, '/api/auth/sign-in', { email: `nobody-${i}-${randomBytes(3).toString('hex')}@hashing.test`, password: 'some-long-guess-here' })))
    const w = await watch.stop()
    // each is checked in its turn (401), or, when the queue has waited its limit, told to come back (503 Retry-After)
    expect(results.filter((r) => r.status === 401).length).toBeGreaterThanOrEqual(2)
    for (const r of results.filter((x) => x.status !== 401)) {
      expect(r.status).toBe(503)
      expect(Number(r.headers['retry-after'])).toBeGreaterThan(0)
    }
    expect(w.slowestHealthMs).toBeLessThan(1000)
    // two hashes at a time at 128 MiB each (scrypt N = 2^17, r = 8: 128 x N x r bytes), against 24 x 128 MiB unbounded
    expect(w.peakRssMb - before).toBeLessThan(2 * 128 + 150)
  })
})

describe('request bodies have a limit and a type', () => {
  it('refuses a 20 MB JSON body with 413 quickly, from its declared length, before reading it', async () => {
    const r = await postChunked('/api/auth/sign-in', 20 * MB, 'application/json', undefined, true)
    expect(r.status).toBe(413)
    expect(r.body.message).toMatch(/larger than 1 MB/)
    expect(r.sentBytes).toBeLessThan(20 * MB)
    expect(r.ms).toBeLessThan(3000)
  })

  it('refuses a chunked body with no length once it passes the limit, long before its end', async () => {
    const before = serverRssMb()
    const r = await postChunked('/api/auth/sign-in', 150 * MB)
    expect(r.status).toBe(413)
    expect(r.sentBytes).toBeLessThan(150 * MB)
    expect(r.ms).toBeLessThan(5000)
    expect(serverRssMb() - before).toBeLessThan(100)
  })

  it('answers 415 to a JSON route sent text/plain, a form, XML or no type; JSON still works', async () => {
    const payload = JSON.stringify({ email: people.technician, password: DEMO_PASSWORD })
    for (const type of ['text/plain', 'application/x-www-form-urlencoded', 'application/xml', 'multipart/form-data; boundary=x', '']) {
      const r = await sendFrom('127.0.0.1', '/api/auth/sign-in', Buffer.from(payload), type ? { 'content-type': type } : {})
      expect(r.status, type).toBe(415)
      expect(r.body.message).toMatch(/as JSON/)
    }
    expect((await sendFrom('127.0.0.1', '/api/auth/sign-in', Buffer.from(payload), { 'content-type': 'application/json; charset=utf-8' })).status).toBe(200)
  })

  it('limits PATCH bodies too, and leaves the payment webhook (raw JSON, verified) to its signature check', async () => {
    const manager = await as(people.manager)
    const big = await manager.request('/api/account/profile', { method: 'PATCH', body: `{"name":"${'x'.repeat(2 * MB)}"}`, headers: { 'content-type': 'application/json' } })
    expect(big.status).toBe(413)
    const hook = await sendFrom('127.0.0.1', '/api/webhooks/stripe', Buffer.from('{"id":"evt_x","type":"ping"}'), { 'content-type': 'application/json', 'stripe-signature': 't=1,v1=00' })
    expect(hook.status).toBe(400)
  })
})

describe('a wide spreadsheet cannot freeze the server', () => {
  it('refuses an XLSX with cells in column XFD on 20,000 rows while health stays under 1 s', async () => {
    // 20,000 rows with a cell in column XFD each, written by hand: exceljs itself takes over a minute to write it
    const file = wideXlsx(20_000)
    const counter = await as(people.counter)
    const watch = watchServer()
    const fd = new FormData()
    fd.append('file', new Blob([new Uint8Array(file)]), 'wide.xlsx')
    const r = await counter.request('/api/price-files', { method: 'POST', body: fd })
    expect(r.status, r.text).toBe(202)
    let detail: { status: string; errorMessage: string | null }
    const until = Date.now() + 90_000
    do {
      await new Promise((res) => setTimeout(res, 200))
      detail = (await counter.get(`/api/price-files/${r.body.id}`)).body
    } while (detail.status === 'parsing' && Date.now() < until)
    const w = await watch.stop()
    expect(detail.status).toBe('failed')
    expect(detail.errorMessage).toMatch(/column XFD/)
    expect(w.slowestHealthMs).toBeLessThan(1000)
  }, 120_000)

  it('refuses, by its bytes, text named .docx and text named .csv that is no CSV', async () => {
    const counter = await as(people.counter)
    for (const [name, text, why] of [
      ['catalogue.docx', 'sku,list_price\nKM-1,12.00\n', /named \.docx but holds plain text/],
      ['prices.csv', 'Dear customer: please find our new prices enclosed and call us with any questions.\n', /no columns/],
      ['prices.csv', '<!doctype html><html><body>prices</body></html>\n', /HTML, XML or JSON/],
    ] as const) {
      const fd = new FormData()
      fd.append('file', new Blob([text]), name)
      const r = await counter.request('/api/price-files', { method: 'POST', body: fd })
      expect(r.status, name).toBe(422)
      expect(r.body.data.fields.file).toMatch(why)
    }
  })
})

describe('a malformed owner link', () => {
  it('is a 404 (not a 500) and counts against the link throttle of its address', async () => {
    const address = '127.0.2.231'
    for (let i = 0; i < 10; i++) expect((await getFrom(address, '/q/%E0%A4%A')).status).toBe(404)
    // ten links that were not valid: this address is refused for a while, whatever it asks next
    expect((await getFrom(address, `/q/${madeUpToken()}`)).status).toBe(429)
    expect((await getFrom('127.0.2.232', '/q/%E0%A4%A')).status).toBe(404)
  })
})
