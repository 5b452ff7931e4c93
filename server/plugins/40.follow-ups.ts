/**
 * The reminder job in the server: every BORELINE_REMINDER_SECONDS (default 3600; 0 turns it off) follow-ups of
 * declined work are scheduled and the due ones e-mailed (server/services/follow-ups/send.ts). Two runs never
 * overlap (server/utils/interval-job.ts: on PostgreSQL, once across the processes); `npm run reminders:run` may run
 * beside it, and the two never send the same reminder twice (each is claimed by a guarded UPDATE).
 */
import { serverFormats } from '../utils/format'
import { everyFewSeconds } from '../utils/interval-job'
import { appLink, sendMail } from '../utils/mail'
import { runReminders } from '../services/follow-ups/send'

export default defineNitroPlugin((nitro) => {
  everyFewSeconds(nitro, {
    setting: 'BORELINE_REMINDER_SECONDS', defaultSeconds: 3600, name: 'reminders',
    run: () => runReminders(new Date(), { formats: serverFormats(), appLink, sendMail }),
    report: (r) => { if (r.sent || r.held || r.failed) console.info('[boreline] reminders:', JSON.stringify(r)) },
  })
})
