/**
 * Writing lines, inside the caller's write transaction: adding one (a part captures its net price and the
 * garage's markup now, and brings its core deposit), and changing one field by field as its kind allows (a
 * part's core deposit follows its quantity). Prices are worked out by repriceLine, never taken from the input.
 */
import type { CreationAttributes, Transaction } from 'sequelize'
import type { Organisation } from '../../models/accounts'
import { QuoteLine, type Quote } from '../../models/quotes'
import { markupBpFor } from '../../../shared/utils/quote-markup'
import { hoursToHundredths, sellingUnitMinor } from '../../../shared/utils/quote-totals'
import { divRoundHalfUp } from '../../../shared/utils/money'
import type { Recommendation } from '../../../shared/types/quotes'
import { refusedInput, repriceLine, resolvePart } from './line-pricing'
import { settingsOf } from './settings'

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
}

async function saveLine(t: Transaction, attributes: CreationAttributes<QuoteLine>): Promise<QuoteLine> {
  const line = QuoteLine.build(attributes)
  repriceLine(line)
  return line.save({ transaction: t })
}

async function nextPosition(t: Transaction, quoteId: number): Promise<number> {
  const max = await QuoteLine.max<number, QuoteLine>('position', { where: { quoteId }, transaction: t })
  return (Number(max) || 0) + 1
}

/** Adds one line (and a core-deposit line for a remanufactured part). Returns the lines created. */
export async function addLine(t: Transaction, q: Quote, org: Organisation, input: NewLine): Promise<QuoteLine[]> {
  const settings = await settingsOf(org.id, t)
  const position = await nextPosition(t, q.id)
  const taxBp = input.taxBp ?? settings.taxRateBp
  const base = { quoteId: q.id, position, taxBp, recommendation: input.recommendation ?? null, reason: input.reason ?? null }
  switch (input.kind) {
    case 'part': {
      const r = await resolvePart(t, org, input.sku!)
      const markupBp = input.markupBp ?? markupBpFor(settings.markupRules, { type: r.part.type, unitNetMinor: r.unitNetMinor })
      const quantity = input.quantity ?? 1
      const part = { partId: r.part.id, sku: r.part.sku, partType: r.part.type }
      const line = await saveLine(t, {
        ...base, ...part, kind: 'part', description: input.description || r.part.description, quantity,
        unitNetMinor: r.unitNetMinor, markupBp, unitPriceMinor: sellingUnitMinor(r.unitNetMinor, markupBp),
      })
      if (r.coreDepositMinor <= 0) return [line]
      const core = await saveLine(t, {
        quoteId: q.id, position, taxBp, ...part, kind: 'core_deposit', parentLineId: line.id,
        description: `Core deposit for ${r.part.sku} (refunded when the old unit goes back)`,
        quantity, unitNetMinor: r.coreDepositMinor, coreCharge: 'charged',
      })
      return [line, core]
    }
    case 'labour':
      return [await saveLine(t, {
        ...base, kind: 'labour', description: input.description || 'Labour',
        hoursHundredths: hoursToHundredths(input.hours!)!, rateMinor: input.rateMinor ?? settings.labourRateMinor,
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
  coreCharge?: 'charged' | 'absorbed'
  toldOwnerDeclinedRequired?: boolean
  position?: number
}

const FIELDS_BY_KIND: Record<QuoteLine['kind'], (keyof LineChange)[]> = {
  part: ['quantity', 'description', 'recommendation', 'unitPriceMinor', 'markupBp', 'taxBp', 'toldOwnerDeclinedRequired', 'position'],
  core_deposit: ['coreCharge', 'taxBp'],
  labour: ['description', 'hours', 'rateMinor', 'recommendation', 'taxBp', 'toldOwnerDeclinedRequired', 'position'],
  sundry: ['quantity', 'description', 'amountMinor', 'recommendation', 'taxBp', 'toldOwnerDeclinedRequired', 'position'],
  discount: ['description', 'amountMinor', 'taxBp', 'position'],
}

/** 422 naming each field the line's kind does not have. */
function assertFieldsFit(line: QuoteLine, change: LineChange): void {
  const allowed = FIELDS_BY_KIND[line.kind]
  const refused = Object.keys(change).filter((k) => change[k as keyof LineChange] !== undefined && !allowed.includes(k as keyof LineChange))
  if (refused.length) {
    throw refusedInput(Object.fromEntries(refused.map((k) => [k, `A ${line.kind.replace('_', ' ')} line has no ${k}.`])))
  }
}

/** Applies a change to one line (its core deposit follows a part's quantity). */
export async function changeLine(t: Transaction, line: QuoteLine, change: LineChange, actorUserId: number): Promise<void> {
  assertFieldsFit(line, change)
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
    line.unitPriceMinor = sellingUnitMinor(line.unitNetMinor ?? 0, change.markupBp)
  }
  if (change.unitPriceMinor !== undefined) {
    line.unitPriceMinor = change.unitPriceMinor
    // the markup this price amounts to, for the manager's eye (the price itself is what counts)
    line.markupBp = line.unitNetMinor ? divRoundHalfUp((change.unitPriceMinor - line.unitNetMinor) * 10_000, line.unitNetMinor) : null
  }
  if (change.toldOwnerDeclinedRequired !== undefined) {
    line.toldOwnerDeclinedRequired = change.toldOwnerDeclinedRequired
    line.toldOwnerRecordedByUserId = change.toldOwnerDeclinedRequired ? actorUserId : null
    line.toldOwnerRecordedAt = change.toldOwnerDeclinedRequired ? new Date() : null
  }
  repriceLine(line)
  await line.save({ transaction: t })
  if (line.kind === 'part' && change.quantity !== undefined) {
    const cores = await QuoteLine.findAll({ where: { parentLineId: line.id, kind: 'core_deposit' }, transaction: t })
    for (const c of cores) {
      c.quantity = line.quantity
      repriceLine(c)
      await c.save({ transaction: t })
    }
  }
}
