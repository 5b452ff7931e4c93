/**
 * Invoices and credit notes as issued documents: numbered without gaps per series (INV-000001, CRN-000001),
 * never changed once issued (a correction is a new credit note), printed from what was stored when they were
 * issued. Shared by the document routes and pages.
 */

export const DOCUMENT_KINDS = ['invoice', 'credit_note'] as const
export type DocumentKind = (typeof DOCUMENT_KINDS)[number]

export const DOCUMENT_KIND_LABELS: Record<DocumentKind, string> = { invoice: 'Invoice', credit_note: 'Credit note' }

/** Why a credit note was issued. */
export const CREDIT_REASONS = ['cancellation', 'return', 'warranty', 'core'] as const
export type CreditReason = (typeof CREDIT_REASONS)[number]

export const CREDIT_REASON_LABELS: Record<CreditReason, string> = {
  cancellation: 'Cancelled after invoicing',
  return: 'Parts returned',
  warranty: 'Warranty claim settled',
  core: 'Old unit accepted: deposit returned',
}

export type DocumentLineKind = 'part' | 'core_deposit' | 'restocking'

export interface DocumentParty {
  name: string
  address: string
  taxNumber: string
}

export interface DocumentLineView {
  kind: DocumentLineKind
  sku: string
  description: string
  quantity: number
  unitMinor: number
  netMinor: number
  taxBp: number
  taxMinor: number
}

export interface TaxAnalysisRow { taxBp: number; netMinor: number; taxMinor: number }

export interface DocumentSummary {
  id: number
  kind: DocumentKind
  kindLabel: string
  /** INV-000123, CRN-000045 */
  reference: string
  issuedAt: string
  /** the tax point, a calendar day (YYYY-MM-DD) in the installation's time zone */
  taxPoint: string
  orderId: number
  orderReference: string
  /** a credit note's invoice */
  invoice: { id: number; reference: string } | null
  reason: CreditReason | null
  netMinor: number
  taxMinor: number
  totalMinor: number
  currency: string
  /** distributor views only */
  garage?: { id: number; name: string }
}

export interface DocumentDetail extends DocumentSummary {
  seller: DocumentParty
  buyer: DocumentParty
  lines: DocumentLineView[]
  taxAnalysis: TaxAnalysisRow[]
  /** payment terms and what happens to the money, as printed */
  notes: string[]
  garageReference: string
  /** the branch the parts went from */
  branch: string
}
