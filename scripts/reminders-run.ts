/**
 * npm run reminders:run [-- --now 2026-09-01T09:00:00Z]: runs the reminder job once against DATABASE_URL, as the
 * server's timer does: schedules follow-ups for work owners declined, then e-mails the owners who agreed to
 * reminders (NUXT_SMTP_HOST / NUXT_SMTP_PORT / NUXT_MAIL_FROM; links from NUXT_PUBLIC_ORIGIN). `--now` runs it as
 * if at another time (a moved clock, for trying it out).
 */
import { closeDb } from '../server/utils/db'
import { runReminders } from '../server/services/follow-ups/send'
import { jobRun } from './lib/job-run'

const job = await jobRun()
const run = await runReminders(job.now, { formats: job.formats, appLink: job.appLink, sendMail: job.sendMail })
console.log(`reminders at ${job.now.toISOString()}: ${run.scheduled} scheduled, ${run.sent} sent, ${run.held} held (no consent or nothing to offer), ${run.failed} not sent`)
job.close()
await closeDb()
