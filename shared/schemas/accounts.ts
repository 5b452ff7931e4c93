/**
 * Inputs of the trade-account flows (application, decisions, terms, tiers, staff, profile, links), used by
 * the server routes and by the forms that send them. Messages are written for the person filling the form.
 */
import { z } from 'zod'
import { EmailSchema } from './auth'
import { PageQuerySchema } from './page'
import { ROLES } from '../types/accounts'

const text = (what: string, min: number, max: number) =>
  z.string({ message: `Enter ${what}.` }).trim()
    .min(1, `Enter ${what}.`)
    .min(min, `${what[0]!.toUpperCase()}${what.slice(1)} looks too short.`)
    .max(max, `Keep ${what} under ${max + 1} characters.`)

/** Our password policy (ASVS: length, no composition rules): 10 to 128 characters. */
export const PasswordSchema = z.string({ message: 'Choose a password of at least 10 characters.' })
  .min(10, 'Use at least 10 characters.')
  .max(128, 'Use at most 128 characters.')

export const PhoneSchema = text('a phone number', 6, 40)
  .regex(/^[0-9+()\-. ]+$/, 'Use digits, spaces and + ( ) - only.')

export const PersonNameSchema = text('a name', 2, 120)

// ---------------------------------------------------------------- application

/**
 * The text fields of `POST /api/trade-applications` (multipart); the file travels in the field `proof`. Strict: any
 * other field is refused by name.
 */
export const TradeApplicationSchema = z.strictObject({
  businessName: text('the business name', 2, 160),
  tradingAddress: text('the trading address', 8, 500),
  taxNumber: text('the tax or VAT number', 4, 40),
  contactName: text('the contact name', 2, 120),
  phone: PhoneSchema,
  email: z.string({ message: 'Enter an e-mail address.' }).pipe(EmailSchema),
  password: PasswordSchema,
})
export type TradeApplicationInput = z.infer<typeof TradeApplicationSchema>

export const PROOF_FIELD = 'proof'
export const PROOF_MAX_BYTES = 10 * 1024 * 1024
/** Accepted proof-of-trade documents: detected type -> file name extensions that may carry it. */
export const PROOF_TYPES: Record<string, readonly string[]> = {
  'application/pdf': ['pdf'],
  'image/jpeg': ['jpg', 'jpeg'],
  'image/png': ['png'],
}
export const PROOF_ACCEPT = '.pdf,.jpg,.jpeg,.png,application/pdf,image/jpeg,image/png'

// ---------------------------------------------------------------- lists

export const GARAGE_STATUSES = ['pending', 'approved', 'rejected', 'suspended'] as const
export const GARAGE_SORTS = ['submitted', '-submitted', 'name', '-name', 'decided', '-decided'] as const

/** Query of the garage lists (applications queue, trade accounts): filter, search, sort and page on the server. */
export const TradeAccountListQuerySchema = PageQuerySchema.extend({
  status: z.enum([...GARAGE_STATUSES, 'all'], { message: 'Choose a status from the list.' }).optional(),
  q: z.string().trim().max(100, 'Keep the search under 100 characters.').optional(),
  sort: z.enum(GARAGE_SORTS, { message: 'Choose a sort order from the list.' }).optional(),
})
export type TradeAccountListQuery = z.infer<typeof TradeAccountListQuerySchema>

export const IdParamSchema = z.object({ id: z.coerce.number({ message: 'Not a valid id.' }).int().positive('Not a valid id.') })

// ---------------------------------------------------------------- decisions and terms

const money = z.number({ message: 'Enter an amount.' }).int('Use whole minor units.').min(0, 'The amount cannot be negative.').max(100_000_000_00, 'That amount is too large.')
const days = z.number({ message: 'Enter the days to pay.' }).int('Use whole days.').min(1, 'At least 1 day.').max(120, 'At most 120 days.')
export const PAYMENT_TERMS = ['card', 'account'] as const

/**
 * Terms must agree with each other: `account` needs a credit limit and days to pay; `card` has neither. Field ->
 * message for each disagreement; the server checks the terms an account ends up with by the same rule.
 */
export function termsDisagreements(v: { terms: string; creditLimitMinor?: number; paymentDays?: number }): Record<string, string> {
  const out: Record<string, string> = {}
  if (v.terms === 'account') {
    if (!v.creditLimitMinor) out.creditLimitMinor = 'A trade account needs a credit limit above zero.'
    if (!v.paymentDays) out.paymentDays = 'A trade account needs the days to pay.'
  }
  if (v.terms === 'card') {
    if (v.creditLimitMinor) out.creditLimitMinor = 'Card-only trade accounts have no credit limit.'
    if (v.paymentDays) out.paymentDays = 'Card-only trade accounts have no days to pay.'
  }
  return out
}

