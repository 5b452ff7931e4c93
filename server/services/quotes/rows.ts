/**
 * Reading a quote and its lines, and what counts in its totals: lines in order (each core deposit under its
 * part), expiry applied when read (no timer), and the quoted and approved figures under the one rounding rule
 * of shared/utils/quote-totals.ts.
 */
import { Op, type Transaction } from 'sequelize'
import { Quote, QuoteLine } from '../../models/quotes'
import { withWrite } from '../../utils/db'
import { effectiveQuoteStatus, type QuoteStatus } from '../../../shared/utils/quote-states'
import { quoteTotals, type TotalsLineInput } from '../../../shared/utils/quote-totals'

/** A garage's quote by id, or null when it does not exist or is another garage's. */
export function findQuoteOf(organisationId: number, id: number, t?: Transaction): Promise<Quote | null> {
  return Quote.findOne({ where: { id, organisationId }, transaction: t })
}

export async function linesOf(quoteId: number, t?: Transaction): Promise<QuoteLine[]> {
  const rows = await QuoteLine.findAll({ where: { quoteId }, order: [['position', 'ASC'], ['id', 'ASC']], transaction: t })
  return orderLines(rows)
}

/** Lines by position, each core deposit straight after its part. */
export function orderLines<T extends Pick<QuoteLine, 'id' | 'position' | 'parentLineId'>>(rows: T[]): T[] {
  const top = rows.filter((l) => !l.parentLineId || !rows.some((p) => p.id === l.parentLineId))
    .sort((a, b) => a.position - b.position || a.id - b.id)
  const out: T[] = []
  for (const l of top) {
    out.push(l)
    for (const c of rows.filter((x) => x.parentLineId === l.id).sort((a, b) => a.id - b.id)) out.push(c)
  }
  return out
}

/** Sent quotes past their validity become expired (one guarded UPDATE; nothing written when none are due). */
export async function expireDueQuotes(where: { organisationId?: number; id?: number } = {}, now = new Date()): Promise<number> {
  const due = { status: 'sent', expiresAt: { [Op.lte]: now }, ...where }
  const count = await Quote.count({ where: due })
  if (!count) return 0
  return withWrite(async (t) => {
    const [n] = await Quote.update({ status: 'expired' }, { where: due, transaction: t })
    return n
  })
}

/** Which lines the owner chooses: parts, labour and sundries (core deposits follow their part; discounts apply). */
export function isDecidable(line: Pick<QuoteLine, 'kind'>): boolean {
  return line.kind === 'part' || line.kind === 'labour' || line.kind === 'sundry'
}

/** Whether a line counts in the approved totals, given the owner's decisions. */
function approvedIncluded(line: QuoteLine, all: QuoteLine[]): boolean {
  if (line.kind === 'discount') return true
  if (line.kind === 'core_deposit') return all.find((p) => p.id === line.parentLineId)?.ownerDecision === 'approved'
  return line.ownerDecision === 'approved'
}

export function totalsInput(lines: QuoteLine[], mode: 'quoted' | 'approved'): TotalsLineInput[] {
  return lines.map((l) => ({
    id: l.id, kind: l.kind, amountMinor: l.amountMinor, taxBp: l.taxBp,
    included: mode === 'quoted' ? true : approvedIncluded(l, lines),
  }))
}

const DECIDED: QuoteStatus[] = ['approved', 'partly_approved', 'declined']

export function isDecided(status: QuoteStatus): boolean {
  return DECIDED.includes(status)
}

/** The quote's state as read now, its quoted totals, the approved ones once decided, and each line's tax. */
export function quoteFigures(q: Pick<Quote, 'status' | 'expiresAt'>, lines: QuoteLine[]) {
  const status = effectiveQuoteStatus(q.status, q.expiresAt ?? null)
  const quoted = quoteTotals(totalsInput(lines, 'quoted'))
  const approved = isDecided(status) ? quoteTotals(totalsInput(lines, 'approved')) : null
  const taxOf = new Map(quoted.lines.map((l) => [l.id, l.taxMinor]))
  return {
    status, quoted, taxOf,
    totals: { netMinor: quoted.netMinor, taxMinor: quoted.taxMinor, grossMinor: quoted.grossMinor },
    approvedTotals: approved ? { netMinor: approved.netMinor, taxMinor: approved.taxMinor, grossMinor: approved.grossMinor } : null,
  }
}

export function hoursOf(line: Pick<QuoteLine, 'hoursHundredths'>): number | null {
  return line.hoursHundredths == null ? null : line.hoursHundredths / 100
}

export const iso = (d: Date | string | null | undefined) => (d ? new Date(d).toISOString() : null)
