/**
 * POST /api/auth/sign-in { email, password } -> SignedIn { user, organisationStatus }, or, for a person with two-step
 * sign-in (distributor staff always; garage managers who turned it on), SecondStepNeeded { mfaRequired: true,
 * enrolment? }: no session yet, only a short-lived half-signed cookie; POST /api/auth/mfa { code } completes it.
 * `enrolment` (the secret and its QR code) when distributor staff have no authenticator app set up yet.
 * 422 bad input; 401 with one vague message for any wrong e-mail or password; 429 with `Retry-After` after 10 failed
 * attempts for this e-mail from this address, or 30 from this address, in 15 minutes (an e-mail failing from many
 * addresses is slowed, never locked: server/services/throttle.ts); 503 when too many passwords are being checked.
 * People of a garage that is not approved may sign in: they see only their status page.
 */
import { SignInSchema } from '#shared/schemas/auth'
import type { SignInAnswer } from '#shared/types/second-factor'
import { checkSignIn } from '../../services/sign-in'
import { secondStepFor } from '../../services/sign-in-challenges'

export default defineEventHandler(async (event): Promise<SignInAnswer> => {
  const body = await bodyWith(event, SignInSchema)
  const { user, org } = await checkSignIn(body.email, body.password, clientAddress(event))
  const second = await secondStepFor(user)
  if (!second) return completeSignIn(event, user, org)
  setChallengeCookie(event, second.token, second.maxAgeSeconds)
  return { mfaRequired: true, ...(second.enrolment ? { enrolment: second.enrolment } : {}) }
})
