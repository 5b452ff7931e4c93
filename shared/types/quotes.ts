/** What the quote routes answer. Money in minor units, rates in basis points. */
import type { QuoteStatus } from '../utils/quote-states'
import type { QuoteLineKind, RateShare, Totals } from '../utils/quote-totals'
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
  /** the garage's reason for a part the catalogue does not fit to the vehicle (the garage's eyes only) */
  fitOverride?: string | null
  /** a labour line from the labour guide: its operation and the guide's hours for this job */
  labourOperation?: string | null
  guideHours?: number | null
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
  /** the price per unit as stated: with tax when `taxIncluded`, else before tax (negative for discounts) */
  unitPriceMinor: number
  /** the line's amount before tax (a discount's, after its split across the rates) */
  amountMinor: number
  taxBp: number
  taxMinor: number
  /** amount + tax */
  grossMinor: number
  /** the line's price was stated with tax included */
  taxIncluded: boolean
  /** per rate: one for a charge; a discount's shares across the rates of what it discounts */
  taxShares: RateShare[]
  recommendation: Recommendation | null
  /** finding the line answers, from the inspection */
  reason: string | null
  /** core deposits: absorbed by the garage (the default) or charged to the owner */
  coreCharge: 'charged' | 'absorbed' | null
  /** a core deposit charged to the owner: the refund due to them once the distributor accepted the old unit */
  coreRefund: CoreRefundNote | null
  parentLineId: number | null
  ownerDecision: OwnerDecision | null
  /** the garage recorded that it talked the owner through what declining this required line means */
  toldOwnerDeclinedRequired: boolean
  /** the owner's signed acknowledgement, when they declined this required line */
  declineAcknowledgement: DeclineAcknowledgement | null
  stock: StockNote | null
}

/** What the owner signed when declining a line marked required: kept with the quote and the vehicle's record. */
export interface DeclineAcknowledgement {
  /** the statement the owner was shown and the words they confirmed, as stored */
  statement: string
  signedName: string
  signedAt: string
  /** the internet address the decision came from */
  address: string | null
}

/** The refund of a passed-on core deposit, recorded when the distributor accepted the old unit. */
export interface CoreRefundNote {
  amountMinor: number
  recordedAt: string
}

/** One declined required line, for the vehicle's history and the follow-up reminders. */
export interface DeclinedSafetyWork {
  quoteId: number
  reference: string
  vehicleId: number | null
  registration: string
  lineId: number
  description: string
  reason: string | null
  acknowledgement: DeclineAcknowledgement
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
  /** lines marked required that the owner declined (with their signed acknowledgement) */
  declinedRequired: number
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
  taxByRate: RateShare[]
  /** the approved lines' tax per rate (after a decision) */
  approvedTaxByRate: RateShare[] | null
  revisions: QuoteRevisionRef[]
  currency: string
  /** the garage's setting: new lines are stated with tax included */
  pricesIncludeTax: boolean
  /** may the viewer see trade prices and markups (managers; technicians when the garage allows) */
  showsTradePrices: boolean
  warnings: string[]
}

/** A line as the owner sees it: what it is and what it costs, never its trade price, markup or stock. */
export type OwnerQuoteLine = Pick<QuoteLineView,
  'id' | 'kind' | 'description' | 'quantity' | 'hours' | 'unitPriceMinor' | 'amountMinor' | 'taxBp' | 'taxMinor' |
  'grossMinor' | 'taxIncluded' | 'taxShares' | 'recommendation' | 'reason' | 'coreCharge' | 'coreRefund' | 'parentLineId' |
  'ownerDecision'> & {
  /** the owner chooses this line (parts, labour, sundries); core deposits follow their part, discounts apply */
  decidable: boolean
  /** the owner may decline this line (every line they choose; a required one with a signed acknowledgement) */
  declinable: boolean
  /** declining needs the owner's signed acknowledgement of `declineStatement` (lines marked required) */
  needsAcknowledgement: boolean
  /** what declining this required line means, in plain words: shown before the owner signs */
  declineStatement: string | null
  /** after the decision: what the owner signed when declining it */
  declineAcknowledgement: DeclineAcknowledgement | null
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
  /** the internet address the decision came from (recorded with it) */
  decisionAddress: string | null
  findings: InspectionFinding[]
  messageToOwner: string
  terms: string
  lines: OwnerQuoteLine[]
  totals: Totals
  approvedTotals: Totals | null
  /** tax per rate, as quoted and as approved */
  taxByRate: RateShare[]
  approvedTaxByRate: RateShare[] | null
  currency: string
  taxLabel: string
}

export interface GarageSettingsView {
  organisationName: string
  labourRateMinor: number
  markupRules: MarkupRules
  taxRateBp: number
  pricesIncludeTax: boolean
  partPriceEndingMinor: number | null
  coreDepositsPassedOn: boolean
  quoteValidityDays: number
  quoteTerms: string
  techniciansSeePrices: boolean
  logo: { url: string; mime: string; updatedAt: string } | null
  currency: string
}
