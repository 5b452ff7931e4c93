/** Answers of the garage's vehicle register, the VIN and registration look-ups and the follow-ups of declined work. */
import type { CheckDigitState, VinRegion } from '../utils/vehicles/vin'
import type { RegistrationAge } from '../utils/vehicles/registration'
import type { QuoteStatus } from '../utils/quote-states'
import type { OrderStatus } from './orders'

export interface GarageCustomerView {
  id: number
  name: string
  email: string
  phone: string
  reminderConsent: boolean
  /** when consent was last given or withdrawn (ISO), and how */
  consentChangedAt: string | null
  consentSource: string
  notes: string
  vehicleCount?: number
}

/** A catalogue vehicle as the register shows it. */
export interface CatalogueVehicleRef { id: number; label: string; make: string; model: string; yearFrom: number; yearTo: number | null }

export interface OdometerView { id: number; reading: number; unit: 'mi' | 'km'; readOn: string; source: 'recorded' | 'inspection' | 'quote' }

export interface GarageVehicleSummary {
  id: number
  /** as people write it ("AB12 CDE"); null when only the VIN is known */
  registration: string | null
  vin: string | null
  vehicle: CatalogueVehicleRef | null
  owner: { id: number; name: string } | null
  lastOdometer: OdometerView | null
  updatedAt: string
}

export interface RememberedAnswer { key: string; label: string; value: string; valueLabel: string }

export interface GarageVehicleDetail extends GarageVehicleSummary {
  customer: GarageCustomerView | null
  answers: Record<string, string>
  /** the answers with the vehicle's own words for them */
  answerLabels: RememberedAnswer[]
  built: string | null
  notes: string
  vinReading: VinAnswer | null
  /** the finder's query for the parts that fit, with the remembered answers (and VIN / build month) applied */
  partsQuery: Record<string, string>
  followUps: FollowUpView[]
}

export type HistoryEntry =
  | { kind: 'inspection'; id: number; at: string; title: string; overall: 'ok' | 'advise' | 'fail'; odometer: string; author: string }
  | {
    kind: 'quote'; id: number; at: string; title: string; status: QuoteStatus; grossMinor: number
    lines: { description: string; recommendation: 'required' | 'advised' | null; decision: 'approved' | 'declined' | null }[]
  }
  | { kind: 'order'; id: number; at: string; title: string; status: OrderStatus; totalMinor: number }
  | { kind: 'odometer'; id: number; at: string; title: string; reading: number; unit: 'mi' | 'km'; source: string }
  /** the garage's invoice to the owner for a quote's work */
  | { kind: 'invoice'; id: number; at: string; title: string; quoteId: number; grossMinor: number }

export interface VinAnswer {
  vin: string
  valid: boolean
  checkDigit: CheckDigitState
  expectedCheckDigit: string
  warning: string | null
  region: VinRegion | null
  /** one year, or both candidates of the 30-year cycle when the VIN cannot tell them apart */
  modelYears: number[]
  maker: { wmi: string; make: string; country: string } | null
  /** catalogue vehicles of that maker for those model years */
  candidates: CatalogueVehicleRef[]
}

/** GET /api/registrations/:registration */
export interface RegistrationAnswer {
  registration: string
  /** what the vehicle-data service said */
  reported: { make: string; model: string; variant: string; yearOfManufacture: number | null; firstRegistered: string | null; engineCc: number | null; fuel: string; vin: string | null; colour: string }
  /** catalogue vehicles that match; one when the match is certain */
  candidates: CatalogueVehicleRef[]
  vehicleId: number | null
  /** the age the mark itself tells (national format), when it tells one */
  age: RegistrationAge | null
  /** the answer came from this garage's cache */
  cached: boolean
}

/** The finder's fallback when the service has nothing: what the mark tells, for the 404 and 503 answers' data. */
export interface RegistrationFallback { registration: string; age: RegistrationAge | null; years: number[] }

export interface FollowUpView {
  id: number
  garageVehicleId: number
  registration: string | null
  ownerName: string | null
  description: string
  recommendation: 'required' | 'advised'
  dueAt: string
  status: 'scheduled' | 'sending' | 'sent' | 'held' | 'stopped' | 'mail_failed'
  statusNote: string
  sentAt: string | null
  quoteId: number
  newQuoteId: number | null
}

export interface FollowUpSettingsView { advisedWeeks: number; requiredWeeks: number }
