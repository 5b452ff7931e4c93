/**
 * Quote arithmetic in integer minor units. Pure: used by the server (which is the only one that stores and
 * states totals), by the PDF, and by the owner's page to show the totals change as lines are ticked, with the
 * same result.
 *
 * THE ROUNDING RULE (one, for every quote, its PDF, its e-mails and the owner's page):
 *  1. Every amount a line states is a whole number of minor units, rounded half away from zero once, where it
 *     is stated: a part's selling unit price (net x (1 + markup), or net x (1 + markup) x (1 + tax) when the
 *     price includes tax; then the garage's price ending, if it has one), a labour line (hours x rate). A line's
 *     amount is then unit price x quantity, exactly. What is stored is what was stated.
 *  2. A line is stated either before tax or with tax included, and its tax is worked out once, on the line:
 *       before tax:  tax = amount x rate, rounded half away from zero; gross = amount + tax;
 *       with tax:    tax = amount x rate / (1 + rate) (the tax fraction: 1/6 at 20 %), rounded half away from
 *                    zero; net = amount - tax.
 *     Either way net + tax = gross exactly, and every price in minor units can be stated: 99.99 with tax is
 *     99.99 (83.32 + 16.67), where no net price with 20 % added comes to 99.99.
 *  3. A discount on the whole quote is split across the tax rates of the lines it discounts (parts, labour,
 *     sundries: never core deposits) in proportion to their amounts in the discount's own terms (before tax, or
 *     with tax), by largest remainder so the shares add up to the discount exactly; each share is taxed by rule
 *     2 at its rate. A share that takes the whole of its rate's lines takes exactly their net and tax.
 *  4. A core deposit is part of the price of the exchange part it comes with: it is taxed at its part's rate,
 *     stated before tax, and never discounted; the refund when the old unit is accepted returns the deposit
 *     with that tax. The same rule as the counter's invoices and credit notes (shared/utils/order-totals.ts).
 *  5. The quote's tax is the sum of its line and share taxes (never re-rounded); gross = net + tax. The tax per
 *     rate sums the same figures.
 * Discounts count when anything they discount is taken, and never take the quote below zero: a discount larger
 * than what is left is reduced to it (first discount line first).
 */
import { divRoundHalfUp, mulDivRoundHalfUp } from './money'

// basis points in one whole (100 %)
const BP = 10_000

export type QuoteLineKind = 'part' | 'labour' | 'core_deposit' | 'sundry' | 'discount'

/**
 * A part's selling price per unit: the garage's net price plus its markup, rounded once (rule 1); with
 * `includeTaxBp`, the price with that tax included, still rounded once.
 */
export function sellingUnitMinor(unitNetMinor: number, markupBp: number, includeTaxBp: number | null = null): number {
  assertInt(unitNetMinor, 'unitNetMinor')
  assertInt(markupBp, 'markupBp')
  if (markupBp < -BP) throw new RangeError(`a markup below -100 % makes a negative price (got ${markupBp} bp)`)
  if (includeTaxBp === null) return divRoundHalfUp(unitNetMinor * (BP + markupBp), BP)
  assertRate(includeTaxBp)
  return mulDivRoundHalfUp(unitNetMinor * (BP + markupBp), BP + includeTaxBp, BP * BP)
}

/**
 * A price moved up to the garage's price ending (e.g. 99 -> x.99; 0 -> whole units): the first price with that
 * ending at or above the one given, so an ending never takes margin away. Null: no ending.
 */
export function withPriceEnding(unitMinor: number, endingMinor: number | null): number {
  assertInt(unitMinor, 'unitMinor')
  if (endingMinor === null || unitMinor <= 0) return unitMinor
  if (!Number.isInteger(endingMinor) || endingMinor < 0 || endingMinor > 99) throw new RangeError(`a price ending is 0..99 minor units (got ${endingMinor})`)
  const candidate = Math.floor(unitMinor / 100) * 100 + endingMinor
  return candidate >= unitMinor ? candidate : candidate + 100
}

