/**
 * POST /api/auth/mfa { code } -> SignedIn { user, organisationStatus, recoveryCodes? }: the second step of a sign-in
 * that answered `mfaRequired`. `code` is the 6-digit code from the authenticator app or a recovery code (each
 * works once). On a first enrolment the code confirms the new app and the answer carries ten recovery codes, shown
 * this once. 401 when the half-signed sign-in is missing, expired or out of tries (sign in again); 401 with
 * `data.fields.code` for a wrong or already used code; 429 after 10 wrong codes for the person in 15 minutes.
 */
import { MfaCodeSchema } from '#shared/schemas/auth'
import type { SignedIn } from '#shared/types/second-factor'
import { completeChallenge } from '../../services/sign-in-challenges'

export default defineEventHandler(async (event): Promise<SignedIn> => {
  const { code } = await bodyWith(event, MfaCodeSchema)
  const token = challengeToken(event)
  if (!token) throw unauthenticated('This sign-in has expired. Please sign in again with your password.')
  const done = await completeChallenge(token, code, clientAddress(event))
  clearChallengeCookie(event)
  const signedIn = await completeSignIn(event, done.user, done.org)
  return { ...signedIn, ...(done.recoveryCodes ? { recoveryCodes: done.recoveryCodes } : {}) }
})
