/**
 * The quote's PDF as the owner receives it (download, e-mail attachment): the owner's view with the garage's
 * name, address, contact, tax number and logo. What comes from the server around it (formats, fonts, the
 * uploads folder, the mailer) arrives in `QuoteOutput`, so the quote services stay plain Node.
 */
import { Organisation } from '../../models/accounts'
import type { Quote } from '../../models/quotes'
import type { Formats } from '../../../shared/utils/format'
import type { OutgoingMail } from '../../utils/mail'
import { readLogo } from '../garage-logo'
import type { PdfFonts } from '../pdf/document'
import { ownerView } from './owner-view'
import { renderQuotePdf, type PdfGarage, type PdfLogo } from './pdf'
import { settingsOf } from './settings'

/** What the quote's documents and e-mails need from the server around them. */
export interface QuoteOutput {
  /** money and dates as people read them (serverFormats()) */
  formats: Formats
  /** the PDF typeface (pdfFonts()), read once when first needed */
  fonts: () => Promise<PdfFonts>
  /** the uploads folder, where the garage's logo is stored */
  uploadsDir: string
  /** sends one e-mail after the commit; false when it could not be sent (never throws) */
  sendMail: (mail: OutgoingMail) => Promise<boolean>
  /** an absolute link into the app, for e-mails */
  appLink: (path: string) => string
}

function pdfGarage(org: Organisation | null): PdfGarage {
  return { name: org?.name ?? '', address: org?.tradingAddress ?? '', phone: org?.phone ?? '', email: org?.email ?? '', taxNumber: org?.taxNumber ?? '' }
}

/** The garage's particulars and logo for its documents to owners. */
export async function garageLetterhead(organisationId: number, uploadsDir: string): Promise<{ garage: PdfGarage; logo: PdfLogo | null }> {
  const [org, settings] = await Promise.all([Organisation.findByPk(organisationId), settingsOf(organisationId)])
  const logoData = settings.logoFile ? await readLogo(uploadsDir, settings.logoFile) : null
  return { garage: pdfGarage(org), logo: logoData && settings.logoMime ? { data: logoData, mime: settings.logoMime } : null }
}

/** The quote as the owner sees it, rendered to PDF. */
export async function quotePdf(q: Quote, out: QuoteOutput): Promise<Buffer> {
  const [view, head, fonts] = await Promise.all([
    ownerView(q, out.formats.currency),
    garageLetterhead(q.organisationId, out.uploadsDir),
    out.fonts(),
  ])
  return renderQuotePdf(view, head.garage, fonts, head.logo, out.formats)
}
