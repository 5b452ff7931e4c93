/** Starts the mail catcher: SMTP on MAIL_FAKE_SMTP_PORT (1025), mailbox on MAIL_FAKE_HTTP_PORT (8025). */
import { createMailCatcher } from './server'

const catcher = createMailCatcher({
  smtpPort: Number(process.env.MAIL_FAKE_SMTP_PORT ?? 1025),
  httpPort: Number(process.env.MAIL_FAKE_HTTP_PORT ?? 8025),
})
const { smtpPort, httpPort } = await catcher.listen()
console.log(`mail catcher: SMTP 127.0.0.1:${smtpPort}, mailbox http://127.0.0.1:${httpPort}/`)
