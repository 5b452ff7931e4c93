/**
 * Bad applications: each gets a clear message naming the field (422 / 413 / 415) and nothing is stored —
 * no organisation, no user, no document row, no file in the uploads folder (temporary files included),
 * no e-mail.
 */
import { describe, expect, it } from 'vitest'
import { setup } from '@nuxt/test-utils/e2e'
import { Client, env, mailFor } from '../support/api'
import {
  applicationFields, applicationForm, dbRows, dbValue, filesUnder, garageIdOf, jpegBytes, pdfBytes, pngBytes, postApplication, sqlText, type UploadFile,
} from '../support/accounts'

await setup({ host: env().baseUrl })

/**
 * What "nothing stored" means here, robust against other tests applying at the same time (the browser
 * project shares the server): every stored file has its document row and every row its file (no orphans),
 * no temporary upload is left, and no organisation or user carries this application's name or e-mail.
 */
async function nothingLeft(): Promise<void> {
  const until = Date.now() + 2000
  for (;;) {
    const files = filesUnder(env().uploadsDir)
    const incoming = files.filter((f) => f.startsWith('.incoming'))
    const stored = files.filter((f) => f.startsWith('proofs/')).map((f) => f.slice('proofs/'.length))
    const rows = dbRows<{ stored_name: string }>('SELECT stored_name FROM proof_documents').map((r) => r.stored_name)
    const orphans = stored.filter((f) => !rows.includes(f))
    if ((incoming.length === 0 && orphans.length === 0) || Date.now() > until) {
      expect(incoming, 'temporary uploads left').toEqual([])
      expect(orphans, 'stored files without a document row').toEqual([])
      expect(rows.filter((r) => !stored.includes(r)), 'document rows without their file').toEqual([])
      return
    }
    await new Promise((r) => setTimeout(r, 100)) // formidable unlinks a half-written file a tick later
  }
}

/** Sends the form and checks status, the field named and that nothing at all was kept. */
async function refused(form: FormData | { body: BodyInit; contentType: string }, status: number, field: string, email?: string) {
  const c = new Client()
  const res = form instanceof FormData
    ? await postApplication(c, form)
    : await c.request('/api/trade-applications', { method: 'POST', body: form.body, headers: { 'content-type': form.contentType } })
  expect(res.status).toBe(status)
  expect(res.body.data.fields, JSON.stringify(res.body)).toHaveProperty(field)
  expect(String(res.body.data.fields[field]).length).toBeGreaterThan(5)
  await nothingLeft()
  const name = form instanceof FormData ? form.get('businessName') : null
  if (typeof name === 'string' && name) expect(dbValue(`SELECT COUNT(*) FROM organisations WHERE name = ${sqlText(name)}`)).toBe(0)
  if (email) {
    expect(dbValue(`SELECT COUNT(*) FROM users WHERE email = ${sqlText(email)}`)).toBe(0)
    expect(await mailFor(email)).toEqual([])
  }
  return res
}

