import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import nodemailer from 'nodemailer'
import { createMailCatcher } from './server'

describe('mail catcher', () => {
  const catcher = createMailCatcher({ smtpPort: 0, httpPort: 0 })
  let ports: { smtpPort: number; httpPort: number }
  beforeAll(async () => { ports = await catcher.listen() })
  afterAll(() => catcher.close())

  it('catches what nodemailer sends over SMTP and lists it as JSON', async () => {
    const t = nodemailer.createTransport({ host: '127.0.0.1', port: ports.smtpPort, secure: false, ignoreTLS: true })
    await t.sendMail({ from: 'a@boreline.test', to: 'Garage <Manager@Garage.test>', subject: 'Quote 42', text: 'Hello', html: '<p>Hello</p>',
      attachments: [{ filename: 'q.pdf', content: Buffer.from('%PDF-1.4') }] })
    const res = await fetch(`http://127.0.0.1:${ports.httpPort}/messages`)
    const list = await res.json()
    expect(list).toHaveLength(1)
    expect(list[0]).toMatchObject({ to: ['manager@garage.test'], subject: 'Quote 42', html: '<p>Hello</p>' })
    expect(list[0].text.trim()).toBe('Hello')
    expect(list[0].attachments[0]).toMatchObject({ filename: 'q.pdf', size: 8 })
    expect(typeof list[0].date).toBe('string')
  })

  it('filters by recipient, shows a page and can be emptied', async () => {
    const base = `http://127.0.0.1:${ports.httpPort}`
    expect(await (await fetch(`${base}/messages?to=nobody@x.test`)).json()).toEqual([])
    const page = await (await fetch(`${base}/`)).text()
    expect(page).toContain('Quote 42')
    expect((await fetch(`${base}/messages`, { method: 'DELETE' })).status).toBe(204)
    expect(await (await fetch(`${base}/messages`)).json()).toEqual([])
  })
})
