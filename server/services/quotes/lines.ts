/**
 * Writing lines, inside the caller's write transaction: adding one (a part captures its net price and the
 * garage's markup now, stated with tax when the garage shows prices so, moved to its price ending, and brings its
 * core deposit: absorbed by the garage unless it passes deposits on), and changing one field by field as its
 * kind allows (a part's core deposit follows its quantity). Amounts are worked out by repriceLine.
 */
import type { CreationAttributes, Transaction } from 'sequelize'
import type { Organisation } from '../../models/accounts'
import { Quote, QuoteLine } from '../../models/quotes'
import { markupBpFor } from '../../../shared/utils/quote-markup'
import {
  hoursToHundredths, lineFigures, restatedMinor, sellingUnitMinor, withPriceEnding,
} from '../../../shared/utils/quote-totals'
import { divRoundHalfUp } from '../../../shared/utils/money'
import type { Recommendation } from '../../../shared/types/quotes'
import { refusedInput, repriceLine, resolvePart } from './line-pricing'
import { settingsOf, type EffectiveSettings } from './settings'
import { guardFit } from '../jobs/fitment-guard'

export interface NewLine {
  kind: 'part' | 'labour' | 'sundry' | 'discount'
  sku?: string
  quantity?: number
  description?: string
  hours?: number
  amountMinor?: number
  recommendation?: Recommendation | null
  reason?: string | null
  markupBp?: number
  rateMinor?: number
  taxBp?: number
  /** the amounts given and worked out include tax; default: the garage's setting */
  taxIncluded?: boolean
  /** answers to the vehicle's option questions, for the fitment guard */
  answers?: Record<string, string>
  /** a manager puts on a part that does not fit (or whose fit is not known), with the reason */
  override?: { reason: string } | null
  /** a labour line's operation in the labour guide, and the guide's hours for this job (hundredths) */
  operation?: string | null
  guideHundredths?: number | null
}

/** An amount stated one way, stated the way a line wants it (the price stays the same to the minor unit). */
function statedAs(amountMinor: number, includesTax: boolean, wantTax: boolean, taxBp: number): number {
  return includesTax === wantTax ? amountMinor : restatedMinor(amountMinor, taxBp, wantTax)
}

/** A part's selling price per unit from its net price and markup, as the line states it, on the garage's ending. */
function partUnitMinor(unitNetMinor: number, markupBp: number, line: { taxIncluded: boolean; taxBp: number }, endingMinor: number | null): number {
  return withPriceEnding(sellingUnitMinor(unitNetMinor, markupBp, line.taxIncluded ? line.taxBp : null), endingMinor)
}

async function saveLine(t: Transaction, attributes: CreationAttributes<QuoteLine>): Promise<QuoteLine> {
  const line = QuoteLine.build(attributes)
  repriceLine(line)
  return line.save({ transaction: t })
}

/**
 * The place after the quote's last line. On PostgreSQL two processes can add to one quote at once, and under READ
 * COMMITTED both would read the same MAX: the quote's row is locked first (FOR UPDATE, held to commit), so the second
 * add waits and then reads the first one's line. SQLite has no row locks (Sequelize leaves `lock` out) and needs
 * none: its writes run one at a time.
 */
async function nextPosition(t: Transaction, quoteId: number): Promise<number> {
  await Quote.findOne({ where: { id: quoteId }, attributes: ['id'], transaction: t, lock: t.LOCK.UPDATE })
  const max = await QuoteLine.max<number, QuoteLine>('position', { where: { quoteId }, transaction: t })
  return (Number(max) || 0) + 1
}

