import { z } from 'zod'
import { PageQuerySchema } from './page'

/** POST /api/admin/trade-accounts/:id/stop-lift: lift an account stop for a number of days, saying why. */
export const StopLiftSchema = z.object({
  reason: z.string({ error: 'Say why the stop is lifted.' }).trim().min(5, 'Say why the stop is lifted (at least 5 characters).')
    .max(300, 'The reason is at most 300 characters.'),
  days: z.number({ error: 'Enter for how many days.' }).int('Enter whole days.').min(1, 'Lift the stop for at least 1 day.'),
}).strict()
export type StopLiftInput = z.infer<typeof StopLiftSchema>

/** POST /api/statement/card-payment: pay part or all of what is owed on the trade account by card. */
export const AccountCardPaymentSchema = z.object({
  amountMinor: z.number({ error: 'Enter the amount to pay.' }).int('Enter the amount in pence (a whole number).').positive('The amount must be more than zero.'),
}).strict()
export type AccountCardPaymentInput = z.infer<typeof AccountCardPaymentSchema>

/** GET /api/admin/account-reminders: the e-mails about money owed, newest first, optionally one garage's or one kind. */
export const AccountReminderListQuerySchema = PageQuerySchema.extend({
  garageId: z.preprocess((v) => (v === '' ? undefined : v), z.coerce.number({ error: 'Choose a garage.' }).int().positive('Choose a garage.').optional()),
  kind: z.preprocess((v) => (v === '' ? undefined : v), z.enum(['statement', 'overdue'], { error: 'Choose monthly statements or overdue reminders.' }).optional()),
})
export type AccountReminderListQuery = z.infer<typeof AccountReminderListQuerySchema>
