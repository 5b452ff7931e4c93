/**
 * A garage's dashboard over a range of local days: quotes sent (each quote number once, its latest revision sent in
 * the range) and approved (wholly or partly), the owners' decisions on required and advised lines and which kinds
 * of advised work they decline, the average job (owner invoices issued), spend with the distributor by month
 * (orders confirmed or later, less what was cancelled), and the reminders of declined work sent with what they
 * brought back (the fresh quotes approved, and their approved lines). Always the caller's own garage. Plain Node.
 */
import { QUOTE_PART_TYPE_LABELS } from '../../../shared/utils/quote-markup'
import { DASHBOARD_TOP_N, type GarageDashboard, type NamedFigure } from '../../../shared/types/dashboards'
import type { Formats } from '../../../shared/utils/format'
import { localDate } from '../orders/zoned-time'
import { SOLD_STATUSES } from './distributor'
import { num, rateBp, rows, type Span } from './range'

const APPROVED = ['approved', 'partly_approved']

interface SentQuote { id: number; number: number; revision: number; status: string }
interface DecidedLine { quote_id: number; kind: string; part_type: string | null; recommendation: 'required' | 'advised'; owner_decision: 'approved' | 'declined' }

/** The latest revision of each quote number sent in the range. */
function latestRevisions(quotes: readonly SentQuote[]): SentQuote[] {
  const latest = new Map<number, SentQuote>()
  for (const q of quotes) if (num(q.revision) >= num(latest.get(num(q.number))?.revision ?? -1)) latest.set(num(q.number), q)
  return [...latest.values()]
}

function declineKinds(lines: readonly DecidedLine[]): NamedFigure[] {
  const kinds = new Map<string, NamedFigure>()
  for (const l of lines) {
    if (l.recommendation !== 'advised' || l.owner_decision !== 'declined') continue
    const key = l.kind === 'part' && l.part_type ? l.part_type : l.kind
    const label = QUOTE_PART_TYPE_LABELS[key] ?? (key === 'labour' ? 'Labour' : 'Other work')
    const k = kinds.get(key) ?? { key, label, count: 0 }
    k.count++
    kinds.set(key, k)
  }
  return [...kinds.values()].sort((a, b) => b.count - a.count || a.label.localeCompare(b.label)).slice(0, DASHBOARD_TOP_N)
}

export async function garageDashboard(organisationId: number, span: Span, fmt: Formats): Promise<GarageDashboard> {
  const p = { org: organisationId, start: span.start, end: span.end }
  const [quotes, invoices, orders, followUps] = await Promise.all([
    rows<SentQuote>('SELECT id, number, revision, status FROM quotes WHERE organisation_id = :org AND sent_at >= :start AND sent_at < :end', p),
    rows<{ n: number; gross: number }>('SELECT COUNT(*) AS n, SUM(gross_minor) AS gross FROM owner_invoices WHERE organisation_id = :org AND issued_at >= :start AND issued_at < :end', p),
    rows<{ created_at: string | Date; total_minor: number; cancelled_minor: number }>(
      'SELECT created_at, total_minor, cancelled_minor FROM orders WHERE organisation_id = :org AND created_at >= :start AND created_at < :end AND status IN (:sold)', { ...p, sold: SOLD_STATUSES }),
    rows<{ new_quote_id: number | null }>("SELECT new_quote_id FROM follow_ups WHERE organisation_id = :org AND status = 'sent' AND sent_at >= :start AND sent_at < :end", p),
  ])
  const sent = latestRevisions(quotes)
  const ids = sent.map((q) => num(q.id))
  const lines = ids.length
    ? await rows<DecidedLine>(`SELECT quote_id, kind, part_type, recommendation, owner_decision FROM quote_lines
        WHERE quote_id IN (:ids) AND recommendation IS NOT NULL AND owner_decision IS NOT NULL`, { ids })
    : []
  const rate = (r: 'required' | 'advised') => {
    const decided = lines.filter((l) => l.recommendation === r)
    const approved = decided.filter((l) => l.owner_decision === 'approved').length
    return { decided: decided.length, approved, rateBp: rateBp(approved, decided.length) }
  }
  const months = new Map<string, { month: string; totalMinor: number; orders: number }>()
  for (const o of orders) {
    const month = localDate(new Date(o.created_at), span.timeZone).slice(0, 7)
    const m = months.get(month) ?? { month, totalMinor: 0, orders: 0 }
    m.totalMinor += num(o.total_minor) - num(o.cancelled_minor)
    m.orders++
    months.set(month, m)
  }
  const brought = await broughtBack(followUps.map((f) => f.new_quote_id).filter((id): id is number => id !== null).map(num))
  const approvedCount = sent.filter((q) => APPROVED.includes(q.status)).length
  const jobs = num(invoices[0]?.n)
  const gross = num(invoices[0]?.gross)
  return {
    range: { from: span.from, to: span.to, days: span.days, timeZone: span.timeZone },
    currency: fmt.currency,
    quotes: { sent: sent.length, approved: approvedCount, rateBp: rateBp(approvedCount, sent.length) },
    lines: { required: rate('required'), advised: rate('advised') },
    declinedAdvised: declineKinds(lines),
    jobs: { invoices: jobs, grossMinor: gross, averageMinor: jobs ? Math.round(gross / jobs) : null },
    spendByMonth: [...months.values()].sort((a, b) => a.month.localeCompare(b.month)),
    reminders: { sent: followUps.length, ...brought },
  }
}

/** The fresh quotes the reminders made that owners approved, and the approved lines' amounts (with tax as stated). */
async function broughtBack(quoteIds: number[]): Promise<{ quotesApproved: number; workMinor: number }> {
  const unique = [...new Set(quoteIds)]
  if (!unique.length) return { quotesApproved: 0, workMinor: 0 }
  const approved = await rows<{ id: number }>('SELECT id FROM quotes WHERE id IN (:ids) AND status IN (:ok)', { ids: unique, ok: APPROVED })
  if (!approved.length) return { quotesApproved: 0, workMinor: 0 }
  const [sum] = await rows<{ s: number }>("SELECT SUM(amount_minor) AS s FROM quote_lines WHERE quote_id IN (:ids) AND owner_decision = 'approved'", { ids: approved.map((q) => num(q.id)) })
  return { quotesApproved: approved.length, workMinor: num(sum?.s) }
}
