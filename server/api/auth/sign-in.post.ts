/**
 * POST /api/auth/sign-in { email, password } -> { user, organisationStatus }
 * One vague message on failure. A new session id at every sign-in (ASVS 7.2.4); the session this browser
 * held before ends. At most 10 failed attempts per e-mail and per client address in 15 minutes, then 429
 * with `Retry-After` (server/services/throttle.ts). Pending, rejected and suspended garages may sign in:
 * they see only their status page, because every other route refuses them.
 */
import { SignInSchema } from '#shared/schemas/auth'
import { Organisation, User } from '../../models/accounts'
import { countSignInAttempt, retryMessage } from '../../services/throttle'

// verifying against a throw-away hash when the e-mail is unknown keeps the timing the same
let decoyHash: Promise<string> | undefined
const VAGUE = 'That e-mail and password do not match an account.'

export default defineEventHandler(async (event) => {
  const body = await bodyWith(event, SignInSchema)
  // the socket's address: X-Forwarded-For is whatever the caller wants it to be
  const address = getRequestIP(event, { xForwardedFor: false }) ?? ''
  const attempt = await countSignInAttempt(body.email, address)
  if (!attempt.ok) {
    throw new DomainError('too_many', retryMessage(attempt.retryAfterSeconds), { retryAfterSeconds: attempt.retryAfterSeconds, details: { retryAfterSeconds: attempt.retryAfterSeconds } })
  }

  const user = await User.findOne({ where: { email: body.email } })
  const hash = user?.passwordHash ?? await (decoyHash ??= hashPassword('decoy-password-never-used'))
  const passwordOk = await verifyPassword(hash, body.password)
  if (!user || !user.passwordHash || !passwordOk || user.status !== 'active') {
    throw new DomainError('unauthenticated', VAGUE)
  }
  const org = await Organisation.findByPk(user.organisationId)
  if (!org) throw new DomainError('unauthenticated', VAGUE)
  await attempt.release()

  const previous = await getUserSession(event)
  if (previous.sid) await revokeSessionRecord(previous.sid)
  const config = useRuntimeConfig(event)
  const sid = await createSessionRecord(event, user, {
    idleMinutes: Number(config.sessionIdleMinutes), absoluteHours: Number(config.sessionAbsoluteHours),
  })
  await withWrite((t) => User.update({ lastSignInAt: new Date() }, { where: { id: user.id }, transaction: t }))
  const sessionUser = sessionUserOf(user, org)
  await replaceUserSession(event, { user: sessionUser, sid })
  return { user: sessionUser, organisationStatus: org.status }
})
