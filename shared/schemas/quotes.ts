/**
 * Inputs of the quote routes and of the garage settings, used by the server routes and by the forms that send
 * them. Money is integer minor units (`…Minor`), rates and markups basis points (`…Bp`), hours a number with at
 * most two decimals. Strict objects: a field a route does not take is refused by name (no mass assignment).
 */
import { z } from 'zod'
import { QUOTE_STATUSES } from '../utils/quote-states'
import { PageQuerySchema } from './page'
import { hoursToHundredths } from '../utils/quote-totals'

const text = (max: number, label: string) =>
  z.string({ error: `${label} must be text.` }).trim().max(max, `${label} is at most ${max} characters.`)
const id = (what: string) => z.number({ error: `Choose ${what}.` }).int({ error: `Choose ${what}.` }).positive({ error: `Choose ${what}.` })
const minor = (label: string, max = 100_000_000) =>
  z.number({ error: `${label} must be an amount in minor units.` }).int(`${label} must be a whole number of minor units.`)
    .min(0, `${label} cannot be negative.`).max(max, `${label} is too large.`)
const bp = (label: string, max = 10_000) =>
  z.number({ error: `${label} must be given in basis points.` }).int(`${label} must be whole basis points.`)
    .min(0, `${label} cannot be negative.`).max(max, `${label} is at most ${max / 100} %.`)

const yesNo = z.boolean({ error: 'Say yes or no.' })

export const OwnerEmailSchema = z.string({ error: 'Enter the owner\'s e-mail address.' }).trim().toLowerCase()
  .pipe(z.email({ error: 'Enter a valid e-mail address for the owner.' }))

export const RecommendationSchema = z.enum(['required', 'advised'], { error: 'Recommendation is "required" or "advised".' })

/** POST /api/quotes */
export const QuoteCreateSchema = z.strictObject({
  vehicleId: id('the vehicle'),
  registration: text(20, 'Registration').default(''),
  odometer: text(20, 'Odometer').default(''),
  ownerName: text(120, 'Owner\'s name').min(1, 'Enter the owner\'s name.'),
  ownerEmail: OwnerEmailSchema,
  ownerPhone: text(40, 'Owner\'s phone').default(''),
  inspectionId: id('the inspection').nullish(),
  /** the garage's own record of the car (GET /api/garage/vehicles/:id) the quote is for */
  garageVehicleId: id('the vehicle record').nullish(),
})
export type QuoteCreateInput = z.input<typeof QuoteCreateSchema>

/** PATCH /api/quotes/:id (a sent quote changes through a new revision) */
export const QuoteUpdateSchema = z.strictObject({
  vehicleId: id('the vehicle').optional(),
  registration: text(20, 'Registration').optional(),
  odometer: text(20, 'Odometer').optional(),
  ownerName: text(120, 'Owner\'s name').min(1, 'Enter the owner\'s name.').optional(),
  ownerEmail: OwnerEmailSchema.optional(),
  ownerPhone: text(40, 'Owner\'s phone').optional(),
  messageToOwner: text(2000, 'The note to the owner').optional(),
  inspectionId: id('the inspection').nullable().optional(),
}).refine((v) => Object.keys(v).length > 0, { error: 'Nothing to change.' })
export type QuoteUpdateInput = z.input<typeof QuoteUpdateSchema>

/** GET /api/quotes: a page of the garage's quotes, by state (`open` = draft or sent) and registration or owner */
export const QuoteListQuerySchema = PageQuerySchema.extend({
  status: z.union([z.enum(QUOTE_STATUSES), z.literal('open'), z.literal('')], { error: 'Unknown status.' }).optional(),
  q: z.string().trim().max(60).optional(),
})
export type QuoteListQuery = z.output<typeof QuoteListQuerySchema>

/** GET /api/quotes/declined-work: a page of the garage's declined safety work, for a vehicle or a registration */
export const DeclinedWorkQuerySchema = PageQuerySchema.extend({
  registration: z.string().trim().max(20, 'A registration is at most 20 characters.').optional(),
  vehicleId: z.preprocess((v) => (v === '' ? undefined : v), z.coerce.number({ error: 'Not a vehicle number.' }).int().positive().optional()),
})
export type DeclinedWorkQuery = z.output<typeof DeclinedWorkQuerySchema>

export const QuoteParamsSchema = z.object({ id: z.coerce.number({ error: 'Not a quote number.' }).int().positive() })
export const QuoteLineParamsSchema = z.object({
  id: z.coerce.number().int().positive(),
  lineId: z.coerce.number({ error: 'Not a line number.' }).int().positive(),
})