/** Adds one line (and a core-deposit line for a remanufactured part). Returns the lines created. */
export async function addLine(t: Transaction, q: Quote, org: Organisation, input: NewLine): Promise<QuoteLine[]> {
  const settings = await settingsOf(org.id, t)
  const position = await nextPosition(t, q.id)
  const taxBp = input.taxBp ?? settings.taxRateBp
  const taxIncluded = input.taxIncluded ?? settings.pricesIncludeTax
  const base = { quoteId: q.id, position, taxBp, taxIncluded, recommendation: input.recommendation ?? null, reason: input.reason ?? null }
  switch (input.kind) {
    case 'part': {
      const r = await resolvePart(t, org, input.sku!)
      const fitment = await guardFit(t, q, r.part, input)
      const markupBp = input.markupBp ?? markupBpFor(settings.markupRules, { type: r.part.type, unitNetMinor: r.unitNetMinor })
      // a part fitted as a pair (discs) goes on in the fitted quantity
      const quantity = input.quantity ?? fitment?.quantity ?? 1
      const part = { partId: r.part.id, sku: r.part.sku, partType: r.part.type }
      const line = await saveLine(t, {
        ...base, ...part, kind: 'part', description: input.description || r.part.description, quantity,
        fitOverrideReason: fitment ? null : (input.override?.reason ?? null),
        unitNetMinor: r.unitNetMinor, markupBp, unitPriceMinor: partUnitMinor(r.unitNetMinor, markupBp, base, settings.partPriceEndingMinor),
      })
      if (r.coreDepositMinor <= 0) return [line]
      // the garage pays the distributor the deposit and is refunded when the old unit goes back: it absorbs the
      // deposit unless it chooses to pass it on
      const core = await saveLine(t, {
        quoteId: q.id, position, taxBp: line.taxBp, taxIncluded: false, ...part, kind: 'core_deposit', parentLineId: line.id,
        description: `Core deposit for ${r.part.sku}`, quantity, unitNetMinor: r.coreDepositMinor,
        coreCharge: settings.coreDepositsPassedOn ? 'charged' : 'absorbed',
      })
      return [line, core]
    }
    case 'labour':
      return [await saveLine(t, {
        ...base, kind: 'labour', description: input.description || 'Labour',
        hoursHundredths: hoursToHundredths(input.hours!)!, labourOperation: input.operation ?? null, guideHundredths: input.guideHundredths ?? null,
        rateMinor: input.rateMinor ?? statedAs(settings.labourRateMinor, settings.pricesIncludeTax, taxIncluded, settings.taxRateBp),
      })]
    case 'sundry':
      return [await saveLine(t, {
        ...base, kind: 'sundry', description: input.description!, quantity: input.quantity ?? 1, unitPriceMinor: input.amountMinor ?? 0,
      })]
    case 'discount':
      return [await saveLine(t, {
        ...base, kind: 'discount', recommendation: null, description: input.description || 'Discount', unitPriceMinor: -(input.amountMinor ?? 0),
      })]
  }
}

export interface LineChange {
  quantity?: number
  description?: string
  hours?: number
  amountMinor?: number
  recommendation?: Recommendation | null
  unitPriceMinor?: number
  markupBp?: number
  rateMinor?: number
  taxBp?: number
  taxIncluded?: boolean
  coreCharge?: 'charged' | 'absorbed'
  toldOwnerDeclinedRequired?: boolean
  position?: number
}

// a core deposit is taxed at its part's rate (rule 4 of shared/utils/quote-totals.ts): its rate is not set on its own
const FIELDS_BY_KIND: Record<QuoteLine['kind'], (keyof LineChange)[]> = {
  part: ['quantity', 'description', 'recommendation', 'unitPriceMinor', 'markupBp', 'taxBp', 'taxIncluded', 'toldOwnerDeclinedRequired', 'position'],
  core_deposit: ['coreCharge'],
  labour: ['description', 'hours', 'rateMinor', 'recommendation', 'taxBp', 'taxIncluded', 'toldOwnerDeclinedRequired', 'position'],
  sundry: ['quantity', 'description', 'amountMinor', 'recommendation', 'taxBp', 'taxIncluded', 'toldOwnerDeclinedRequired', 'position'],
  discount: ['description', 'amountMinor', 'taxBp', 'taxIncluded', 'position'],
}

/** 422 naming each field the line's kind does not have. */
function assertFieldsFit(line: QuoteLine, change: LineChange): void {
  const allowed = FIELDS_BY_KIND[line.kind]
  const refused = Object.keys(change).filter((k) => change[k as keyof LineChange] !== undefined && !allowed.includes(k as keyof LineChange))
  if (refused.length) {
    throw refusedInput(Object.fromEntries(refused.map((k) => [k, `A ${line.kind.replace('_', ' ')} line has no ${k}.`])))
  }
}

