/**
 * Inputs of a garage's vehicle register (GET/POST /api/garage/vehicles, GET/PATCH /api/garage/vehicles/:id,
 * GET /api/garage/customers, the follow-up settings), used by the routes and the forms alike. A registration or
 * VIN is normalised (capitals, no spaces) and refused beside its field when malformed, so nothing malformed is
 * stored. Strict objects: a field a route does not take is refused by name.
 */
import { z } from 'zod'
import { PageQuerySchema } from './page'
import { QualifiersSchema } from './catalogue/fitments'
import { normaliseVin, vinShapeProblem } from '../utils/vehicles/vin'
import { normaliseRegistration, registrationProblem } from '../utils/vehicles/registration'

const text = (max: number, label: string) =>
  z.string({ error: `${label} must be text.` }).trim().max(max, `${label} is at most ${max} characters.`)

/** A registration mark, normalised; refused when it cannot be one. */
export const RegistrationSchema = z.string({ error: 'The registration must be text.' })
  .transform(normaliseRegistration)
  .superRefine((v, ctx) => {
    const problem = registrationProblem(v)
    if (problem) ctx.addIssue({ code: 'custom', message: problem })
  })

/** A VIN of the ISO 3779 shape, normalised (the check digit is judged by the service: it depends on the region). */
export const VinSchema = z.string({ error: 'The VIN must be text.' })
  .transform(normaliseVin)
  .superRefine((v, ctx) => {
    const problem = vinShapeProblem(v)
    if (problem) ctx.addIssue({ code: 'custom', message: problem })
  })

/** An empty string clears an optional identifier. */
const optionalId = <T extends z.ZodType>(schema: T) => z.union([z.literal('').transform(() => null), z.null(), schema]).optional()

const EmailSchema = z.string({ error: 'The e-mail address must be text.' }).trim().toLowerCase()
  .pipe(z.union([z.literal(''), z.email({ error: 'Enter a valid e-mail address.' })]))

export const ConsentSourceSchema = text(120, 'How consent was given')

/** A new customer (the owner) given with a vehicle, or changed on their own. */
export const CustomerInputSchema = z.strictObject({
  name: text(120, 'The owner\'s name').min(1, 'Enter the owner\'s name.'),
  email: EmailSchema.default(''),
  phone: text(40, 'The phone number').default(''),
  /** consent to reminders of declined work by e-mail, with how it was given ("asked at the counter") */
  reminderConsent: z.boolean({ error: 'Say yes or no.' }).default(false),
  consentSource: ConsentSourceSchema.default(''),
  notes: text(2000, 'Notes').default(''),
}).refine((c) => !c.reminderConsent || c.email, { path: ['email'], error: 'Reminders go by e-mail: enter the owner\'s e-mail address.' })
  .refine((c) => !c.reminderConsent || c.consentSource, { path: ['consentSource'], error: 'Say how the owner gave consent (e.g. asked at the counter).' })
export type CustomerInput = z.input<typeof CustomerInputSchema>
export type CustomerDetails = z.output<typeof CustomerInputSchema>

/** A build month, 'YYYY-MM'. */
export const BuildMonthSchema = z.string({ error: 'The build month must be text.' }).trim()
  .regex(/^(19|20)[0-9]{2}-(0[1-9]|1[0-2])$/, 'Give the build month as year and month, e.g. 2016-03.')

const OdometerSchema = z.strictObject({
  reading: z.number({ error: 'The odometer reading must be a number.' }).int('The odometer reading is a whole number.')
    .min(0, 'The odometer reading cannot be negative.').max(2_000_000, 'That odometer reading is too large.'),
  unit: z.enum(['mi', 'km'], { error: 'The unit is mi or km.' }),
  readOn: z.iso.date({ error: 'Give the day it was read, e.g. 2026-03-14.' }).optional(),
})
export type OdometerInput = z.input<typeof OdometerSchema>

