import { z } from 'zod'

export const EmailSchema = z.string().trim().toLowerCase().pipe(z.email({ message: 'Enter a valid e-mail address.' }))

export const SignInSchema = z.object({
  email: EmailSchema,
  password: z.string({ message: 'Enter your password.' }).min(1, 'Enter your password.').max(200),
})
export type SignInInput = z.infer<typeof SignInSchema>
