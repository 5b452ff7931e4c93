/**
 * The reminder job in the server: every BORELINE_REMINDER_SECONDS (default 3600; 0 turns it off) follow-ups of
 * declined work are scheduled and the due ones e-mailed (server/services/follow-ups/send.ts). Each run is timed
 * from the end of the one before, so two never overlap here; `npm run reminders:run` may run beside it, and the
 * two never send the same reminder twice (each is claimed by a guarded UPDATE).
 */
import { databaseReady } from '../utils/ready'
import { serverFormats } from '../utils/format'
import { appLink, sendMail } from '../utils/mail'
import { runReminders } from '../services/follow-ups/send'

async function runOnce(): Promise<void> {
  try {
    await databaseReady()
    const r = await runReminders(new Date(), { formats: serverFormats(), appLink, sendMail })
    if (r.sent || r.held || r.failed) console.info('[boreline] reminders:', JSON.stringify(r))
  } catch (err) {
    console.error('[boreline] reminders failed:', (err as Error)?.message ?? err)
  }
}

export default defineNitroPlugin((nitro) => {
  const seconds = Number(process.env.BORELINE_REMINDER_SECONDS ?? 3600)
  if (!Number.isFinite(seconds) || seconds <= 0) return
  let timer: NodeJS.Timeout | undefined
  let stopped = false
  const next = () => {
    if (stopped) return
    timer = setTimeout(() => { void runOnce().finally(next) }, seconds * 1000)
    timer.unref()
  }
  next()
  nitro.hooks.hook('close', () => { stopped = true; clearTimeout(timer) })
})
