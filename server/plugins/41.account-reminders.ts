/**
 * The account reminder job in the server: every BORELINE_ACCOUNT_REMINDER_SECONDS (default 3600; 0 turns it off)
 * monthly statements and overdue reminders are e-mailed to garages on account terms
 * (server/services/account-reminders/run.ts). `npm run accounts:remind` may run beside it; each e-mail is claimed
 * under a unique key first, so the two never send one twice.
 */
import { everyFewSeconds } from '../utils/interval-job'
import { serverFormats } from '../utils/format'
import { appLink, sendMail } from '../utils/mail'
import { pdfFonts } from '../utils/pdf-fonts'
import { runAccountReminders } from '../services/account-reminders/run'

export default defineNitroPlugin((nitro) => {
  everyFewSeconds(nitro, {
    setting: 'BORELINE_ACCOUNT_REMINDER_SECONDS', defaultSeconds: 3600, name: 'account reminders',
    run: () => runAccountReminders(new Date(), { formats: serverFormats(), appLink, sendMail, fonts: pdfFonts }),
    report: (r) => { if (r.statements || r.overdue || r.failed) console.info('[boreline] account reminders:', JSON.stringify(r)) },
  })
})
