/**
 * POST /api/auth/sign-in { email, password } -> { user, organisationStatus }
 * 422 bad input; 401 with one vague message for any wrong e-mail or password; 429 with `Retry-After` after 10
 * failed attempts per e-mail or per client address in 15 minutes (server/services/sign-in.ts). A new session id
 * at every sign-in (ASVS 7.2.4); the session this browser held before ends. People of a garage that is not
 * approved may sign in: they see only their status page, because every other route refuses them.
 */
import { SignInSchema } from '#shared/schemas/auth'
import { checkSignIn } from '../../services/sign-in'

export default defineEventHandler(async (event) => {
  const body = await bodyWith(event, SignInSchema)
  // the socket's address: X-Forwarded-For is whatever the caller wants it to be
  const { user, org } = await checkSignIn(body.email, body.password, getRequestIP(event, { xForwardedFor: false }) ?? '')
  const previous = await getUserSession(event)
  if (previous.sid) await revokeSessionRecord(previous.sid)
  const config = useRuntimeConfig(event)
  const sid = await createSessionRecord(event, user, {
    idleMinutes: Number(config.sessionIdleMinutes), absoluteHours: Number(config.sessionAbsoluteHours),
  })
  const sessionUser = sessionUserOf(user, org)
  await replaceUserSession(event, { user: sessionUser, sid })
  return { user: sessionUser, organisationStatus: org.status }
})