const hours = z.number({ error: 'Hours must be a number.' }).positive('Hours must be more than 0.').max(200, 'At most 200 hours on one line.')
  .refine((h) => hoursToHundredths(h) !== null, { error: 'Hours take at most two decimals (e.g. 1.25).' })
const quantity = z.number({ error: 'Quantity must be a number.' }).int('Quantity is a whole number.').min(1, 'Quantity is at least 1.').max(999, 'Quantity is at most 999.')

/** POST /api/quotes/:id/lines */
export const QuoteLineCreateSchema = z.strictObject({
  kind: z.enum(['part', 'labour', 'sundry', 'discount'], { error: 'Kind is part, labour, sundry or discount.' }),
  sku: text(40, 'SKU').optional(),
  quantity: quantity.optional(),
  description: text(300, 'Description').optional(),
  hours: hours.optional(),
  /** sundry: price per unit; discount: the size of the discount (a positive amount taken off) */
  amountMinor: minor('Amount').optional(),
  recommendation: RecommendationSchema.nullish(),
  // pricing, managers only (the route checks): override what the garage settings would give
  markupBp: bp('Markup', 50_000).optional(),
  rateMinor: minor('Labour rate', 10_000_000).optional(),
  taxBp: bp('Tax rate').optional(),
  /** the prices given (amountMinor, rateMinor) and worked out include tax; default: the garage's setting */
  taxIncluded: yesNo.optional(),
  /** answers to the vehicle's option questions that decide whether the part fits */
  answers: z.record(z.string().max(60), text(60, 'Answer')).optional(),
  /** managers: put on a part the catalogue does not fit to the vehicle, saying why (shown to the garage, never the owner) */
  override: z.strictObject({ reason: text(300, 'Reason').min(3, 'Say why the part goes on although it does not fit.') }, { error: 'Say why the part goes on although it does not fit.' }).optional(),
}).superRefine((v, ctx) => {
  const need = (field: string, message: string) => ctx.addIssue({ code: 'custom', path: [field], message })
  if (v.kind === 'part' && !v.sku) need('sku', 'Choose a part (SKU).')
  if (v.kind === 'labour' && v.hours === undefined) need('hours', 'Enter the hours.')
  if (v.kind === 'sundry' && !v.description) need('description', 'Describe the item.')
  if (v.kind === 'discount') {
    if (!v.amountMinor) need('amountMinor', 'Enter the discount (more than 0).')
    if (v.recommendation) need('recommendation', 'A discount is not a recommendation.')
  }
  if (v.kind !== 'part' && v.sku) need('sku', 'Only part lines have a SKU.')
  if (v.kind !== 'labour' && v.hours !== undefined) need('hours', 'Only labour lines have hours.')
  if (v.kind === 'part' && v.amountMinor !== undefined) need('amountMinor', 'A part\'s price comes from the prices in use and the markup.')
  if (v.kind !== 'part' && v.override) need('override', 'Only a part line can override the fitment check.')
})
export type QuoteLineCreateInput = z.input<typeof QuoteLineCreateSchema>

/** PATCH /api/quotes/:id/lines/:lineId (fields that do not apply to the line's kind are refused with 422) */
export const QuoteLineUpdateSchema = z.strictObject({
  quantity: quantity.optional(),
  description: text(300, 'Description').min(1, 'Describe the line.').optional(),
  hours: hours.optional(),
  amountMinor: minor('Amount').optional(),
  recommendation: RecommendationSchema.nullable().optional(),
  // pricing (managers)
  unitPriceMinor: minor('Selling price').optional(),
  markupBp: bp('Markup', 50_000).optional(),
  rateMinor: minor('Labour rate', 10_000_000).optional(),
  taxBp: bp('Tax rate').optional(),
  /** the line's price includes tax (a price given with this change is read that way; without one the price is restated) */
  taxIncluded: yesNo.optional(),
  /** absorbed: the garage carries the deposit (the default); charged: passed on to the owner */
  coreCharge: z.enum(['charged', 'absorbed'], { error: 'A core deposit is charged to the owner or absorbed by the garage.' }).optional(),
  /** the garage records that it talked the owner through what declining a required line means (managers) */
  toldOwnerDeclinedRequired: yesNo.optional(),
  position: z.number().int().min(0).max(10_000).optional(),
}).refine((v) => Object.keys(v).length > 0, { error: 'Nothing to change.' })
export type QuoteLineUpdateInput = z.input<typeof QuoteLineUpdateSchema>

