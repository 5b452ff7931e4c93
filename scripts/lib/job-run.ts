/**
 * What a job run once from the command line needs in place of the server's: `--now` (a moved clock), the database
 * migrated and bound, e-mail through NUXT_SMTP_HOST / NUXT_SMTP_PORT / NUXT_MAIL_FROM, formats and links from the
 * same settings the server reads, and the PDF fonts read from server/assets.
 */
import { readFile } from 'node:fs/promises'
import { resolve } from 'node:path'
import nodemailer from 'nodemailer'
import { getDb } from '../../server/utils/db'
import { migrateUp } from '../../server/utils/migrate'
import { initModels } from '../../server/models/index'
import type { OutgoingMail } from '../../server/utils/mail'
import type { PdfFonts } from '../../server/services/pdf/document'
import { formatsFor } from '../../shared/utils/format'

export function nowFromArgs(argv: string[]): Date {
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

export async function jobRun() {
  const env = process.env
  const transport = nodemailer.createTransport({ host: env.NUXT_SMTP_HOST || '127.0.0.1', port: Number(env.NUXT_SMTP_PORT || 1025), secure: false, ignoreTLS: true })
  const from = env.NUXT_MAIL_FROM || 'Boreline <no-reply@boreline.test>'
  const origin = env.NUXT_PUBLIC_ORIGIN || 'http://localhost:3000'
  await migrateUp(getDb())
  initModels(getDb())
  const fontsDir = resolve(import.meta.dirname, '../../server/assets/fonts')
  return {
    now: nowFromArgs(process.argv.slice(2)),
    formats: formatsFor({ currency: env.NUXT_PUBLIC_CURRENCY || 'GBP', locale: env.NUXT_PUBLIC_LOCALE || 'en-GB', timeZone: env.NUXT_PUBLIC_TIME_ZONE || 'Europe/London' }),
    appLink: (path: string) => new URL(path, origin).toString(),
    fonts: async (): Promise<PdfFonts> => ({
      regular: await readFile(resolve(fontsDir, 'inter-latin-400-normal.woff')), bold: await readFile(resolve(fontsDir, 'inter-latin-700-normal.woff')),
    }),
    sendMail: async (mail: OutgoingMail) => {
      try {
        await transport.sendMail({ from, ...mail })
        return true
      } catch (err) {
        console.error('e-mail not sent:', mail.subject, (err as Error).message)
        return false
      }
    },
    close: () => transport.close(),
  }
}
