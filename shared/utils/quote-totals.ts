/**
 * Quote arithmetic in integer minor units. Pure: used by the server (which is the only one that stores and
 * states totals) and by the owner's page to show the totals change as lines are ticked, with the same result.
 *
 * THE ROUNDING RULE (one, for every quote, its PDF and its e-mail):
 *  1. Every amount a line states is a whole number of minor units, rounded half away from zero once, where it
 *     is stated: a part's selling unit price (net x (1 + markup)), a labour line (hours x rate). A line's
 *     amount is then unit price x quantity, exactly.
 *  2. Tax is worked out per line: amount x rate, rounded half away from zero to a minor unit.
 *  3. The quote's tax is the sum of its line taxes (never re-rounded); gross = net + tax.
 * Discounts are negative lines taxed the same way (so -0.5 rounds to -1). A discount on the whole quote is
 * applied in full when anything it discounts is taken, and never takes the net below zero: if it would, it is
 * reduced to the net of the lines taken (first discount line first) and its tax re-worked with rule 2.
 */
import { divRoundHalfUp } from './money'

// basis points in one whole (100 %)
const BP = 10_000

export type QuoteLineKind = 'part' | 'labour' | 'core_deposit' | 'sundry' | 'discount'

/** A part's selling price per unit: the garage's net price plus its markup, rounded once (rule 1). */
export function sellingUnitMinor(unitNetMinor: number, markupBp: number): number {
  assertInt(unitNetMinor, 'unitNetMinor')
  assertInt(markupBp, 'markupBp')
  if (markupBp < -BP) throw new RangeError(`a markup below -100 % makes a negative price (got ${markupBp} bp)`)
  return divRoundHalfUp(unitNetMinor * (BP + markupBp), BP)
}

/** Labour: hours are held in hundredths (1.25 h = 125) so no fraction is ever stored; rounded once (rule 1). */
export function labourAmountMinor(hoursHundredths: number, rateMinor: number): number {
  assertInt(hoursHundredths, 'hoursHundredths')
  assertInt(rateMinor, 'rateMinor')
  return divRoundHalfUp(hoursHundredths * rateMinor, 100)
}

/** Tax on one line (rule 2). */
export function lineTaxMinor(amountMinor: number, taxBp: number): number {
  assertInt(amountMinor, 'amountMinor')
  assertInt(taxBp, 'taxBp')
  if (taxBp < 0) throw new RangeError(`a tax rate cannot be negative (got ${taxBp} bp)`)
  return divRoundHalfUp(amountMinor * taxBp, BP)
}

/** Hours as people type them (1.5, "0.25") -> hundredths, or null when it has more than two decimals. */
export function hoursToHundredths(hours: number): number | null {
  if (!Number.isFinite(hours) || hours < 0) return null
  const h = Math.round(hours * 100)
  return Math.abs(h - hours * 100) < 1e-6 ? h : null
}

export interface TotalsLineInput {
  id?: number | string
  kind: QuoteLineKind
  amountMinor: number
  taxBp: number
  /** whether the line counts in these totals (all lines for "as quoted", the approved ones after a decision) */
  included?: boolean
}

export interface Totals {
  netMinor: number
  taxMinor: number
  grossMinor: number
}

export interface TotalsDetail extends Totals {
  /** per tax rate, for the tax summary on the PDF */
  byRate: { taxBp: number; netMinor: number; taxMinor: number }[]
  /** what each counted line contributes after the discount cap: id -> amount and tax */
  lines: { id: number | string | undefined; amountMinor: number; taxBp: number; taxMinor: number }[]
  /** true when a whole-quote discount had to be reduced so the net stays at or above zero */
  discountCapped: boolean
}

/**
 * Totals of a quote's lines under the rounding rule above. Lines with `included: false` are left out;
 * discount lines count only when at least one non-discount line with a positive amount is counted.
 */
export function quoteTotals(lines: readonly TotalsLineInput[]): TotalsDetail {
  const counted = lines.filter((l) => l.included !== false)
  for (const l of counted) {
    assertInt(l.amountMinor, 'amountMinor')
    if (l.kind === 'discount' && l.amountMinor > 0) throw new RangeError('a discount line must have a negative amount')
    if (l.kind !== 'discount' && l.amountMinor < 0) throw new RangeError(`a ${l.kind} line cannot have a negative amount`)
  }
  const charges = counted.filter((l) => l.kind !== 'discount')
  const positiveNet = charges.reduce((s, l) => s + l.amountMinor, 0)
  let room = positiveNet // how much discount can still be given without a negative net
  let discountCapped = false
  const out: TotalsDetail['lines'] = []
  for (const l of charges) out.push({ id: l.id, amountMinor: l.amountMinor, taxBp: l.taxBp, taxMinor: lineTaxMinor(l.amountMinor, l.taxBp) })
  for (const l of counted) {
    if (l.kind !== 'discount') continue
    if (positiveNet === 0) continue
    const wanted = -l.amountMinor
    const given = Math.min(wanted, room)
    if (given < wanted) discountCapped = true
    room -= given
    if (given === 0) continue
    out.push({ id: l.id, amountMinor: -given, taxBp: l.taxBp, taxMinor: lineTaxMinor(-given, l.taxBp) })
  }
  const rates = new Map<number, { netMinor: number; taxMinor: number }>()
  let netMinor = 0
  let taxMinor = 0
  for (const o of out) {
    netMinor += o.amountMinor
    taxMinor += o.taxMinor
    const r = rates.get(o.taxBp) ?? { netMinor: 0, taxMinor: 0 }
    r.netMinor += o.amountMinor
    r.taxMinor += o.taxMinor
    rates.set(o.taxBp, r)
  }
  const byRate = [...rates].sort((a, b) => b[0] - a[0]).map(([taxBp, r]) => ({ taxBp, ...r }))
  return { netMinor: netMinor || 0, taxMinor: taxMinor || 0, grossMinor: netMinor + taxMinor || 0, byRate, lines: out, discountCapped }
}

/** Just the three figures the API names: `{ netMinor, taxMinor, grossMinor }`. */
export function quoteTotalsBrief(lines: readonly TotalsLineInput[]): Totals {
  const { netMinor, taxMinor, grossMinor } = quoteTotals(lines)
  return { netMinor, taxMinor, grossMinor }
}

/** Formats basis points as a percentage for people: 2000 -> "20 %", 1250 -> "12.5 %". */
export function formatBp(bp: number): string {
  const whole = bp / 100
  return `${Number.isInteger(whole) ? whole : whole.toFixed(2).replace(/0+$/, '')} %`
}

function assertInt(n: number, name: string): void {
  if (!Number.isSafeInteger(n)) throw new RangeError(`${name} must be a whole number of minor units / basis points (got ${n})`)
}
