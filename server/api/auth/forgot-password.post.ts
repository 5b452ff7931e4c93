/**
 * POST /api/auth/forgot-password { email } -> 202 { message } — the same answer and about the same time
 * whether or not the address has an account (no account enumeration). For an active account a single-use
 * link valid for one hour is e-mailed; the work happens after the answer is sent. Requests are quietly
 * capped per address and e-mail so the form cannot flood an inbox.
 */
import { ForgotPasswordSchema } from '#shared/schemas/accounts'
import { User } from '../../models/accounts'
import { issueToken } from '../../services/tokens'
import { accountMail } from '../../services/account-mail'
import { mayRequestReset } from '../../services/throttle'

const ANSWER = 'If an account uses that e-mail address, a link to choose a new password is on its way. It works once, for one hour.'

async function sendLink(email: string): Promise<void> {
  const user = await User.findOne({ where: { email, status: 'active' } })
  if (!user || !user.passwordHash) return
  const token = await withWrite((t) => issueToken(t, user.id, 'reset'))
  await sendMail({ to: user.email, ...accountMail.resetLink({ name: user.name, url: appLink(`/reset/${token}`) }) })
}

export default defineEventHandler(async (event) => {
  const { email } = await bodyWith(event, ForgotPasswordSchema)
  const address = getRequestIP(event, { xForwardedFor: false }) ?? ''
  if (await mayRequestReset(email, address)) {
    const work = sendLink(email).catch((err) => console.error('[boreline] reset link not sent:', (err as Error).message))
    event.waitUntil?.(work)
  }
  setResponseStatus(event, 202)
  return { message: ANSWER }
})
