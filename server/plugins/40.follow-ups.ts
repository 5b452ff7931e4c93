/**
 * The reminder job in the server: every BORELINE_REMINDER_SECONDS (default 3600; 0 turns it off) follow-ups of
 * declined work are scheduled and the due ones e-mailed (server/services/follow-ups/send.ts). `npm run
 * reminders:run` runs the same once; the two never send the same reminder twice.
 */
import { databaseReady } from '../utils/ready'
import { serverFormats } from '../utils/format'
import { appLink, sendMail } from '../utils/mail'
import { runReminders } from '../services/follow-ups/send'

export default defineNitroPlugin((nitro) => {
  const seconds = Number(process.env.BORELINE_REMINDER_SECONDS ?? 3600)
  if (!Number.isFinite(seconds) || seconds <= 0) return
  let running = false
  const timer = setInterval(() => {
    if (running) return
    running = true
    databaseReady()
      .then(() => runReminders(new Date(), { formats: serverFormats(), appLink, sendMail }))
      .then((r) => { if (r.sent || r.held || r.failed) console.info('[boreline] reminders:', JSON.stringify(r)) })
      .catch((err) => console.error('[boreline] reminders failed:', err?.message ?? err))
      .finally(() => { running = false })
  }, seconds * 1000)
  timer.unref()
  nitro.hooks.hook('close', () => clearInterval(timer))
})
