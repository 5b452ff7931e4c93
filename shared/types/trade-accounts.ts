/** What the trade-account, staff and account routes answer (server serialisers and pages share these shapes). */
import type { OrgStatus, PaymentTerms, Role, UserStatus } from './accounts'
import type { Page } from './page'

export interface TierView {
  id: number
  name: string
  percentBp: number
  /** number of garages on the tier (admin list only) */
  garages?: number
}

export interface ProofDocumentView {
  id: number
  originalName: string
  mime: string
  sizeBytes: number
  uploadedAt: string
}

export interface TradeAccountSummary {
  id: number
  name: string
  status: OrgStatus
  contactName: string
  email: string
  submittedAt: string
  decidedAt: string | null
  tier: TierView | null
  terms: PaymentTerms
  creditLimitMinor: number
  paymentDays: number
}

export interface AuditView {
  id: number
  at: string
  action: string
  actor: string | null
  changes: Record<string, unknown>
}

export interface PersonView {
  id: number
  name: string
  email: string
  phone: string
  role: Role
  status: UserStatus
  lastSignInAt: string | null
}

export interface TradeAccountDetail extends TradeAccountSummary {
  tradingAddress: string
  taxNumber: string
  phone: string
  decisionReason: string | null
  document: ProofDocumentView | null
  people: PersonView[]
  history: AuditView[]
  /** what the garage owes on its ledger now (negative: in credit) */
  balanceMinor: number
  /** the branch that supplies its orders unless it names another (set on approval) */
  homeBranch: { id: number; code: string; name: string } | null
}

/** `GET /api/account`: the signed-in person and their organisation's standing. */
export interface AccountOverview {
  profile: PersonView
  organisation: {
    id: number
    name: string
    kind: 'distributor' | 'garage'
    status: OrgStatus
    decisionReason: string | null
    /** tier and terms: only for those who handle the garage's money (managers) and distributor staff */
    tier: TierView | null
    terms: PaymentTerms | null
    creditLimitMinor: number | null
    paymentDays: number | null
  }
}

/** `GET /api/trade-applications/mine`: what a pending or rejected garage may see. */
export interface ApplicationStatusView {
  businessName: string
  status: OrgStatus
  submittedAt: string
  decidedAt: string | null
  decisionReason: string | null
  document: { originalName: string; sizeBytes: number } | null
}

export interface StaffMember extends PersonView {
  /** the caller may change this person's role or remove them */
  manageable: boolean
  isYou: boolean
  /** the person signs in with two steps (an authenticator app) */
  secondFactor: boolean
}

/** `GET /api/staff`: one page of the caller's own organisation's people. */
export interface StaffList extends Page<StaffMember> {
  /** roles the caller may give when inviting or changing a role */
  assignableRoles: Role[]
}