/**
 * The same price stated the other way: before tax -> with tax, or with tax -> before tax, rounded once. Used
 * when a line changes how it is stated, so its price stays what it was (to the minor unit).
 */
export function restatedMinor(amountMinor: number, taxBp: number, toTaxIncluded: boolean): number {
  assertInt(amountMinor, 'amountMinor')
  assertRate(taxBp)
  return toTaxIncluded ? divRoundHalfUp(amountMinor * (BP + taxBp), BP) : divRoundHalfUp(amountMinor * BP, BP + taxBp)
}

/** Labour: hours are held in hundredths (1.25 h = 125) so no fraction is ever stored; rounded once (rule 1). */
export function labourAmountMinor(hoursHundredths: number, rateMinor: number): number {
  assertInt(hoursHundredths, 'hoursHundredths')
  assertInt(rateMinor, 'rateMinor')
  return divRoundHalfUp(hoursHundredths * rateMinor, 100)
}

/** Tax on an amount before tax (rule 2). */
export function lineTaxMinor(amountMinor: number, taxBp: number): number {
  assertInt(amountMinor, 'amountMinor')
  assertRate(taxBp)
  return divRoundHalfUp(amountMinor * taxBp, BP)
}

/** The tax inside an amount that includes it: amount x rate / (1 + rate), rounded once (rule 2). */
export function includedTaxMinor(grossMinor: number, taxBp: number): number {
  assertInt(grossMinor, 'grossMinor')
  assertRate(taxBp)
  return divRoundHalfUp(grossMinor * taxBp, BP + taxBp)
}

/** A line's net, tax and gross from its amount as stated (rule 2). */
export function lineFigures(amountMinor: number, taxBp: number, taxIncluded = false): { netMinor: number; taxMinor: number; grossMinor: number } {
  if (taxIncluded) {
    const taxMinor = includedTaxMinor(amountMinor, taxBp)
    return { netMinor: amountMinor - taxMinor || 0, taxMinor, grossMinor: amountMinor }
  }
  const taxMinor = lineTaxMinor(amountMinor, taxBp)
  return { netMinor: amountMinor, taxMinor, grossMinor: amountMinor + taxMinor || 0 }
}

/** Hours as people type them (1.5, "0.25") -> hundredths, or null when it has more than two decimals. */
export function hoursToHundredths(hours: number): number | null {
  if (!Number.isFinite(hours) || hours < 0) return null
  const h = Math.round(hours * 100)
  return Math.abs(h - hours * 100) < 1e-6 ? h : null
}

/**
 * Splits `amount` (>= 0) across weights (>= 0, not all 0) in proportion, by largest remainder: each share is
 * the whole part of amount x weight / total, and the minor units left over go one each to the largest
 * fractions (ties: the larger weight, then the earlier). The shares add up to `amount` exactly.
 */
export function splitInProportion(amount: number, weights: readonly number[]): number[] {
  assertInt(amount, 'amount')
  const total = weights.reduce((s, w) => s + w, 0)
  if (amount < 0 || total <= 0 || weights.some((w) => w < 0 || !Number.isSafeInteger(w))) {
    throw new RangeError('splitInProportion needs an amount >= 0 and whole weights >= 0 with a positive total')
  }
  const A = BigInt(amount)
  const T = BigInt(total)
  const parts = weights.map((w, i) => {
    const x = A * BigInt(w)
    return { i, w, share: x / T, rest: x % T }
  })
  let left = amount - parts.reduce((s, p) => s + Number(p.share), 0)
  const order = [...parts].sort((a, b) => (a.rest === b.rest ? b.w - a.w || a.i - b.i : a.rest > b.rest ? -1 : 1))
  const out = parts.map((p) => Number(p.share))
  for (const p of order) {
    if (left <= 0) break
    out[p.i]! += 1
    left -= 1
  }
  return out
}