/** POST /api/garage/vehicles: at least a registration or a VIN; the owner as an existing customer or a new one. */
export const GarageVehicleCreateSchema = z.strictObject({
  registration: optionalId(RegistrationSchema),
  vin: optionalId(VinSchema),
  vehicleId: z.number({ error: 'Choose the vehicle.' }).int().positive({ error: 'Choose the vehicle.' }).nullish(),
  answers: QualifiersSchema.optional(),
  built: optionalId(BuildMonthSchema),
  customerId: z.number({ error: 'Choose the owner.' }).int().positive({ error: 'Choose the owner.' }).nullish(),
  customer: CustomerInputSchema.optional(),
  odometer: OdometerSchema.optional(),
  notes: text(2000, 'Notes').optional(),
}).refine((v) => v.registration || v.vin, { path: ['registration'], error: 'Enter the registration or the VIN.' })
  .refine((v) => !(v.customerId && v.customer), { path: ['customer'], error: 'Choose an existing owner or enter a new one, not both.' })
export type GarageVehicleCreateInput = z.input<typeof GarageVehicleCreateSchema>
export type GarageVehicleCreate = z.output<typeof GarageVehicleCreateSchema>

/** PATCH /api/garage/vehicles/:id: any of the fields; `customer` changes the owner's own details. */
export const GarageVehicleUpdateSchema = z.strictObject({
  registration: optionalId(RegistrationSchema),
  vin: optionalId(VinSchema),
  vehicleId: z.number({ error: 'Choose the vehicle.' }).int().positive({ error: 'Choose the vehicle.' }).nullable().optional(),
  answers: QualifiersSchema.optional(),
  built: optionalId(BuildMonthSchema),
  customerId: z.number({ error: 'Choose the owner.' }).int().positive({ error: 'Choose the owner.' }).nullable().optional(),
  customer: CustomerInputSchema.optional(),
  odometer: OdometerSchema.optional(),
  notes: text(2000, 'Notes').optional(),
}).refine((v) => Object.keys(v).length > 0, { error: 'Nothing to change.' })
export type GarageVehicleUpdateInput = z.input<typeof GarageVehicleUpdateSchema>
export type GarageVehicleUpdate = z.output<typeof GarageVehicleUpdateSchema>

/** GET /api/garage/vehicles?q= : registration, VIN (or its end) or the owner's name. */
export const GarageVehicleListQuerySchema = PageQuerySchema.extend({
  q: z.string().trim().max(60, 'Search with at most 60 characters.').optional(),
})
export type GarageVehicleListQuery = z.output<typeof GarageVehicleListQuerySchema>

/** GET /api/garage/customers?q= */
export const GarageCustomerListQuerySchema = GarageVehicleListQuerySchema
export type GarageCustomerListQuery = GarageVehicleListQuery

export const IdParamsSchema = z.object({ id: z.coerce.number({ error: 'Not a record number.' }).int().positive() })

/** GET /api/vin/:vin */
export const VinParamsSchema = z.object({ vin: VinSchema })
/** GET /api/registrations/:registration */
export const RegistrationParamsSchema = z.object({ registration: RegistrationSchema })

/** PATCH /api/garage/follow-ups/settings */
export const FollowUpSettingsSchema = z.strictObject({
  advisedWeeks: z.number({ error: 'Give a number of weeks.' }).int('Whole weeks.').min(1, 'At least 1 week.').max(104, 'At most 104 weeks.').optional(),
  requiredWeeks: z.number({ error: 'Give a number of weeks.' }).int('Whole weeks.').min(1, 'At least 1 week.').max(104, 'At most 104 weeks.').optional(),
}).refine((v) => Object.keys(v).length > 0, { error: 'Nothing to change.' })
export type FollowUpSettingsInput = z.input<typeof FollowUpSettingsSchema>

/** GET /api/garage/follow-ups */
export const FollowUpListQuerySchema = PageQuerySchema.extend({
  status: z.enum(['due', 'scheduled', 'sent', 'held', 'stopped', 'all'], { error: 'Unknown state.' }).default('due'),
})
export type FollowUpListQuery = z.output<typeof FollowUpListQuerySchema>

export const UnsubscribeParamsSchema = z.object({ token: z.string().regex(/^[A-Za-z0-9_-]{20,100}$/, 'This link is not valid.') })
