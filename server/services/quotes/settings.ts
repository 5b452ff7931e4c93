/**
 * A garage's quoting settings (labour rate, markup rules, tax and whether prices are shown with it, a price
 * ending for parts, who carries core deposits, validity, terms, logo) with the defaults that hold until its
 * manager saves some. Reading never writes; the row is made on the first save.
 */
import type { Transaction } from 'sequelize'
import { GarageSettings } from '../../models/quotes'
import { DEFAULT_MARKUP_RULES, type MarkupRules } from '../../../shared/utils/quote-markup'

export const DEFAULT_QUOTE_TERMS = [
  'Prices include the parts and labour listed; work not listed is quoted separately before it is done.',
  'Old parts are kept for you to see on request, except units returned to the supplier for their core deposit.',
  'An exchange deposit charged to you is refunded only when our supplier accepts the old unit back.',
].join('\n')

export interface EffectiveSettings {
  /** per hour, stated as the garage states its prices (with tax when `pricesIncludeTax`) */
  labourRateMinor: number
  markupRules: MarkupRules
  taxRateBp: number
  /** the garage shows and enters prices with tax included: new lines are stated with tax */
  pricesIncludeTax: boolean
  /** part prices after markup end on this many minor units (99 -> x.99), or null */
  partPriceEndingMinor: number | null
  /** core deposits are charged to the owner by default; otherwise the garage absorbs them */
  coreDepositsPassedOn: boolean
  quoteValidityDays: number
  quoteTerms: string
  logoFile: string | null
  logoMime: string | null
  logoUpdatedAt: Date | null
}

export const DEFAULT_SETTINGS: EffectiveSettings = {
  labourRateMinor: 0,
  markupRules: DEFAULT_MARKUP_RULES,
  taxRateBp: 2000,
  pricesIncludeTax: false,
  partPriceEndingMinor: null,
  coreDepositsPassedOn: false,
  quoteValidityDays: 30,
  quoteTerms: DEFAULT_QUOTE_TERMS,
  logoFile: null,
  logoMime: null,
  logoUpdatedAt: null,
}

/** The garage's settings, or the defaults while its manager has not saved any. */
export async function settingsOf(organisationId: number, t?: Transaction): Promise<EffectiveSettings> {
  const row = await GarageSettings.findOne({ where: { organisationId }, transaction: t })
  if (!row) return { ...DEFAULT_SETTINGS }
  return {
    labourRateMinor: row.labourRateMinor,
    markupRules: row.markupRules ?? DEFAULT_MARKUP_RULES,
    taxRateBp: row.taxRateBp,
    pricesIncludeTax: !!row.pricesIncludeTax,
    partPriceEndingMinor: row.partPriceEnding ?? null,
    coreDepositsPassedOn: !!row.coreDepositsPassedOn,
    quoteValidityDays: row.quoteValidityDays,
    quoteTerms: row.quoteTerms ?? '',
    logoFile: row.logoFile ?? null,
    logoMime: row.logoMime ?? null,
    logoUpdatedAt: row.logoUpdatedAt ?? null,
  }
}

/** The settings row, created with the defaults on first save. */
export async function settingsRowFor(t: Transaction, organisationId: number): Promise<GarageSettings> {
  const existing = await GarageSettings.findOne({ where: { organisationId }, transaction: t })
  if (existing) return existing
  const d = DEFAULT_SETTINGS
  return GarageSettings.create({
    organisationId, labourRateMinor: d.labourRateMinor, markupRules: d.markupRules,
    taxRateBp: d.taxRateBp, quoteValidityDays: d.quoteValidityDays, quoteTerms: d.quoteTerms,
  }, { transaction: t })
}