/** POST /api/quotes/:id/lines/from-inspection */
export const FromInspectionSchema = z.strictObject({
  inspectionId: id('the inspection').optional(),
  /** per recommendation (index in the inspection's recommendedParts) the SKU to use; default: the first certain fit */
  choices: z.array(z.strictObject({ index: z.number().int().min(0).max(100), sku: text(40, 'SKU').nullable() })).max(100).optional(),
  /** labour hours to add per recommendation with parts; none when absent */
  labourHours: hours.optional(),
})
export type FromInspectionInput = z.input<typeof FromInspectionSchema>

/** POST /api/quotes/:id/send */
export const QuoteSendSchema = z.strictObject({ message: text(2000, 'The note to the owner').optional() })

/** The owner's signed acknowledgement that goes with declining a line marked required. */
export const DeclineAcknowledgementSchema = z.strictObject({
  understood: z.literal(true, { error: 'Tick to confirm you have read what declining this work means.' }),
  signedName: text(120, 'Your name').min(2, 'Type your name to sign that you decline this work.'),
}, { error: 'Read what declining this work means, tick and sign.' })

/** POST /api/quote-links/:token/decision */
export const QuoteDecisionSchema = z.strictObject({
  lines: z.array(z.strictObject({
    id: z.number({ error: 'Line id must be a number.' }).int().positive(),
    approved: z.boolean({ error: 'Approve or decline the line.' }),
    /** with declining a required line, and only then */
    acknowledgement: DeclineAcknowledgementSchema.optional(),
  }), { error: 'Choose approve or decline for each line.' }).min(1, 'Choose approve or decline for each line.').max(500),
  signedName: text(120, 'Your name').min(2, 'Type your name to sign.'),
})
export type QuoteDecisionInput = z.input<typeof QuoteDecisionSchema>

export const QuoteTokenParamsSchema = z.object({
  // 32 random bytes in base64url are 43 characters; anything else cannot be one of ours
  token: z.string().regex(/^[A-Za-z0-9_-]{43}$/, 'this link is not valid'),
})

// ---- garage settings ----

export const MarkupRulesSchema = z.discriminatedUnion('mode', [
  z.strictObject({
    mode: z.literal('by_type'),
    defaultBp: bp('Default markup', 50_000),
    byType: z.record(z.string().regex(/^[a-z_]{2,24}$/, 'Unknown part type.'), bp('Markup', 50_000)),
  }),
  z.strictObject({
    mode: z.literal('by_cost'),
    bands: z.array(z.strictObject({ upToMinor: minor('Band limit').nullable(), bp: bp('Markup', 50_000) }))
      .min(1, 'Give at least one band.').max(12, 'At most 12 bands.')
      .superRefine((bands, ctx) => {
        const open = bands.filter((b) => b.upToMinor === null).length
        if (open !== 1) ctx.addIssue({ code: 'custom', message: 'Exactly one band has no upper limit (the last).' })
        const limits = bands.map((b) => b.upToMinor).filter((u): u is number => u !== null)
        if (new Set(limits).size !== limits.length) ctx.addIssue({ code: 'custom', message: 'Two bands share an upper limit.' })
      }),
  }),
], { error: 'Markup is by part type or by cost band.' })

/** PATCH /api/garage/settings */
export const GarageSettingsUpdateSchema = z.strictObject({
  labourRateMinor: minor('Labour rate', 10_000_000).optional(),
  markupRules: MarkupRulesSchema.optional(),
  taxRateBp: bp('Tax rate').optional(),
  /** show and enter prices with tax included (the labour rate too) */
  pricesIncludeTax: yesNo.optional(),
  /** part prices after markup move up to this ending in minor units (99: x.99; 0: whole units); null: none */
  partPriceEndingMinor: z.number({ error: 'A price ending is a number of minor units from 0 to 99.' }).int('A price ending is whole minor units.')
    .min(0, 'A price ending is 0 to 99.').max(99, 'A price ending is 0 to 99.').nullable().optional(),
  /** charge core deposits to the owner by default (otherwise the garage absorbs them) */
  coreDepositsPassedOn: yesNo.optional(),
  quoteValidityDays: z.number({ error: 'Validity is a number of days.' }).int('Validity is whole days.').min(1, 'Valid for at least 1 day.').max(365, 'At most 365 days.').optional(),
  quoteTerms: text(4000, 'Terms').optional(),
  techniciansSeePrices: yesNo.optional(),
}).refine((v) => Object.keys(v).length > 0, { error: 'Nothing to change.' })
export type GarageSettingsUpdateInput = z.input<typeof GarageSettingsUpdateSchema>

/** Logo files: what the upload accepts (checked again on the bytes, not the name). */
export const LOGO_LIMITS = { maxBytes: 2 * 1024 * 1024, types: ['image/png', 'image/jpeg', 'image/svg+xml'] as const }
