/**
 * The view from above: the distributor's and a garage's figures over a range of local days (inclusive). Money in
 * minor units, rates in basis points (null when there is nothing to divide by), counts as counts; every list is
 * bounded (`TOP_N`) or one row per day, month, branch or bucket of the range.
 */
import type { Ageing } from './money-owed'
import { formatBp } from '../utils/quote-totals'

export const DASHBOARD_TOP_N = 10
export const DASHBOARD_MAX_DAYS = 366

export interface DashboardRange { from: string; to: string; days: number; timeZone: string }

export interface NamedFigure { key: string; label: string; count: number; units?: number; amountMinor?: number }

export interface DistributorDashboard {
  range: DashboardRange
  currency: string
  sales: {
    netMinor: number
    orders: number
    byDay: { day: string; netMinor: number; orders: number }[]
    byBranch: { branch: string; netMinor: number; orders: number }[]
  }
  /** net sales less trade cost (the price version active when each order was placed); lines without a cost left out */
  margin: { netMinor: number; costMinor: number; marginMinor: number; marginBp: number | null; linesWithoutCost: number }
  /** requested lines sent complete from the garage's home branch in the first dispatch, over requested lines sent */
  fillRate: { lines: number; filled: number; rateBp: number | null }
  /** open now, whatever the range */
  backOrders: { lines: number; units: number }
  returnsByReason: NamedFigure[]
  topParts: { sku: string; description: string; units: number; netMinor: number }[]
  topGarages: { id: number; name: string; orders: number; netMinor: number }[]
  /** what every garage owes today, by how long overdue */
  overdue: Ageing & { garages: number }
  lastPriceFile: null | { label: string; activatedOn: string; dearer: number; cheaper: number; unchanged: number; added: number; meanChangeBp: number | null }
}

export interface GarageDashboard {
  range: DashboardRange
  currency: string
  quotes: { sent: number; approved: number; rateBp: number | null }
  /** owners' decisions on lines of the quotes sent in the range */
  lines: Record<'required' | 'advised', { decided: number; approved: number; rateBp: number | null }>
  /** advised work owners declined, by kind, most declined first */
  declinedAdvised: NamedFigure[]
  jobs: { invoices: number; grossMinor: number; averageMinor: number | null }
  spendByMonth: { month: string; totalMinor: number; orders: number }[]
  reminders: { sent: number; quotesApproved: number; workMinor: number }
}

/** A rate for people: "37.5 %", or what to say when there was nothing to divide by. */
export const rateText = (bp: number | null, none: string): string => (bp === null ? none : formatBp(bp))