export interface TotalsLineInput {
  id?: number | string
  kind: QuoteLineKind
  /** the line's amount as stated: before tax, or with tax included when `taxIncluded` */
  amountMinor: number
  taxBp: number
  /** the amount includes tax (rule 2) */
  taxIncluded?: boolean
  /** whether the line counts in these totals (all lines for "as quoted", the approved ones after a decision) */
  included?: boolean
}

export interface Totals {
  netMinor: number
  taxMinor: number
  grossMinor: number
}

/** Net and tax at one rate: a line's, a discount's share, or the quote's per rate. */
export interface RateShare {
  taxBp: number
  netMinor: number
  taxMinor: number
}

/** What one counted line comes to. `amountMinor` is always before tax. */
export interface TotalsLine {
  id: number | string | undefined
  kind: QuoteLineKind
  amountMinor: number
  taxMinor: number
  grossMinor: number
  /** the line's rate; for a discount split across rates, the rate of its only share or else its own */
  taxBp: number
  /** per rate: one for a charge, one per rate discounted for a discount */
  shares: RateShare[]
}

export interface TotalsDetail extends Totals {
  /** per tax rate, highest first: for the tax summary on the PDF and the pages */
  byRate: RateShare[]
  /** what each counted line contributes after the discount cap */
  lines: TotalsLine[]
  /** true when a whole-quote discount had to be reduced so the quote stays at or above zero */
  discountCapped: boolean
}

/** What is left to discount at one rate, before tax and with it. */
interface Room { net: number; tax: number }

function discountShares(line: TotalsLineInput, rooms: Map<number, Room>): { shares: RateShare[]; capped: boolean } {
  const withTax = !!line.taxIncluded
  const measure = (r: Room) => Math.max(0, withTax ? r.net + r.tax : r.net)
  const rates = [...rooms.keys()].sort((a, b) => b - a).filter((bp) => measure(rooms.get(bp)!) > 0)
  const available = rates.reduce((s, bp) => s + measure(rooms.get(bp)!), 0)
  const wanted = -line.amountMinor
  const given = Math.min(wanted, available)
  if (given <= 0) return { shares: [], capped: given < wanted }
  const split = splitInProportion(given, rates.map((bp) => measure(rooms.get(bp)!)))
  const shares: RateShare[] = []
  rates.forEach((taxBp, i) => {
    const size = split[i]!
    if (size === 0) return
    const room = rooms.get(taxBp)!
    // the whole of what is left at this rate: take its net and tax exactly, so nothing is left over by rounding
    const whole = size === measure(room)
    const f = whole ? { netMinor: room.net, taxMinor: room.tax } : lineFigures(size, taxBp, withTax)
    room.net -= f.netMinor
    room.tax -= f.taxMinor
    shares.push({ taxBp, netMinor: -f.netMinor || 0, taxMinor: -f.taxMinor || 0 })
  })
  return { shares, capped: given < wanted }
}

const sumOf = (shares: RateShare[], key: 'netMinor' | 'taxMinor') => shares.reduce((s, x) => s + x[key], 0) || 0

/**
 * Totals of a quote's lines under the rounding rule above. Lines with `included: false` are left out;
 * discount lines count only when something they discount is counted.
 */
