/** The garage's invoice to a vehicle owner (not the distributor's documents to garages). */
export interface OwnerInvoiceLine { description: string; quantity: number; hours: number | null; netMinor: number; taxBp: number; taxMinor: number; grossMinor: number }
export interface TaxByRateRow { taxBp: number; netMinor: number; taxMinor: number }
export interface OwnerInvoicePaymentView { id: number; method: 'cash' | 'card' | 'transfer'; amountMinor: number; reference: string; at: string }

export interface OwnerInvoiceView {
  id: number
  number: number
  reference: string
  quoteId: number
  ownerName: string
  ownerEmail: string
  lines: OwnerInvoiceLine[]
  taxByRate: TaxByRateRow[]
  netMinor: number
  taxMinor: number
  grossMinor: number
  paidMinor: number
  dueMinor: number
  currency: string
  issuedAt: string
  mailed: boolean
  payments: OwnerInvoicePaymentView[]
}