/**
 * Switches how a line states its price (with tax or before it). Without a new price in the same change the
 * price is restated at the line's current rate, so it stays what it was to the minor unit.
 */
function restateLine(line: QuoteLine, change: LineChange): void {
  if (change.taxIncluded === undefined || change.taxIncluded === !!line.taxIncluded) return
  const priced = [change.unitPriceMinor, change.amountMinor, change.rateMinor, change.markupBp].some((v) => v !== undefined)
  if (!priced) {
    if (line.kind === 'labour') line.rateMinor = restatedMinor(line.rateMinor ?? 0, line.taxBp, change.taxIncluded)
    else line.unitPriceMinor = restatedMinor(line.unitPriceMinor, line.taxBp, change.taxIncluded)
  }
  line.taxIncluded = change.taxIncluded
}

/** The markup a typed selling price amounts to, for the manager's eye (the price itself is what counts). */
function markupOfPrice(line: QuoteLine): number | null {
  const cost = (line.unitNetMinor ?? 0) * line.quantity
  if (!cost) return null
  const net = lineFigures(line.unitPriceMinor * line.quantity, line.taxBp, !!line.taxIncluded).netMinor
  return divRoundHalfUp((net - cost) * 10_000, cost)
}

/**
 * Applies a change to one line (its core deposit follows a part's quantity). A new markup gives the part's
 * price on the garage's price ending (`pricing`); a price typed by the manager is kept as typed.
 */
export async function changeLine(
  t: Transaction, line: QuoteLine, change: LineChange, actorUserId: number,
  pricing: Pick<EffectiveSettings, 'partPriceEndingMinor'> = { partPriceEndingMinor: null },
): Promise<void> {
  assertFieldsFit(line, change)
  restateLine(line, change)
  if (change.quantity !== undefined) line.quantity = change.quantity
  if (change.description !== undefined) line.description = change.description
  if (change.hours !== undefined) line.hoursHundredths = hoursToHundredths(change.hours)
  if (change.recommendation !== undefined) line.recommendation = change.recommendation
  if (change.taxBp !== undefined) line.taxBp = change.taxBp
  if (change.position !== undefined) line.position = change.position
  if (change.rateMinor !== undefined) line.rateMinor = change.rateMinor
  if (change.coreCharge !== undefined) line.coreCharge = change.coreCharge
  if (change.amountMinor !== undefined) line.unitPriceMinor = line.kind === 'discount' ? -change.amountMinor : change.amountMinor
  if (line.kind === 'discount' && change.amountMinor === 0) throw refusedInput({ amountMinor: 'A discount is more than 0.' })
  if (change.markupBp !== undefined) {
    line.markupBp = change.markupBp
    line.unitPriceMinor = partUnitMinor(line.unitNetMinor ?? 0, change.markupBp, { taxIncluded: !!line.taxIncluded, taxBp: line.taxBp }, pricing.partPriceEndingMinor)
  }
  if (change.unitPriceMinor !== undefined) {
    line.unitPriceMinor = change.unitPriceMinor
    line.markupBp = markupOfPrice(line)
  }
  if (change.toldOwnerDeclinedRequired !== undefined) {
    line.toldOwnerDeclinedRequired = change.toldOwnerDeclinedRequired
    line.toldOwnerRecordedByUserId = change.toldOwnerDeclinedRequired ? actorUserId : null
    line.toldOwnerRecordedAt = change.toldOwnerDeclinedRequired ? new Date() : null
  }
  repriceLine(line)
  await line.save({ transaction: t })
  if (line.kind === 'part' && (change.quantity !== undefined || change.taxBp !== undefined)) {
    // the deposit follows its part: the same number of units, taxed at the part's rate (rule 4)
    const cores = await QuoteLine.findAll({ where: { parentLineId: line.id, kind: 'core_deposit' }, transaction: t })
    for (const c of cores) {
      c.quantity = line.quantity
      c.taxBp = line.taxBp
      repriceLine(c)
      await c.save({ transaction: t })
    }
  }
}
