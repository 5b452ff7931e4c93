import { z } from 'zod'

export const EmailSchema = z.string().trim().toLowerCase().pipe(z.email({ message: 'Enter a valid e-mail address.' }))

export const SignInSchema = z.object({
  email: EmailSchema,
  password: z.string({ message: 'Enter your password.' }).min(1, 'Enter your password.').max(200),
})
export type SignInInput = z.infer<typeof SignInSchema>

/** A code from the authenticator app (6 digits) or a recovery code (16 letters and digits, dashes allowed). */
export const SecondFactorCodeSchema = z.string({ message: 'Enter the code from your authenticator app.' }).trim()
  .min(6, 'Enter the 6-digit code from your authenticator app, or a recovery code.')
  .max(40, 'That is longer than any code.')

export const MfaCodeSchema = z.strictObject({ code: SecondFactorCodeSchema })
/** Starting an enrolment: a person who already has a factor proves it with a current code first. */
export const EnrolmentStartSchema = z.strictObject({ code: SecondFactorCodeSchema.optional() })
