/**
 * Reading a quote and its lines, and what counts in its totals: lines in order (each core deposit under its
 * part), expiry applied when read (no timer), and the quoted and approved figures under the one rounding rule
 * of shared/utils/quote-totals.ts.
 */
import { Op, type Transaction } from 'sequelize'
import { Quote, QuoteLine } from '../../models/quotes'
import { withWrite } from '../../utils/db'
import { effectiveQuoteStatus, type QuoteStatus } from '../../../shared/utils/quote-states'
import {
  chosenTotals, lineFigures, quoteTotals, type ChoosableLine, type Totals, type TotalsDetail, type TotalsLine, type TotalsLineInput,
} from '../../../shared/utils/quote-totals'

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

/** A line as the money rule reads it (shared/utils/quote-totals.ts): its amount as stated and how. */
export function totalsLine(l: QuoteLine): ChoosableLine {
  return { id: l.id, kind: l.kind, amountMinor: l.amountMinor, taxBp: l.taxBp, taxIncluded: !!l.taxIncluded, parentLineId: l.parentLineId ?? null }
}

/** Every line counted: the quote as quoted. */
export function totalsInput(lines: QuoteLine[]): TotalsLineInput[] {
  return lines.map(totalsLine)
}

/** What the owner approved, counted the way the owner's page counts it. */
export function approvedFigures(lines: QuoteLine[]): TotalsDetail {
  const approved = new Set(lines.filter((l) => l.ownerDecision === 'approved').map((l) => l.id))
  return chosenTotals(lines.map(totalsLine), (id) => approved.has(id))
}

const DECIDED: QuoteStatus[] = ['approved', 'partly_approved', 'declined']

export function isDecided(status: QuoteStatus): boolean {
  return DECIDED.includes(status)
}

/** A line's figures when the totals do not count it (a discount with nothing to discount): on its own. */
function figuresAlone(l: QuoteLine): TotalsLine {
  const f = lineFigures(l.amountMinor, l.taxBp, !!l.taxIncluded)
  return { id: l.id, kind: l.kind, amountMinor: f.netMinor, taxMinor: f.taxMinor, grossMinor: f.grossMinor, taxBp: l.taxBp, shares: [{ taxBp: l.taxBp, netMinor: f.netMinor, taxMinor: f.taxMinor }] }
}

const brief = (t: TotalsDetail): Totals => ({ netMinor: t.netMinor, taxMinor: t.taxMinor, grossMinor: t.grossMinor })

/** The quote's state as read now, its quoted totals, the approved ones once decided, and each line's figures. */
export function quoteFigures(q: Pick<Quote, 'status' | 'expiresAt'>, lines: QuoteLine[]) {
  const status = effectiveQuoteStatus(q.status, q.expiresAt ?? null)
  const quoted = quoteTotals(totalsInput(lines))
  const approved = isDecided(status) ? approvedFigures(lines) : null
  const counted = new Map(quoted.lines.map((l) => [l.id, l]))
  const lineOf = (l: QuoteLine): TotalsLine => counted.get(l.id) ?? figuresAlone(l)
  return {
    status, quoted, approved, lineOf,
    totals: brief(quoted),
    approvedTotals: approved ? brief(approved) : null,
  }
}

export function hoursOf(line: Pick<QuoteLine, 'hoursHundredths'>): number | null {
  return line.hoursHundredths == null ? null : line.hoursHundredths / 100
}

export const iso = (d: Date | string | null | undefined) => (d ? new Date(d).toISOString() : null)
