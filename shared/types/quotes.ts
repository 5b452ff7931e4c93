/** What the quote routes answer. Money in minor units, rates in basis points. */
import type { QuoteStatus } from '../utils/quote-states'
import type { QuoteLineKind, Totals } from '../utils/quote-totals'
import type { MarkupRules } from '../utils/quote-markup'

export type Recommendation = 'required' | 'advised'
export type OwnerDecision = 'approved' | 'declined'

export interface StockNote {
  branchCode: string
  branchName: string
  quantity: number
  /** fewer on the shelf at the garage's home branch than the line needs */
  short: boolean
  /** other branches with enough, when the home branch is short */
  elsewhere: { branchCode: string; branchName: string; quantity: number }[]
}

export interface QuoteLineView {
  id: number
  position: number
  kind: QuoteLineKind
  partId: number | null
  sku: string | null
  partType: string | null
  description: string
  quantity: number
  hours: number | null
  rateMinor: number | null
  /** the garage's net (trade) price captured when the line was added; null when the viewer may not see trade prices */
  unitNetMinor: number | null
  markupBp: number | null
  unitPriceMinor: number
  amountMinor: number
  taxBp: number
  taxMinor: number
  recommendation: Recommendation | null
  /** finding the line answers, from the inspection */
  reason: string | null
  coreCharge: 'charged' | 'absorbed' | null
  parentLineId: number | null
  ownerDecision: OwnerDecision | null
  toldOwnerDeclinedRequired: boolean
  stock: StockNote | null
}

export interface InspectionFinding {
  verdict: 'advise' | 'fail'
  text: string
}

export interface QuoteSummary {
  id: number
  reference: string
  number: number
  revision: number
  status: QuoteStatus
  vehicle: string
  registration: string
  ownerName: string
  grossMinor: number
  sentAt: string | null
  expiresAt: string | null
  decidedAt: string | null
  createdAt: string
  updatedAt: string
}

export interface QuoteRevisionRef {
  id: number
  revision: number
  status: QuoteStatus
  createdAt: string
}

export interface QuoteDetail extends QuoteSummary {
  vehicleId: number | null
  odometer: string
  ownerEmail: string
  ownerPhone: string
  inspectionId: number | null
  findings: InspectionFinding[]
  messageToOwner: string
  supersedesQuoteId: number | null
  supersededByQuoteId: number | null
  decisionIp: string | null
  signedName: string | null
  createdBy: string
  lines: QuoteLineView[]
  totals: Totals
  /** the lines the owner approved (after a decision) */
  approvedTotals: Totals | null
  taxByRate: { taxBp: number; netMinor: number; taxMinor: number }[]
  revisions: QuoteRevisionRef[]
  currency: string
  /** may the viewer see trade prices and markups (managers; technicians when the garage allows) */
  showsTradePrices: boolean
  warnings: string[]
}

/** A line as the owner sees it: what it is and what it costs, never its trade price, markup or stock. */
export type OwnerQuoteLine = Pick<QuoteLineView,
  'id' | 'kind' | 'description' | 'quantity' | 'hours' | 'unitPriceMinor' | 'amountMinor' | 'taxBp' | 'taxMinor' |
  'recommendation' | 'reason' | 'coreCharge' | 'parentLineId' | 'ownerDecision'> & {
  /** the owner chooses this line (parts, labour, sundries); core deposits follow their part, discounts apply */
  decidable: boolean
  /** required lines cannot be declined unless the garage recorded that the owner was told */
  declinable: boolean
  /** photos of the inspection findings this line puts right (GET /api/quote-links/:token/photos/:id) */
  photos: { id: number; where: string; caption: string }[]
}

/** The owner's view through the link: nothing of the garage beyond its name, contact and this quote. */
export interface OwnerQuoteView {
  state: 'open' | 'decided' | 'superseded'
  garage: { name: string; phone: string; email: string; hasLogo: boolean }
  reference: string
  status: QuoteStatus
  vehicle: string
  registration: string
  odometer: string
  ownerName: string
  sentAt: string | null
  expiresAt: string | null
  decidedAt: string | null
  signedName: string | null
  findings: InspectionFinding[]
  messageToOwner: string
  terms: string
  lines: OwnerQuoteLine[]
  totals: Totals
  approvedTotals: Totals | null
  currency: string
  taxLabel: string
}

export interface GarageSettingsView {
  organisationName: string
  labourRateMinor: number
  markupRules: MarkupRules
  taxRateBp: number
  quoteValidityDays: number
  quoteTerms: string
  techniciansSeePrices: boolean
  logo: { url: string; mime: string; updatedAt: string } | null
  currency: string
}
