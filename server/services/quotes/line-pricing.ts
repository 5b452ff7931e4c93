/**
 * What a line costs: a part's net price captured from the prices in use (following a supersession), each kind's
 * unit price and amount under rule 1 of shared/utils/quote-totals.ts, the cap on discounts, and who may set
 * prices (managers; technicians add parts, labour and unpriced sundries).
 */
import { Op, type Transaction } from 'sequelize'
import type { Organisation } from '../../models/accounts'
import { Part, Supersession } from '../../models/catalogue'
import type { QuoteLine } from '../../models/quotes'
import { garagePrices } from '../pricing'
import { can } from '../../../shared/utils/abilities'
import { labourAmountMinor, quoteTotals } from '../../../shared/utils/quote-totals'
import type { Role } from '../../../shared/types/accounts'
import { forbidden, invalidInput, type DomainError } from '../errors'
import { linesOf, totalsInput } from './rows'

/** 422 whose summary is the first field's message (the quote page shows it above the lines). */
export function refusedInput(fields: Record<string, string>): DomainError {
  return invalidInput(fields, Object.values(fields)[0])
}

/** Works out a line's unit price and amount, as stated (before tax, or with tax when `taxIncluded`), from what is stored. */
export function repriceLine(l: QuoteLine): void {
  switch (l.kind) {
    case 'part':
    case 'sundry':
      l.amountMinor = l.unitPriceMinor * l.quantity
      break
    case 'core_deposit':
      // a deposit is always stated before tax, at its part's rate (rule 4)
      l.taxIncluded = false
      l.unitPriceMinor = l.unitNetMinor ?? 0
      l.amountMinor = l.coreCharge === 'absorbed' ? 0 : l.unitPriceMinor * l.quantity
      break
    case 'labour':
      l.quantity = 1
      l.unitPriceMinor = l.rateMinor ?? 0
      l.amountMinor = labourAmountMinor(l.hoursHundredths ?? 0, l.rateMinor ?? 0)
      break
    case 'discount':
      l.quantity = 1
      l.amountMinor = l.unitPriceMinor
      break
  }
}

export interface PartResolution { part: Part; unitNetMinor: number; coreDepositMinor: number; replacedSku: string | null }

/** The part for a SKU (following a supersession to its replacement) and the garage's current net price. */
export async function resolvePart(t: Transaction, org: Organisation, sku: string): Promise<PartResolution> {
  const wanted = sku.trim()
  let part = await Part.findOne({ where: { sku: wanted }, transaction: t })
    ?? await Part.findOne({ where: { sku: wanted.toUpperCase() }, transaction: t })
  let replacedSku: string | null = null
  if (!part) {
    const sup = await Supersession.findOne({ where: { oldSku: { [Op.in]: [wanted, wanted.toUpperCase()] } }, transaction: t })
    if (sup) {
      part = await Part.findByPk(sup.newPartId, { transaction: t })
      replacedSku = sup.oldSku
    }
  }
  if (!part) throw refusedInput({ sku: `No part with SKU "${wanted}" in the catalogue.` })
  if (part.status === 'discontinued') throw refusedInput({ sku: `${part.sku} is discontinued.` })
  const prices = await garagePrices(org, [part.sku], t)
  const price = prices.get(part.sku)
  if (!price) throw refusedInput({ sku: `${part.sku} has no price on the prices in use.` })
  return { part, unitNetMinor: price.unitNetMinor, coreDepositMinor: price.coreDepositMinor, replacedSku }
}

/** Refuses discounts larger than the rest of the quote (checked after every change to a line). */
export async function assertDiscountsFit(t: Transaction, quoteId: number): Promise<void> {
  const lines = await linesOf(quoteId, t)
  if (quoteTotals(totalsInput(lines)).discountCapped) {
    throw refusedInput({ amountMinor: 'The discounts would be larger than the rest of the quote.' })
  }
}

/** The fields of a line that set what the owner pays. */
const PRICING_FIELDS = ['unitPriceMinor', 'markupBp', 'rateMinor', 'taxBp', 'taxIncluded', 'amountMinor', 'coreCharge'] as const
type PricingChange = Partial<Record<(typeof PRICING_FIELDS)[number] | 'kind' | 'toldOwnerDeclinedRequired', unknown>>

/**
 * 403 when a role without `quotes.price` gives a discount or sets a price, markup, rate, tax rate, whether a
 * price includes tax, a sundry price or who carries a core deposit, and when one without `quotes.send` records
 * what the owner was told about a required line.
 */
export function assertMayPrice(role: Role, change: PricingChange, what = 'set prices, markups, rates or tax'): void {
  if (!can(role, 'quotes.price')) {
    if (change.kind === 'discount') throw forbidden('Only a garage manager can give a discount.')
    if (PRICING_FIELDS.some((k) => change[k] !== undefined)) throw forbidden(`Only a garage manager can ${what}.`)
  }
  if (change.toldOwnerDeclinedRequired !== undefined && !can(role, 'quotes.send')) {
    throw forbidden('Only a garage manager can record what the owner was told.')
  }
}
