/** Inputs of the document routes. */
import { z } from 'zod'
import { DOCUMENT_KINDS } from '../types/documents'
import { PageQuerySchema } from './page'

/** GET /api/documents?kind=invoice|credit_note&orderId=&page=&pageSize= */
export const DocumentListQuerySchema = PageQuerySchema.extend({
  kind: z.enum(DOCUMENT_KINDS, { error: 'kind must be invoice or credit_note.' }).optional(),
  orderId: z.coerce.number().int().positive().optional(),
})
export type DocumentListQuery = z.infer<typeof DocumentListQuerySchema>

/** GET /api/documents/:id and /api/documents/:id.pdf: the last segment is the id, with or without ".pdf". */
export const DocumentFileParamsSchema = z.object({
  file: z.string().regex(/^\d{1,12}(\.pdf)?$/, 'Not a document.'),
}).transform((v) => ({ id: Number(v.file.replace(/\.pdf$/, '')), pdf: v.file.endsWith('.pdf') }))