describe('bad applications are refused and leave nothing behind', () => {
  it('missing fields: 422 naming each of them', async () => {
    const email = applicationFields().email
    const res = await refused(applicationForm({ email }), 422, 'businessName', email)
    expect(Object.keys(res.body.data.fields).sort()).toEqual(['businessName', 'contactName', 'password', 'phone', 'taxNumber', 'tradingAddress'])
  })

  it('a missing document is named with the other missing fields', async () => {
    const f = applicationFields()
    const res = await refused(applicationForm({ ...f, businessName: '' }, []), 422, 'proof', f.email)
    expect(res.body.data.fields).toHaveProperty('businessName')
  })

  it('no document at all: 422 on proof', async () => {
    const f = applicationFields()
    await refused(applicationForm(f, []), 422, 'proof', f.email)
  })

  it('a password under 10 characters: 422 on password', async () => {
    const f = applicationFields({ password: 'short-9ch' })
    expect(f.password).toHaveLength(9)
    const res = await refused(applicationForm(f), 422, 'password', f.email)
    expect(res.body.data.fields.password).toMatch(/10 characters/)
  })

  it('a malformed e-mail and phone: 422 on each', async () => {
    const res = await refused(applicationForm(applicationFields({ email: 'not-an-address', phone: 'call me' })), 422, 'email')
    expect(res.body.data.fields).toHaveProperty('phone')
  })

  it('a document over 10 MB: 413 on proof', async () => {
    const big = Buffer.concat([pdfBytes(), Buffer.alloc(10 * 1024 * 1024 + 1 - pdfBytes().length, 0x20)])
    expect(big.length).toBe(10 * 1024 * 1024 + 1)
    const f = applicationFields()
    const res = await refused(applicationForm(f, [{ name: 'scan.pdf', bytes: big, type: 'application/pdf' }]), 413, 'proof', f.email)
    expect(res.body.data.fields.proof).toMatch(/10 MB/)
  })

  it('a document of exactly 10 MB is accepted (the limit is inclusive)', async () => {
    const exact = Buffer.concat([pdfBytes(), Buffer.alloc(10 * 1024 * 1024 - pdfBytes().length, 0x20)])
    const res = await postApplication(new Client(), applicationForm(applicationFields(), [{ name: 'scan.pdf', bytes: exact, type: 'application/pdf' }]))
    expect(res.status).toBe(201)
  })

  it('an empty document: 415 on proof', async () => {
    const f = applicationFields()
    const res = await refused(applicationForm(f, [{ name: 'empty.pdf', bytes: Buffer.alloc(0), type: 'application/pdf' }]), 415, 'proof', f.email)
    expect(res.body.data.fields.proof).toMatch(/empty/)
  })

  const notWhatItSays: [string, UploadFile][] = [
    ['plain text named .pdf', { name: 'certificate.pdf', bytes: Buffer.from('This is not a PDF at all, just text.\n'), type: 'application/pdf' }],
    ['an HTML page named .png', { name: 'logo.png', bytes: Buffer.from('<!doctype html><script>alert(1)</script>'), type: 'image/png' }],
    ['a Windows program named .pdf', { name: 'invoice.pdf', bytes: Buffer.concat([Buffer.from('MZ'), Buffer.alloc(200, 0x90)]), type: 'application/pdf' }],
    ['a PNG named .pdf', { name: 'registration.pdf', bytes: pngBytes(), type: 'application/pdf' }],
    ['a PDF named .jpg', { name: 'photo.jpg', bytes: pdfBytes(), type: 'image/jpeg' }],
    ['a ZIP archive named .zip', { name: 'docs.zip', bytes: Buffer.from('504b0304140000000000', 'hex'), type: 'application/zip' }],
    ['a PDF without an extension', { name: 'registration', bytes: pdfBytes(), type: 'application/pdf' }],
  ]
  for (const [what, file] of notWhatItSays) {
    it(`${what}: 415 on proof`, async () => {
      const f = applicationFields()
      await refused(applicationForm(f, [file]), 415, 'proof', f.email)
    })
  }

  it('two documents: refused on proof, neither kept', async () => {
    const f = applicationFields()
    await refused(applicationForm(f, [
      { name: 'a.pdf', bytes: pdfBytes(), type: 'application/pdf' },
      { name: 'b.png', bytes: pngBytes(), type: 'image/png' },
    ]), 422, 'proof', f.email)
  })

  it('a raw octet-stream or JSON body (not a form): 415, the size limit cannot be bypassed', async () => {
    const big = Buffer.concat([pdfBytes(), Buffer.alloc(11 * 1024 * 1024, 0x20)])
    await refused({ body: new Uint8Array(big), contentType: 'application/octet-stream' }, 415, '_')
    await refused({ body: JSON.stringify(applicationFields()), contentType: 'application/json' }, 415, '_')
  })

  it('accepts JPEG and PNG documents whose names match', async () => {
    for (const file of [{ name: 'yard.JPEG', bytes: jpegBytes(), type: 'image/jpeg' }, { name: 'cert.png', bytes: pngBytes(), type: 'image/png' }]) {
      const f = applicationFields()
      const res = await postApplication(new Client(), applicationForm(f, [file]))
      expect(res.status, res.text).toBe(201)
      expect(dbValue(`SELECT mime FROM proof_documents WHERE organisation_id = ${garageIdOf(f.email)}`)).toBe(file.type)
    }
  })
})
