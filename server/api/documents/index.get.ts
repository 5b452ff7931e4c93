/**
 * GET /api/documents?kind=invoice|credit_note&orderId=&page=&pageSize= -> Page<DocumentSummary>: invoices and credit
 * notes, newest first; a garage's own, every garage's for distributor staff (with the garage). 401; 403 without
 * `documents.view` (a suspended garage still has it); 422 bad query.
 */
import { DocumentListQuerySchema } from '#shared/schemas/documents'
import { listDocuments } from '../../services/documents/list'

export default defineEventHandler(async (event) => {
  const { org } = requireAbility(event, 'documents.view', { allowSuspended: true })
  return listDocuments(org.kind === 'distributor' ? null : org.id, queryWith(event, DocumentListQuerySchema))
})
