/**
 * Inputs of the price-file routes, used by the routes and by the forms that send them.
 */
import { z } from 'zod'
import { MAPPING_FIELDS } from '../types/price-files'
import { PageQuerySchema } from './page'

/** How the person says the file separates columns; `auto` = detect from the header row. */
export const DELIMITER_CHOICES = { auto: null, comma: ',', semicolon: ';', tab: '\t' } as const
export type DelimiterChoice = keyof typeof DELIMITER_CHOICES

export const DelimiterSchema = z.enum(['auto', 'comma', 'semicolon', 'tab'], { message: 'Choose comma, semicolon, tab or automatic.' })
export const DecimalMarkSchema = z.enum(['point', 'comma'], { message: 'Choose decimal point or decimal comma.' })
export const SupplierNameSchema = z.string().trim().max(120, 'Keep the supplier name under 120 characters.')

const header = z.string().max(200).nullable()

export const ColumnMappingSchema = z.object({
  ...Object.fromEntries(MAPPING_FIELDS.map((f) => [f, header.optional().default(null)])) as Record<(typeof MAPPING_FIELDS)[number], z.ZodDefault<z.ZodOptional<typeof header>>>,
  stock: z.record(z.string().regex(/^[A-Za-z0-9]{1,16}$/, 'Branch codes are letters and digits.'), z.string().max(200)).optional().default({}),
})

/** The text fields that come with the file in POST /api/price-files (multipart: every value is text). */
export const UploadFieldsSchema = z.object({
  delimiter: DelimiterSchema.optional().default('auto'),
  decimalMark: DecimalMarkSchema.optional().default('point'),
  supplierName: SupplierNameSchema.optional().default(''),
  mapping: z.string().max(20_000).optional().transform((s, ctx) => {
    if (!s) return undefined
    try {
      const r = ColumnMappingSchema.safeParse(JSON.parse(s))
      if (r.success) return r.data
    } catch { /* reported below */ }
    ctx.addIssue({ code: 'custom', message: 'The column mapping is not in the expected form.' })
    return z.NEVER
  }),
})
export type UploadFields = z.infer<typeof UploadFieldsSchema>

/** PATCH /api/price-files/:id: change how the file is read, then check it again. */
export const RecheckSchema = z.object({
  mapping: ColumnMappingSchema.optional(),
  delimiter: DelimiterSchema.optional(),
  decimalMark: DecimalMarkSchema.optional(),
  supplierName: SupplierNameSchema.optional(),
  /** remember this mapping for the supplier (default: yes when a supplier is named) */
  rememberMapping: z.boolean().optional(),
})
export type RecheckInput = z.infer<typeof RecheckSchema>

export const ApplySchema = z.object({
  excludeRejected: z.boolean().optional().default(false),
  confirmLargeChanges: z.boolean().optional().default(false),
  /** ISO date-time; absent or now = apply at once, later = scheduled */
  effectiveAt: z.iso.datetime({ offset: true, message: 'Give the date and time as an ISO date-time.' }).nullable().optional(),
  missingParts: z.enum(['keep', 'discontinue'], { message: 'Choose keep or mark discontinued.' }).optional().default('keep'),
})
export type ApplyInput = z.infer<typeof ApplySchema>

export const PriceFileIdParamsSchema = z.object({
  id: z.coerce.number({ message: 'Not a price file id.' }).int('Not a price file id.').positive('Not a price file id.'),
})

export const CHANGE_SORTS = ['row', 'sku', 'change', 'old', 'new'] as const
export type ChangeSort = (typeof CHANGE_SORTS)[number]

/** GET /api/price-files/:id/changes: one page of one kind of finding, with its filters and sort. */
export const ChangesQuerySchema = PageQuerySchema.extend({
  kind: z.enum(['new', 'changed', 'unchanged', 'missing', 'rejected'], { message: 'Unknown kind of change.' }).optional().default('changed'),
  sort: z.enum(CHANGE_SORTS, { message: 'Sort by row, sku, change, old or new.' }).optional().default('row'),
  dir: z.enum(['asc', 'desc']).optional().default('asc'),
  /** part of a SKU or description */
  q: z.string().trim().max(80).optional().default(''),
  /** only changes beyond +/-30 % */
  large: z.enum(['0', '1', 'true', 'false']).optional().transform((v) => v === '1' || v === 'true'),
  /** only rises or only falls */
  direction: z.enum(['up', 'down', 'any']).optional().default('any'),
})
export type ChangesQuery = z.infer<typeof ChangesQuerySchema>