export function quoteTotals(lines: readonly TotalsLineInput[]): TotalsDetail {
  const counted = lines.filter((l) => l.included !== false)
  for (const l of counted) {
    assertInt(l.amountMinor, 'amountMinor')
    if (l.kind === 'discount' && l.amountMinor > 0) throw new RangeError('a discount line must have a negative amount')
    if (l.kind !== 'discount' && l.amountMinor < 0) throw new RangeError(`a ${l.kind} line cannot have a negative amount`)
  }
  const out: TotalsLine[] = []
  const rooms = new Map<number, Room>()
  for (const l of counted) {
    if (l.kind === 'discount') continue
    const f = lineFigures(l.amountMinor, l.taxBp, !!l.taxIncluded)
    out.push({ id: l.id, kind: l.kind, amountMinor: f.netMinor, taxMinor: f.taxMinor, grossMinor: f.grossMinor, taxBp: l.taxBp, shares: [{ taxBp: l.taxBp, netMinor: f.netMinor, taxMinor: f.taxMinor }] })
    if (l.kind === 'core_deposit') continue
    const room = rooms.get(l.taxBp) ?? { net: 0, tax: 0 }
    room.net += f.netMinor
    room.tax += f.taxMinor
    rooms.set(l.taxBp, room)
  }
  // with nothing counted at all (every line declined) a discount simply does not apply; otherwise a discount
  // that cannot be given in full is reduced, and said so
  const anyCharge = out.length > 0
  let discountCapped = false
  for (const l of counted) {
    if (l.kind !== 'discount') continue
    const { shares, capped } = discountShares(l, rooms)
    if (capped && anyCharge) discountCapped = true
    if (!shares.length) continue
    const amountMinor = sumOf(shares, 'netMinor')
    const taxMinor = sumOf(shares, 'taxMinor')
    out.push({ id: l.id, kind: 'discount', amountMinor, taxMinor, grossMinor: amountMinor + taxMinor || 0, taxBp: shares.length === 1 ? shares[0]!.taxBp : l.taxBp, shares })
  }
  const rates = new Map<number, RateShare>()
  for (const share of out.flatMap((o) => o.shares)) {
    const r = rates.get(share.taxBp) ?? { taxBp: share.taxBp, netMinor: 0, taxMinor: 0 }
    r.netMinor += share.netMinor
    r.taxMinor += share.taxMinor
    rates.set(share.taxBp, r)
  }
  // a rate with nothing at it (an absorbed deposit) says nothing on a tax summary
  const byRate = [...rates.values()].filter((r) => r.netMinor !== 0 || r.taxMinor !== 0).sort((a, b) => b.taxBp - a.taxBp)
    .map((r) => ({ taxBp: r.taxBp, netMinor: r.netMinor || 0, taxMinor: r.taxMinor || 0 }))
  const netMinor = out.reduce((s, o) => s + o.amountMinor, 0) || 0
  const taxMinor = out.reduce((s, o) => s + o.taxMinor, 0) || 0
  return { netMinor, taxMinor, grossMinor: netMinor + taxMinor || 0, byRate, lines: out, discountCapped }
}

/** Just the three figures the API names: `{ netMinor, taxMinor, grossMinor }`. */
export function quoteTotalsBrief(lines: readonly TotalsLineInput[]): Totals {
  const { netMinor, taxMinor, grossMinor } = quoteTotals(lines)
  return { netMinor, taxMinor, grossMinor }
}

/** A line as the owner's choices see it: what it is and, for a core deposit, its part. */
export interface ChoosableLine extends TotalsLineInput {
  id: number
  parentLineId?: number | null
}

/**
 * The totals of what the owner takes: the lines chosen, each core deposit with its part, discounts on what is
 * taken. The owner's page (as lines are ticked) and the server (after the decision) both count this way.
 */
export function chosenTotals(lines: readonly ChoosableLine[], chosen: (id: number) => boolean): TotalsDetail {
  return quoteTotals(lines.map((l) => ({
    ...l,
    included: l.kind === 'discount' ? true : l.kind === 'core_deposit' ? chosen(l.parentLineId ?? 0) : chosen(l.id),
  })))
}

/** Formats basis points as a percentage for people: 2000 -> "20 %", 1250 -> "12.5 %". */
export function formatBp(bp: number): string {
  const whole = bp / 100
  return `${Number.isInteger(whole) ? whole : whole.toFixed(2).replace(/0+$/, '')} %`
}

function assertInt(n: number, name: string): void {
  if (!Number.isSafeInteger(n)) throw new RangeError(`${name} must be a whole number of minor units / basis points (got ${n})`)
}

function assertRate(taxBp: number): void {
  assertInt(taxBp, 'taxBp')
  if (taxBp < 0) throw new RangeError(`a tax rate cannot be negative (got ${taxBp} bp)`)
}
