/**
 * npm run reminders:run [-- --now 2026-09-01T09:00:00Z]: runs the reminder job once against DATABASE_URL, as the
 * server's timer does: schedules follow-ups for work owners declined, then e-mails the owners who agreed to
 * reminders (NUXT_SMTP_HOST / NUXT_SMTP_PORT / NUXT_MAIL_FROM; links from NUXT_PUBLIC_ORIGIN). `--now` runs it as
 * if at another time (a moved clock, for trying it out).
 */
import nodemailer from 'nodemailer'
import { closeDb, getDb } from '../server/utils/db'
import { migrateUp } from '../server/utils/migrate'
import { initModels } from '../server/models/index'
import { runReminders } from '../server/services/follow-ups/send'
import { formatsFor } from '../shared/utils/format'

function nowFromArgs(argv: string[]): Date {
  const i = argv.findIndex((a) => a === '--now' || a.startsWith('--now='))
  if (i < 0) return new Date()
  const raw = argv[i]!.includes('=') ? argv[i]!.slice('--now='.length) : argv[i + 1]
  const d = new Date(raw ?? '')
  if (Number.isNaN(d.getTime())) {
    console.error(`--now must be a date and time, e.g. 2026-09-01T09:00:00Z (got "${raw ?? ''}")`)
    process.exit(2)
  }
  return d
}

const env = process.env
const now = nowFromArgs(process.argv.slice(2))
const transport = nodemailer.createTransport({ host: env.NUXT_SMTP_HOST || '127.0.0.1', port: Number(env.NUXT_SMTP_PORT || 1025), secure: false, ignoreTLS: true })
const from = env.NUXT_MAIL_FROM || 'Boreline <no-reply@boreline.test>'
const origin = env.NUXT_PUBLIC_ORIGIN || 'http://localhost:3000'

await migrateUp(getDb())
initModels(getDb())
const run = await runReminders(now, {
  formats: formatsFor({ currency: env.NUXT_PUBLIC_CURRENCY || 'GBP', locale: env.NUXT_PUBLIC_LOCALE || 'en-GB', timeZone: env.NUXT_PUBLIC_TIME_ZONE || 'Europe/London' }),
  appLink: (path) => new URL(path, origin).toString(),
  sendMail: async (mail) => {
    try {
      await transport.sendMail({ from, ...mail })
      return true
    } catch (err) {
      console.error('e-mail not sent:', mail.subject, (err as Error).message)
      return false
    }
  },
})
console.log(`reminders at ${now.toISOString()}: ${run.scheduled} scheduled, ${run.sent} sent, ${run.held} held (no consent or nothing to offer), ${run.failed} not sent`)
transport.close()
await closeDb()
