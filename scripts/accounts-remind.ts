/**
 * npm run accounts:remind [-- --now 2026-09-01T09:00:00Z]: runs the account reminder job once against DATABASE_URL,
 * as the server's timer does: last month's statement to each garage on account terms, and overdue reminders
 * (BORELINE_OVERDUE_REMINDER_DAYS, default 7,21) to their managers; each e-mail at most once, even beside the
 * server. E-mail through NUXT_SMTP_HOST / NUXT_SMTP_PORT / NUXT_MAIL_FROM; links from NUXT_PUBLIC_ORIGIN.
 */
import { closeDb } from '../server/utils/db'
import { runAccountReminders } from '../server/services/account-reminders/run'
import { jobRun } from './lib/job-run'

const job = await jobRun()
const run = await runAccountReminders(job.now, { formats: job.formats, appLink: job.appLink, sendMail: job.sendMail, fonts: job.fonts })
console.log(`account reminders at ${job.now.toISOString()}: ${run.statements} statements, ${run.overdue} overdue reminders sent, ${run.failed} not sent, ${run.noRecipient} without a recipient`)
job.close()
await closeDb()
