/**
 * GET /api/documents/:id -> DocumentDetail (parties, lines, tax per rate, notes), and
 * GET /api/documents/:id.pdf -> the document as issued, as a PDF download (invoice-INV-000001.pdf).
 * A garage its own (a suspended garage still may); distributor staff any. 401; 403 without `documents.view`; 404 not found or another garage's.
 */
import { DocumentFileParamsSchema } from '#shared/schemas/documents'
import { documentDetail, findVisibleDocument } from '../../services/documents/views'
import { documentPdf } from '../../services/documents/pdf'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'documents.view', { allowSuspended: true })
  const { id, pdf } = paramsWith(event, DocumentFileParamsSchema)
  const detail = documentDetail(await findVisibleDocument(id, org.kind === 'distributor' ? null : org.id))
  if (!pdf) return detail
  const bytes = await documentPdf(detail, serverFormats(), await pdfFonts())
  return sendDownload(event, bytes, { name: `${detail.kind === 'invoice' ? 'invoice' : 'credit-note'}-${detail.reference}.pdf`, type: 'application/pdf' })
})
