/**
 * Outgoing e-mail through nodemailer (SMTP). In the demo and tests the SMTP server is the local mail catcher
 * in fakes/mail. Sending happens after the database commit; a failed send is logged, never rolls back data.
 */
import nodemailer, { type Transporter } from 'nodemailer'
import type Mail from 'nodemailer/lib/mailer'

let transport: Transporter | undefined

function getTransport(): Transporter {
  if (transport) return transport
  const config = useRuntimeConfig()
  transport = nodemailer.createTransport({
    host: String(config.smtpHost),
    port: Number(config.smtpPort),
    secure: false,
    ignoreTLS: true,
  })
  return transport
}

export interface OutgoingMail {
  to: string | string[]
  subject: string
  text: string
  html?: string
  attachments?: Mail.Attachment[]
}

export async function sendMail(mail: OutgoingMail): Promise<boolean> {
  const config = useRuntimeConfig()
  try {
    await getTransport().sendMail({ from: String(config.mailFrom), ...mail })
    return true
  } catch (err) {
    console.error('[boreline] e-mail not sent:', mail.subject, (err as Error).message)
    return false
  }
}

/** Absolute link into the app for e-mails. */
export function appLink(path: string): string {
  return new URL(path, String(useRuntimeConfig().publicOrigin)).toString()
}