function termsProblems(v: { terms: string; creditLimitMinor?: number; paymentDays?: number }, ctx: z.RefinementCtx) {
  for (const [path, message] of Object.entries(termsDisagreements(v))) ctx.addIssue({ code: 'custom', path: [path], message })
}

export const DecisionSchema = z.discriminatedUnion('decision', [
  z.strictObject({
    decision: z.literal('approve'),
    tierId: z.number({ message: 'Choose a discount tier.' }).int().positive('Choose a discount tier.'),
    /** the branch that supplies the garage's orders (required: without one it could not order) */
    homeBranchId: z.number({ message: 'Choose the garage\'s home branch.' }).int().positive('Choose the garage\'s home branch.'),
    terms: z.enum(PAYMENT_TERMS, { message: 'Choose card or trade account.' }),
    creditLimitMinor: money.optional(),
    paymentDays: days.optional(),
    reason: z.string().trim().max(1000, 'Keep the note under 1000 characters.').optional(),
  }).superRefine(termsProblems),
  z.strictObject({
    decision: z.literal('reject'),
    reason: z.string({ message: 'Say why the application is rejected.' }).trim()
      .min(5, 'Say why the application is rejected (the garage reads this).').max(1000, 'Keep the reason under 1000 characters.'),
  }),
], { message: 'Choose approve or reject.' })
export type DecisionInput = z.infer<typeof DecisionSchema>

/** `PATCH /api/admin/trade-accounts/:id`: change tier and/or terms of an approved or suspended trade account. */
export const TradeTermsSchema = z.strictObject({
  tierId: z.number({ message: 'Choose a discount tier.' }).int().positive('Choose a discount tier.').optional(),
  terms: z.enum(PAYMENT_TERMS, { message: 'Choose card or trade account.' }).optional(),
  creditLimitMinor: money.optional(),
  paymentDays: days.optional(),
}).refine((v) => Object.keys(v).length > 0, { message: 'Change at least one of tier or terms.' })
export type TradeTermsInput = z.infer<typeof TradeTermsSchema>

export const SuspendSchema = z.strictObject({
  reason: z.string({ message: 'Say why the trade account is suspended.' }).trim()
    .min(5, 'Say why the trade account is suspended (the garage reads this).').max(1000, 'Keep the reason under 1000 characters.'),
})
export const ReactivateSchema = z.strictObject({
  note: z.string().trim().max(1000, 'Keep the note under 1000 characters.').optional(),
})

// ---------------------------------------------------------------- tiers

/** Percent with at most two decimals (12.5 -> 1250 basis points). */
export const PercentSchema = z.number({ message: 'Enter a percentage.' })
  .min(0, 'The discount cannot be negative.').max(100, 'The discount cannot exceed 100 %.')
  .refine((p) => Math.abs(p * 100 - Math.round(p * 100)) < 1e-6, 'Use at most two decimal places.')

export function percentToBp(percent: number): number {
  return Math.round(percent * 100)
}

export const TierSchema = z.strictObject({
  name: text('a tier name', 2, 60),
  percent: PercentSchema,
})
export const TierPatchSchema = TierSchema.partial().refine((v) => Object.keys(v).length > 0, { message: 'Change the name or the percentage.' })

// ---------------------------------------------------------------- people

export const ForgotPasswordSchema = z.object({ email: z.string({ message: 'Enter your e-mail address.' }).pipe(EmailSchema) })

const TokenSchema = z.string({ message: 'This link is incomplete.' }).trim().min(20, 'This link is incomplete.').max(200)
export const TokenParamSchema = z.object({ token: TokenSchema })

export const ResetPasswordSchema = z.object({ token: TokenSchema, password: PasswordSchema })
export const AcceptInvitationSchema = z.object({ token: TokenSchema, password: PasswordSchema, name: PersonNameSchema.optional() })

/** What a person may change about themselves. Strict: `role`, `status`, money fields… are refused (422). */
export const ProfileSchema = z.strictObject({
  name: PersonNameSchema.optional(),
  phone: z.union([z.literal(''), PhoneSchema]).optional(),
}).refine((v) => Object.keys(v).length > 0, { message: 'Nothing to change.' })
export type ProfileInput = z.infer<typeof ProfileSchema>

export const PasswordChangeSchema = z.strictObject({
  currentPassword: z.string({ message: 'Enter your current password.' }).min(1, 'Enter your current password.').max(200),
  newPassword: PasswordSchema,
})

export const StaffRoleSchema = z.enum(ROLES, { message: 'Choose a role from the list.' })
export const InviteSchema = z.strictObject({
  email: z.string({ message: 'Enter an e-mail address.' }).pipe(EmailSchema),
  name: PersonNameSchema,
  role: StaffRoleSchema,
})
export const StaffPatchSchema = z.strictObject({ role: StaffRoleSchema })
